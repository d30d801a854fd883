// Closure of the per-jet density against the leading-order expectation of PHYSICS.md: ρ = 2 α_s(kt) C_i / π per
// unit ln(1/Δ) and ln kt in the soft-collinear limit ("Asymptotic freedom in parton language", Nucl. Phys. B126
// (1977) 298; colour factors C_F = 4/3, C_A = 3 of SU(3); one-loop α_s with α_s(M_Z) = 0.1180, PDG 2024), so
// gluon/quark → C_A/C_F = 9/4. Plane and declustering: arXiv:1807.04758.
//
// 1. The generator's own emissions (as drawn, before recoil) agree with the expectation within their statistical
//    error: the veto algorithm draws exactly from it.
// 2. The declustered density is not the single-emission density. C/A clusters the closest pair first: when a
//    softer emission lies nearer to another, harder emission than either lies to the jet's core, the two are
//    clustered together and the softer one leaves the primary sequence (it becomes secondary), while the pair
//    shows as one primary emission of larger kt. So at low kt the declustered density falls below the expectation
//    and near the z = 1/2 edge it rises above it; the size follows the number of other emissions at similar angles,
//    i.e. ~ (2 α_s C_i/π) × the log range above: twice as large for gluons. This is checked as a statement (its sign
//    and its size, measured) on dense jets.
// 3. Where it is small: with emissions only above kt = 30 GeV a 1 TeV quark jet has about 0.3 emissions, so a
//    neighbour close enough to take an emission away is rare. In ln(R/Δ) ∈ [0.5, 1.5], kt ∈ [30, 60] GeV (z from
//    0.06 to 0.27, inside z ≤ 1/2) the loss, measured against the drawn emissions, is 4–5 %, below the 3σ band
//    (5.4 %) of 40000 jets; there the declustered density agrees with the expectation within 3 standard deviations.
//    (At wide angles and low kt, with kt = 1 GeV emissions, it does not: part 2.)
import { describe, expect, it } from 'vitest';
import { generateEmissionJet, type EmissionSettings } from '@/lib/physics/emission-generator';
import { colourFactor, type Parton } from '@/lib/physics/lo-density';
import { axisBins } from '@/lib/physics/plane/bins';
import { densityOf, fillPlane } from '@/lib/physics/plane/binned-plane';
import { boxIntegral } from '@/lib/physics/plane/compare';
import { processParticles } from '@/lib/physics/process';
import { Rng } from '@/lib/physics/random';
import { alphaS, C_A, C_F } from '@/lib/physics/running-coupling';
import { S_LN_INV_DELTA, S_LN_KT, SPLIT_STRIDE, type ProcessSettings } from '@/lib/physics/types';

const R = 0.8;
const PT = 1000;

const generator = (parton: Parton, ktCut: number): EmissionSettings => ({ parton, pt: PT, R, yMax: 2, ktCut, hardCollinear: false, background: null });
const processing: ProcessSettings = {
  content: 'jets',
  jet: { algorithm: 'antikt', R, ptMin: 0, yMax: 10, maxJets: null },
  softDrop: { zCut: 0.1, beta: 0, R0: R },
  multiplicityKtCut: 1,
  fullTree: false,
};

interface Box {
  l: [number, number];
  t: [number, number];
}

/** Expected emissions per jet at leading order in ln(R/Δ) ∈ l, ln kt ∈ t (midpoint rule in ln kt; flat in ln(R/Δ)). */
function expected(parton: Parton, box: Box): number {
  const steps = 4000;
  let integral = 0;
  for (let k = 0; k < steps; k++) integral += alphaS(Math.exp(box.t[0] + ((k + 0.5) * (box.t[1] - box.t[0])) / steps));
  integral *= (box.t[1] - box.t[0]) / steps;
  return ((2 * colourFactor(parton)) / Math.PI) * integral * (box.l[1] - box.l[0]);
}

/** Generated jets' emissions as drawn and as declustered, as (ln(R/Δ), ln kt) columns with their jet rows. */
function sample(parton: Parton, ktCut: number, jets: number, seed: number) {
  const drawn = { x: [] as number[], y: [] as number[], jet: [] as number[] };
  const declustered = { x: [] as number[], y: [] as number[], jet: [] as number[] };
  const rng = new Rng(seed);
  for (let j = 0; j < jets; j++) {
    const particles = generateEmissionJet(rng, generator(parton, ktCut), undefined, (delta, _z, kt) => {
      drawn.x.push(Math.log(R / delta));
      drawn.y.push(Math.log(kt));
      drawn.jet.push(j);
    });
    const primary = processParticles(particles, processing).jets[0].primary;
    for (let at = 0; at < primary.length; at += SPLIT_STRIDE) {
      declustered.x.push(Math.log(R) + primary[at + S_LN_INV_DELTA]);
      declustered.y.push(primary[at + S_LN_KT]);
      declustered.jet.push(j);
    }
  }
  return { drawn, declustered, jets };
}

