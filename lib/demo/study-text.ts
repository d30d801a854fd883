// The demo study's words: an invented team (the Larkspur jet group) preparing for an invented detector
// upgrade (the Tallis inner tracker). Every name here is fictional, and comes from scenario.ts.
import { DEMO_NAMES } from './scenario';

export const DEMO_STUDY = {
  title: `Quark-like vs gluon-like jets for the ${DEMO_NAMES.campaign}`,
  description:
    `Does the finer angular resolution of the ${DEMO_NAMES.detector} after the ${DEMO_NAMES.campaign} sharpen ` +
    `quark/gluon separation in the primary emission plane? A working study of the ${DEMO_NAMES.team}.`,
};

export const DEMO_NOTES: { title: string; body: string }[] = [
  {
    title: 'Goal and plan',
    body: `The ${DEMO_NAMES.campaign} halves the angular resolution of the ${DEMO_NAMES.detector} in the core of high-pt jets. We want to know
whether that is visible where quark-like and gluon-like jets differ most.

**Plan**

1. Generate two samples of 500 GeV jets with R = 0.8 from our leading-order emission generator: a
   *quark-like* one and a *gluon-like* one (both are in the Samples panel).
2. Re-cluster every jet with Cambridge/Aachen and follow the harder branch: each primary splitting gives
   one point at (ln 1/Δ, ln kt).
3. Compare the two per-jet densities, then find the bins that separate them best.
4. Repeat with the current and the upgraded resolution smearing.
`,
  },
  {
    title: 'What we expect before looking',
    body: String.raw`At leading order and in the soft-collinear corner the density is flat per unit ln(1/Δ) and ln kt,
proportional to the colour factor of the jet's initiator,

$$\rho = \frac{2\,\alpha_s(k_t)\,C_i}{\pi}, \qquad C_F = \tfrac43 \text{ (quark)}, \quad C_A = 3 \text{ (gluon)}.$$

So the gluon/quark ratio should approach **$C_A/C_F = 9/4$** there, and fall towards 1 at large $k_t$,
where hadronisation and the hard-collinear terms matter.

Question for the group: at which ln(1/Δ) does the current resolution start to wash this out?
`,
  },
];

/**
 * The note after the demo's Maps and Contrast. Its numbers were measured on the demo samples (20 000 jets each,
 * seeds 4101 and 4102) in the Contrast's box: tests/unit/demo/demo-study.test.ts measures them again.
 */
export const DEMO_CLOSING_NOTE = {
  title: 'What the contrast shows, and what it does not',
  body: String.raw`In the box of the contrast ($1.2 < \ln 1/\Delta < 3.2$, $0.4 < \ln k_t/\text{GeV} < 2$, where $z < 0.07$) the
declustered densities sit **below** the leading-order expectation $2\alpha_s C_i/\pi$: the quark-like jets by about
12 %, the gluon-like jets by about 22 %, so their ratio is about **2.0, not 9/4 = 2.25**.

This is not a fault of the generator or of the maps. Our generator emits gluons independently at random azimuths.
Cambridge/Aachen clusters the closest pair first, so when two soft emissions lie closer to each other than to the
jet's core, they are clustered together before they join it, and the softer one leaves the primary sequence (it
becomes a secondary splitting) while the pair shows as one primary emission of larger $k_t$. Gluon jets, with about
$9/4$ as many emissions, lose more of them this way, and the measured ratio falls below $C_A/C_F$.

The generator's own emissions, before any clustering, do agree with $2\alpha_s C_i/\pi$ and their ratio with 9/4
(tests/unit/maps/closure.test.ts). To compare the declustered planes with theory, look where emissions are sparse
(high $k_t$, few emissions per jet), or compare with a parton shower that models the same clustering.
`,
};

/** The demo study's own kinds of region, each with the colour its outlines are drawn in. */
export const DEMO_REGION_CATEGORIES = [
  { name: 'Excess', colour: '#cc6677' },
  { name: 'Check the binning', colour: '#332288' },
  { name: 'Agrees with expectation', colour: '#117733' },
];
