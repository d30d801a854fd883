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
    body: `At leading order and in the soft-collinear corner the density is flat per unit ln(1/Δ) and ln kt,
proportional to the colour factor of the jet's initiator:

| initiator | colour factor |
|---|---|
| quark | C_F = 4/3 |
| gluon | C_A = 3 |

So the gluon/quark ratio should approach **C_A / C_F = 9/4** there, and fall towards 1 at large kt,
where hadronisation and the hard-collinear terms matter.

Question for the group: at which ln(1/Δ) does the current resolution start to wash this out?
`,
  },
];
