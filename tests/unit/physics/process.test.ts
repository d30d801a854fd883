// processParticles: jet selection in the order pt > ptMin, |y| < yMax, at most maxJets leading (PHYSICS.md
// "Jet clustering"; anti-kt arXiv:0802.1189), per-jet C/A declustering (arXiv:1807.04758) and SoftDrop
// (arXiv:1402.2657); and the seeded test-input generator.

import { describe, expect, it } from 'vitest';
import { fromPtYPhiM, particleProblem, TWO_PI } from '../../../lib/physics/fourvector';
import { processParticles } from '../../../lib/physics/process';
import { generateEvent, generateEvents, generateJet, generateJets } from '../../support/test-events';
import { Rng } from '../../../lib/physics/random';
import type { ProcessSettings } from '../../../lib/physics/types';
import { SPLIT_STRIDE, S_GENERATION } from '../../../lib/physics/types';

function particles(list: [number, number, number, number?][]): Float64Array {
  const p = new Float64Array(4 * list.length);
  list.forEach(([pt, y, phi, m], i) => fromPtYPhiM(pt, y, phi, m ?? 0, p, 4 * i));
  return p;
}

function settings(over: Partial<ProcessSettings['jet']> = {}, rest: Partial<ProcessSettings> = {}): ProcessSettings {
  return {
    content: 'events',
    jet: { algorithm: 'antikt', R: 0.4, ptMin: 20, yMax: 2.5, maxJets: null, ...over },
    softDrop: { zCut: 0.1, beta: 0, R0: 0.4 },
    multiplicityKtCut: 1,
    fullTree: false,
    ...rest,
  };
}

describe('jet selection', () => {
  // Four well separated two-particle jets (anti-kt, R = 0.4):
  //   J1 pt 100 at y 0, J2 pt 80 at y 1, J3 pt 50 at y 3 (outside |y| < 2.5), J4 pt 10 at y 0 (below 20 GeV).
  const p = particles([
    [60, 0, 1], [40, 0.05, 1.05],
    [50, 1, 3], [30, 1.05, 3.05],
    [30, 3, 5], [20, 3.05, 5.05],
    [6, 0, 5], [4, 0.05, 5.05],
  ]);

  it('cuts in order pt, |y|, rank; kept jets sorted by pt', () => {
    const all = processParticles(p, settings());
    expect(all.jets.map((j) => Math.round(j.pt))).toEqual([100, 80]);
    expect(all.rejected).toEqual({ pt: 1, y: 1, rank: 0 });

    const one = processParticles(p, settings({ maxJets: 1 }));
    expect(one.jets).toHaveLength(1);
    expect(one.jets[0].pt).toBeCloseTo(100, 0);
    expect(one.rejected).toEqual({ pt: 1, y: 1, rank: 1 });

    // A jet failing both pt and |y| counts once, under pt (the first cut).
    const strict = processParticles(p, settings({ ptMin: 60 }));
    expect(strict.rejected).toEqual({ pt: 2, y: 0, rank: 0 });
  });

  it('jet kinematics and constituent counts', () => {
    const r = processParticles(p, settings());
    for (const j of r.jets) {
      expect(j.n).toBe(2);
      expect(j.primary.length).toBe(SPLIT_STRIDE);
      expect(j.all).toBeNull();
      expect(j.phi).toBeGreaterThanOrEqual(0);
      expect(j.phi).toBeLessThan(TWO_PI);
    }
    expect(r.jets[0].y).toBeCloseTo(0.02, 2);
    expect(r.jets[1].y).toBeCloseTo(1.02, 2);
  });

  it('an event without particles gives no jets', () => {
    expect(processParticles(new Float64Array(0), settings())).toEqual({ jets: [], rejected: { pt: 0, y: 0, rank: 0 } });
  });
});