/** Emissions per jet in the box, and its statistical error, through the map code (fillPlane, boxIntegral). */
function measured(columns: { x: number[]; y: number[]; jet: number[] }, jets: number, box: Box) {
  const bins = { x: axisBins(box.l[0], box.l[1], (box.l[1] - box.l[0]) / 4), y: axisBins(box.t[0], box.t[1], (box.t[1] - box.t[0]) / 4) };
  const map = densityOf(
    fillPlane(bins, { xs: columns.x, ys: columns.y, jetRow: columns.jet, member: null, jetWeight: new Float64Array(jets).fill(1), selected: new Uint8Array(jets).fill(1) }),
  );
  const integral = boxIntegral(map, { x1: box.l[0], x2: box.l[1], y1: box.t[0], y2: box.t[1] });
  return { value: integral.value, error: Math.sqrt(integral.variance) };
}

describe('the generator’s own emissions against 2 α_s C_i / π (PHYSICS.md, soft-collinear limit)', () => {
  // Box ln(R/Δ) ∈ [0, 2.5], ln kt ∈ [0, 3]: inside z ≤ 1/2 for 1 TeV jets of R = 0.8 everywhere (the edge is at
  // ln kt = ln(½ · 1000 · 0.8 e^−2.5) = 3.5). 6000 jets: ~8400 quark, ~19000 gluon emissions there.
  const box: Box = { l: [0, 2.5], t: [0, 3] };
  const quark = sample('quark', 1, 6000, 501);
  const gluon = sample('gluon', 1, 6000, 502);

  it.each([
    ['quark', quark],
    ['gluon', gluon],
  ] as const)('%s jets agree within 3 standard deviations', (parton, s) => {
    const m = measured(s.drawn, s.jets, box);
    expect(Math.abs(m.value - expected(parton, box))).toBeLessThan(3 * m.error);
  });

  it('gluon/quark is C_A/C_F = 9/4 within 3 standard deviations (α_s cancels in the ratio)', () => {
    const q = measured(quark.drawn, quark.jets, box);
    const g = measured(gluon.drawn, gluon.jets, box);
    const ratio = g.value / q.value;
    const error = ratio * Math.hypot(q.error / q.value, g.error / g.value);
    expect(Math.abs(ratio - C_A / C_F)).toBeLessThan(3 * error);
  });
});

describe('what C/A clustering does to the declustered density (a measured statement, not a tolerance)', () => {
  const quark = sample('quark', 1, 6000, 601);
  const gluon = sample('gluon', 1, 6000, 602);
  const low: Box = { l: [0, 2], t: [0, 1] };
  const nearEdge: Box = { l: [1, 2], t: [4, 4.5] };

  it('removes emissions at low kt, about twice as many from gluon jets as from quark jets', () => {
    const lossQ = 1 - measured(quark.declustered, quark.jets, low).value / measured(quark.drawn, quark.jets, low).value;
    const lossG = 1 - measured(gluon.declustered, gluon.jets, low).value / measured(gluon.drawn, gluon.jets, low).value;
    // measured with 20000 jets: quark 19 %, gluon 37 %
    expect(lossQ).toBeGreaterThan(0.12);
    expect(lossQ).toBeLessThan(0.26);
    expect(lossG).toBeGreaterThan(0.28);
    expect(lossG).toBeLessThan(0.46);
    expect(lossG / lossQ).toBeGreaterThan(1.5);
  });

  it('adds merged pairs near the z = 1/2 edge, and so the declustered gluon/quark ratio at low kt falls below 9/4', () => {
    for (const s of [quark, gluon]) expect(measured(s.declustered, s.jets, nearEdge).value).toBeGreaterThan(measured(s.drawn, s.jets, nearEdge).value);
    const ratio = measured(gluon.declustered, gluon.jets, low).value / measured(quark.declustered, quark.jets, low).value;
    expect(ratio).toBeLessThan(0.9 * (C_A / C_F));
  });
});

describe('where clustering is small: sparse emissions (kt > 30 GeV), quark jets', () => {
  it('the declustered density agrees with 2 α_s C_F / π within 3 standard deviations', () => {
    const box: Box = { l: [0.5, 1.5], t: [Math.log(30), Math.log(60)] };
    const quark = sample('quark', 30, 40000, 701);
    const m = measured(quark.declustered, quark.jets, box);
    expect(Math.abs(m.value - expected('quark', box))).toBeLessThan(3 * m.error);
  });
});
