// Jet finding + C/A declustering of whole events, checked against FastJet.
// Reference: FastJet 3.4.0 (Debian libfastjet-dev), through tests/reference/fastjet-ref.cc (FastJet's own
// JetDefinition/ClusterSequence for jet finding, FastJet's C/A re-clustering and has_parents for declustering).
// Definitions: PHYSICS.md (anti-kt arXiv:0802.1189; C/A arXiv:hep-ph/9707323, hep-ph/9907280; FastJet manual
// arXiv:1111.6097; emission plane arXiv:1807.04758; SoftDrop arXiv:1402.2657).

import { beforeAll, describe, expect, it } from 'vitest';
import { TILED_MIN_PARTICLES } from '../../lib/physics/clustering';
import { TWO_PI, fromPtYPhiM } from '../../lib/physics/fourvector';
import { generateEvents } from '../support/test-events';
import { Rng } from '../../lib/physics/random';
import { crossCheck } from './compare';
import { ensureFastjetRef } from './fastjet';

beforeAll(() => {
  ensureFastjetRef();
});

function expectAgreement(c: ReturnType<typeof crossCheck>, minJets: number): void {
  expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
  expect(c.jets).toBeGreaterThanOrEqual(minJets);
}

describe('anti-kt events vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev))', () => {
  for (const R of [0.4, 0.8, 1.0]) {
    for (const seed of [101, 202, 303]) {
      it(`R = ${R}, seed ${seed}: jets, cuts, primary and full-tree splittings`, () => {
        const events = generateEvents(seed, 12, { nParticles: 300 });
        const c = crossCheck('events', events, { algorithm: 'antikt', R, all: true });
        expectAgreement(c, 20);
        expect(c.splittings).toBeGreaterThan(500);
      });
    }
  }
});

describe('kt and Cambridge/Aachen jet finding vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev))', () => {
  for (const algorithm of ['kt', 'ca'] as const) {
    for (const R of [0.4, 0.8, 1.0]) {
      it(`${algorithm}, R = ${R}`, () => {
        const events = generateEvents(R * 1000 + (algorithm === 'kt' ? 1 : 2), 10, { nParticles: 250 });
        const c = crossCheck('events', events, { algorithm, R, ptMin: 10, all: true });
        expectAgreement(c, 20);
      });
    }
  }
});

describe('awkward event configurations vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev))', () => {
  it('jets straddling φ = 0 ≡ 2π', () => {
    const events = generateEvents(404, 15, { nParticles: 200, nearPhiWrap: true });
    const c = crossCheck('events', events, { algorithm: 'antikt', R: 0.4, all: true });
    expectAgreement(c, 15);
    // The sample really has jets on both sides of the cut.
    const phis = c.ours.flatMap((r) => r.jets.map((j) => j.phi));
    expect(phis.some((f) => f < 0.3)).toBe(true);
    expect(phis.some((f) => f > TWO_PI - 0.3)).toBe(true);
    for (const f of phis) {
      expect(f).toBeGreaterThanOrEqual(0);
      expect(f).toBeLessThan(TWO_PI);
    }
  });

  it('massive particles', () => {
    const events = generateEvents(505, 12, { nParticles: 300, massiveFraction: 0.6 });
    const c = crossCheck('events', events, { algorithm: 'antikt', R: 0.8, all: true });
    expectAgreement(c, 12);
  });

  it('one-particle jets (no cuts: isolated soft particles are jets)', () => {
    const events = generateEvents(606, 6, { nParticles: 150, backgroundYMax: 4 });
    const c = crossCheck('events', events, { algorithm: 'antikt', R: 0.4, ptMin: 0, yMax: 5, all: true });
    expectAgreement(c, 100);
    const single = c.ours.flatMap((r) => r.jets).filter((j) => j.n === 1);
    expect(single.length).toBeGreaterThan(20);
    // grooming mode (PHYSICS.md): the particle is its own groomed jet, z_g = R_g = 0 (FastJet agrees above)
    for (const j of single) {
      expect(j.primary.length).toBe(0);
      expect(j.softDrop.mg).toBeCloseTo(j.m, 12);
      expect([j.softDrop.zg, j.softDrop.Rg]).toEqual([0, 0]);
    }
  });

  it('cuts in order pt, |y|, rank, and SoftDrop with β > 0', () => {
    const events = generateEvents(707, 15, { nParticles: 300, jetYMax: 3 });
    const c = crossCheck('events', events, {
      algorithm: 'antikt', R: 0.6, ptMin: 40, yMax: 1.5, maxJets: 1, zCut: 0.2, beta: 1.5, R0: 0.8, ktCut: 2, all: true,
    });
    expectAgreement(c, 8);
    const rej = c.ours.reduce((a, r) => ({ pt: a.pt + r.rejected.pt, y: a.y + r.rejected.y, rank: a.rank + r.rejected.rank }), { pt: 0, y: 0, rank: 0 });
    expect(rej.pt).toBeGreaterThan(0);
    expect(rej.y).toBeGreaterThan(0);
    expect(rej.rank).toBeGreaterThan(0);
  });
});

