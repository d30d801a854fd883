// Pre-clustered jets (content 'jets'): C/A re-clustering and declustering checked against FastJet.
// Reference: FastJet 3.4.0 (Debian libfastjet-dev), through tests/reference/fastjet-ref.cc (FastJet's C/A at
// JetDefinition::max_allowable_R and ClusterSequence::has_parents). Definitions: PHYSICS.md (emission plane
// arXiv:1807.04758; SoftDrop arXiv:1402.2657; C/A arXiv:hep-ph/9707323).

import { beforeAll, describe, expect, it } from 'vitest';
import { GRID_MIN_PARTICLES } from '../../lib/physics/clustering';
import { fromPtYPhiM, toGeV } from '../../lib/physics/fourvector';
import { processParticles } from '../../lib/physics/process';
import { generateJet, generateJets } from '../support/test-events';
import { Rng } from '../../lib/physics/random';
import { compareWithRef, crossCheck } from './compare';
import { ensureFastjetRef, runFastjetRef, settingsFor } from './fastjet';

beforeAll(() => {
  ensureFastjetRef();
});

const ALL_JETS = { ptMin: 0, yMax: 10, all: true };

describe('pre-clustered jets vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev))', () => {
  it('~60-constituent jets: every primary and full-tree splitting', () => {
    const jets = generateJets(11, 150, { nConstituents: 60 });
    const c = crossCheck('jets', jets, ALL_JETS);
    expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
    expect(c.jets).toBe(150);
    expect(c.splittings).toBeGreaterThan(150 * 59);
  });

  it('SoftDrop β = 0 and β = 2, several z_cut, and the multiplicity cut', () => {
    const jets = generateJets(12, 80, { nConstituents: 40 });
    for (const o of [
      { zCut: 0.1, beta: 0, R0: 0.4, ktCut: 1 },
      { zCut: 0.3, beta: 0, R0: 0.4, ktCut: 5 },
      { zCut: 0.2, beta: 2, R0: 0.8, ktCut: 0.5 },
      // z_cut 0.45: most jets have no passing splitting, so the two modes of PHYSICS.md differ on them
      { zCut: 0.45, beta: 0, R0: 0.4, ktCut: 1, sdMode: 'grooming' as const },
      { zCut: 0.45, beta: 0, R0: 0.4, ktCut: 1, sdMode: 'tagging' as const },
    ]) {
      const c = crossCheck('jets', jets, { ...ALL_JETS, all: false, ...o });
      expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
    }
  });

  it('jets with hundreds of constituents (and massive ones)', () => {
    const jets = [
      ...generateJets(13, 6, { nConstituents: 300, massiveFraction: 0.4 }),
      ...generateJets(14, 3, { nConstituents: 800, spread: 0.25 }),
    ];
    // The largest use the grid strategy of the C/A re-clustering.
    expect(jets.some((p) => p.length / 4 >= GRID_MIN_PARTICLES)).toBe(true);
    const c = crossCheck('jets', jets, ALL_JETS);
    expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
    expect(c.jets).toBe(9);
  });

  it('one- and two-particle jets', () => {
    const rng = new Rng(15);
    const jets = [
      ...Array.from({ length: 10 }, () => generateJet(rng, { nConstituents: 1 })),
      ...Array.from({ length: 10 }, () => generateJet(rng, { nConstituents: 2, massiveFraction: 0.5 })),
    ];
    const c = crossCheck('jets', jets, ALL_JETS);
    expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
    expect(c.jets).toBe(20);
  });

  it('jets straddling φ = 0 ≡ 2π', () => {
    const jets = generateJets(16, 60, { nConstituents: 50, nearPhiWrap: true, spread: 0.2 });
    const c = crossCheck('jets', jets, ALL_JETS);
    expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
    // Constituents on both sides of the cut, in most jets.
    const straddling = jets.filter((p) => {
      let lo = false, hi = false;
      for (let i = 0; i < p.length; i += 4) {
        const f = Math.atan2(p[i + 1], p[i]);
        if (f >= 0) lo = true;
        else hi = true;
      }
      return lo && hi;
    });
    expect(straddling.length).toBeGreaterThan(30);
  });

  it('jet cuts on pre-clustered jets (pt and |y| of the whole jet)', () => {
    const jets = generateJets(17, 60, { nConstituents: 30, pt: undefined, y: undefined });
    const c = crossCheck('jets', jets, { ptMin: 400, yMax: 1.2, all: true });
    expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
    const rej = c.ours.reduce((a, r) => a + r.rejected.pt + r.rejected.y, 0);
    expect(rej).toBeGreaterThan(10);
    expect(c.jets).toBeGreaterThan(5);
  });

  it('input as (pt, y, φ, m) in MeV gives the same jets as FastJet reading the same file', () => {
    // The file holds pt,y,phi,m in MeV; both sides convert (fourvector.ts fromPtYPhiM, the same arithmetic in
    // fastjet-ref.cc) — only the last bits of cos/sin/sinh/cosh may differ between V8 and glibc.
    const rng = new Rng(18);
    const records: number[][] = [];
    for (let r = 0; r < 40; r++) {
      const n = rng.int(1, 40);
      const yAxis = rng.uniform(-2, 2), phiAxis = rng.uniform(0, 2 * Math.PI);
      const row: number[] = [];
      for (let i = 0; i < n; i++) {
        let f = phiAxis + 0.2 * rng.normal();
        f -= 2 * Math.PI * Math.floor(f / (2 * Math.PI));
        row.push(rng.uniform(1e3, 2e5), yAxis + 0.2 * rng.normal(), f, rng.next() < 0.3 ? 139.57 : 0);
      }
      records.push(row);
    }
    const ref = runFastjetRef(
      { content: 'jets', momentum: 'pt,y,phi,m', energyUnit: 'MeV', records: records.map((particles) => ({ particles })) },
      ALL_JETS,
    );
    const k = toGeV('MeV');
    const s = settingsFor('jets', ALL_JETS);
    const ours = records.map((row) => {
      const p = new Float64Array(row.length);
      for (let i = 0; i < row.length; i += 4) fromPtYPhiM(row[i] * k, row[i + 1], row[i + 2], row[i + 3] * k, p, i);
      return processParticles(p, s);
    });
    const c = compareWithRef(ours, ref, true, { massFloor: 1e-5 });
    expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
    expect(c.jets).toBe(40);
  });
});

describe("single jets of the engine benchmark's sizes vs FastJet (Reference: FastJet 3.4.0 (Debian libfastjet-dev))", () => {
  it('30, 300, 1 000 and 3 000 constituents (plain loop, then the C/A grid): every primary and full-tree splitting', () => {
    const jets = [
      ...generateJets(19, 10, { nConstituents: 30, spreadN: 0, massiveFraction: 0.3 }),
      ...generateJets(20, 3, { nConstituents: 300, spreadN: 0, massiveFraction: 0.3 }),
      ...generateJets(21, 2, { nConstituents: 1000, spreadN: 0, massiveFraction: 0.3 }),
      ...generateJets(22, 1, { nConstituents: 3000, spreadN: 0, massiveFraction: 0.3 }),
    ];
    expect(jets.filter((p) => p.length / 4 >= GRID_MIN_PARTICLES)).toHaveLength(6);
    const c = crossCheck('jets', jets, ALL_JETS);
    expect(c.mismatches, c.mismatches.join('\n')).toEqual([]);
    expect(c.jets).toBe(16);
    // The full tree has n − 1 splittings a jet, all compared (and the primary ones besides).
    expect(c.splittings).toBeGreaterThan(10 * 29 + 3 * 299 + 2 * 999 + 2999);
  });
});