describe("content 'jets'", () => {
  const s = settings({ ptMin: 20, yMax: 2 }, { content: 'jets', fullTree: true });

  it('the record is one jet; cuts on its pt and |y| still apply', () => {
    const jet = particles([[100, 0.5, 1], [20, 0.8, 1.4], [5, 0.4, 0.9]]);
    const r = processParticles(jet, s);
    expect(r.jets).toHaveLength(1);
    expect(r.jets[0].n).toBe(3);
    expect(r.jets[0].primary.length).toBeGreaterThan(0);
    expect(r.jets[0].all!.length).toBe(2 * SPLIT_STRIDE); // n − 1 splittings
    expect(processParticles(particles([[10, 0, 1], [5, 0.1, 1]]), s).rejected).toEqual({ pt: 1, y: 0, rank: 0 });
    expect(processParticles(particles([[100, 2.5, 1], [50, 2.6, 1]]), s).rejected).toEqual({ pt: 0, y: 1, rank: 0 });
  });

  it('a one-particle jet: no splittings, SoftDrop keeps the particle (grooming), multiplicity 0, massive particle keeps its mass', () => {
    const r = processParticles(particles([[40, 0.2, 3, 1.5]]), s);
    const j = r.jets[0];
    expect(j.primary.length).toBe(0);
    expect(j.all!.length).toBe(0);
    // PHYSICS.md, grooming mode: the groomed jet is the single constituent left, m_g its mass, z_g = R_g = 0
    expect(j.softDrop.mg).toBeCloseTo(1.5, 9);
    expect([j.softDrop.zg, j.softDrop.Rg]).toEqual([0, 0]);
    const tagged = processParticles(particles([[40, 0.2, 3, 1.5]]), { ...s, softDrop: { ...s.softDrop, mode: 'tagging' } }).jets[0];
    expect(Number.isNaN(tagged.softDrop.mg)).toBe(true);
    expect(j.multiplicity).toBe(0);
    expect(j.m).toBeCloseTo(1.5, 9);
  });

  it('primary splittings are exactly the generation-1 entries of the full tree, in order', () => {
    for (const jet of generateJets(5, 20, { nConstituents: 50 })) {
      const j = processParticles(jet, s).jets[0];
      const all = j.all!;
      const gen1: number[] = [];
      for (let k = 0; k < all.length; k += SPLIT_STRIDE) if (all[k + S_GENERATION] === 1) gen1.push(...all.subarray(k, k + SPLIT_STRIDE));
      expect(gen1).toEqual(Array.from(j.primary));
      expect(all.length / SPLIT_STRIDE).toBe(j.n - 1);
    }
  });
});

describe('scratch buffers are reused safely', () => {
  it('a large record, then small ones, then the large one again: identical results', () => {
    const big = generateEvent(1, { nParticles: 3000, nJets: 8 });
    const small = generateEvent(2, { nParticles: 40 });
    const s = settings({ ptMin: 10 }, { fullTree: true });
    const first = processParticles(big, s);
    processParticles(small, s);
    processParticles(particles([[30, 0, 1]]), { ...s, content: 'jets' });
    const again = processParticles(big, s);
    expect(again).toEqual(first);
  });

  it('results keep their splittings while later records fill new ones (they share chunks of memory)', () => {
    const s = settings({}, { content: 'jets', fullTree: true });
    const jets = generateJets(7, 400, { nConstituents: 60 });
    const kept = jets.map((jet) => processParticles(jet, s).jets[0]);
    // About 600 doubles a jet: the 400 jets fill several chunks of 32 768.
    const copies = jets.map((jet) => {
      const j = processParticles(jet, s).jets[0];
      return { primary: Array.from(j.primary), all: Array.from(j.all!) };
    });
    for (const j of kept) {
      j.primary.fill(-1); // writing into one result's splittings must not touch another's
      j.all!.fill(-2);
    }
    const again = jets.map((jet) => processParticles(jet, s).jets[0]);
    expect(again.map((j) => ({ primary: Array.from(j.primary), all: Array.from(j.all!) }))).toEqual(copies);
    expect(kept.every((j) => j.primary.every((x) => x === -1) && j.all!.every((x) => x === -2))).toBe(true);
    expect(copies.reduce((sum, c) => sum + c.primary.length + c.all.length, 0)).toBeGreaterThan(3 * 32768);
  });
});

describe('test-event generator', () => {
  it('is reproducible from its seed and every particle is valid input', () => {
    const a = generateEvents(42, 3, { nParticles: 500, massiveFraction: 0.3, nearPhiWrap: true });
    const b = generateEvents(42, 3, { nParticles: 500, massiveFraction: 0.3, nearPhiWrap: true });
    expect(a).toEqual(b);
    for (const ev of [...a, ...generateJets(7, 20, { nConstituents: 80, massiveFraction: 0.5 }), generateJet(new Rng(3), { nConstituents: 1 })]) {
      for (let i = 0; i < ev.length; i += 4) expect(particleProblem(ev[i], ev[i + 1], ev[i + 2], ev[i + 3])).toBeNull();
    }
  });

  it('mulberry32 gives uniform numbers in [0, 1)', () => {
    const r = new Rng(1);
    let sum = 0, outside = 0;
    for (let i = 0; i < 100000; i++) {
      const x = r.next();
      if (!(x >= 0 && x < 1)) outside++;
      sum += x;
    }
    expect(outside).toBe(0);
    expect(sum / 100000).toBeCloseTo(0.5, 2);
  });

  it('nearPhiWrap puts particles on both sides of φ = 0', () => {
    const ev = generateEvent(9, { nParticles: 200, nearPhiWrap: true, nJets: 2, jetFraction: 1 });
    let lo = 0, hi = 0;
    for (let i = 0; i < ev.length; i += 4) {
      const f = Math.atan2(ev[i + 1], ev[i]);
      if (f >= 0 && f < 0.5) lo++;
      if (f < 0 && f > -0.5) hi++;
    }
    expect(lo).toBeGreaterThan(20);
    expect(hi).toBeGreaterThan(20);
  });
});