describe('edge inputs vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev))', () => {
  // Exact duplicates (a Δ = 0 splitting: ln(1/Δ) = ∞, written as null), a zero-pt particle (φ = 0 by
  // convention, anti-kt momentum factor capped at 1e300), particles ±50 units apart in rapidity, and a
  // mirror-symmetric event whose two leading jets have exactly equal pt (FastJet's order for the tie).
  const records = [
    [10, 2, 5, 20, 10, 2, 5, 20, 30, -4, 1, 40],
    [0, 0, 3, 5, 20, 1, 2, 25, 15, 2, 3, 20],
    [10, 0, 50, 60, 10, 0, -50, 60, 5, 1, 0, 6],
    [10, 0, 15, 20, 10, 0, -15, 20, 6, 8, 0, 10.1],
  ].map((a) => new Float64Array(a));

  for (const content of ['events', 'jets'] as const) {
    for (const algorithm of ['antikt', 'kt', 'ca'] as const) {
      it(`${content}, ${algorithm}`, () => {
        const c = crossCheck(content, records, { algorithm, R: 0.4, ptMin: 0, yMax: 100, all: true });
        expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
        expect(c.jets).toBeGreaterThanOrEqual(4);
      });
    }
  }
});

describe('exact ties resolved as FastJet does (Reference: FastJet 3.4.0 (Debian libfastjet-dev), N2Plain)', () => {
  // Records made of particles and their mirror images in y (pz → −pz negates the rapidity exactly), with pt in
  // steps of 10 GeV: many pair distances, branch pts and jet pts are exactly equal. Which tied pair merges first,
  // which equal-pt branch is "harder" (ψ flips by π) and the order of equal-pt jets then follow FastJet's rules.
  const rng = new Rng(77);
  const records: Float64Array[] = [];
  for (let r = 0; r < 60; r++) {
    const h = rng.int(1, 12);
    const p = new Float64Array(8 * h);
    const f0 = rng.uniform(0, TWO_PI);
    for (let i = 0; i < h; i++) fromPtYPhiM(rng.int(1, 4) * 10, rng.uniform(0.01, 0.5), f0 + 0.3 * rng.normal(), 0, p, 4 * i);
    for (let i = 0; i < h; i++) {
      p[4 * (h + i)] = p[4 * i];
      p[4 * (h + i) + 1] = p[4 * i + 1];
      p[4 * (h + i) + 2] = -p[4 * i + 2];
      p[4 * (h + i) + 3] = p[4 * i + 3];
    }
    records.push(p);
  }
  for (const content of ['jets', 'events'] as const) {
    for (const algorithm of ['antikt', 'kt', 'ca'] as const) {
      it(`${content}, ${algorithm}`, () => {
        const c = crossCheck(content, records, { algorithm, R: 0.6, ptMin: 0, yMax: 10, all: true });
        expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
        for (const r of c.ref.records) expect(r.strategy).toBe('N2Plain');
      });
    }
  }
});

describe('large events (tiled strategies on both sides) vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev))', () => {
  const cases = [
    { algorithm: 'antikt' as const, R: 0.4, N: 2000 },
    { algorithm: 'antikt' as const, R: 0.4, N: 5000 },
    { algorithm: 'kt' as const, R: 0.6, N: 2000 },
    { algorithm: 'ca' as const, R: 1.0, N: 2000 },
  ];
  for (const { algorithm, R, N } of cases) {
    it(`${algorithm}, R = ${R}, ${N} particles`, () => {
      expect(N).toBeGreaterThan(TILED_MIN_PARTICLES);
      const events = generateEvents(N + R * 10, 3, { nParticles: N, nJets: 6, jetFraction: 0.4 });
      const c = crossCheck('events', events, { algorithm, R, ptMin: 15, all: true });
      expectAgreement(c, 6);
      // FastJet also used one of its tiled strategies (N2Tiled, N2MinHeapTiled, N2MHTLazy9, ...).
      for (const r of c.ref.records) expect(r.strategy).toMatch(/Tiled|Lazy/);
    });
  }
});

describe("the engine benchmark's sizes vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev))", () => {
  // Events as `npm run bench` makes them (one spray per 100 particles, at least 3; 30 % massive particles), at
  // 100, 1 000 and 10 000 particles, for the three algorithms and radii it times; the largest inputs stay in the
  // benchmark (its outputs are compared with fastjet-speed's too).
  const shape = (n: number) => ({ nParticles: n, nJets: Math.max(3, Math.round(n / 100)), massiveFraction: 0.3 });
  for (const algorithm of ['antikt', 'kt', 'ca'] as const) {
    for (const R of [0.4, 0.8, 1.2]) {
      it(`${algorithm}, R = ${R}: 100, 1 000 and 10 000 particles`, () => {
        const seed = 9000 + R * 10 + (algorithm === 'kt' ? 1 : algorithm === 'ca' ? 2 : 0);
        const events = [...generateEvents(seed, 3, shape(100)), ...generateEvents(seed + 1, 1, shape(1000)), ...generateEvents(seed + 2, 1, shape(10000))];
        const c = crossCheck('events', events, { algorithm, R, all: true });
        expectAgreement(c, 20);
        expect(c.ours[4].jets.length).toBeGreaterThan(8);
      });
    }
  }
});
