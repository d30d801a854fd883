// SoftDrop and the primary emission multiplicity, worked on paper.
// SoftDrop: "Soft Drop", JHEP 05 (2014) 146, arXiv:1402.2657 — walk the primary sequence, stop at the first
// splitting with z > z_cut (Δ/R0)^β; the groomed jet is the node where it stops (m_g = m_{a+b}, z_g, R_g = Δ).
// When nothing passes, the paper's two modes (PHYSICS.md): grooming keeps the last constituent of the harder
// branch (its mass, z_g = R_g = 0), tagging fails the jet.
// The splittings come from the primary-emission-plane declustering, arXiv:1807.04758.

import { describe, expect, it } from 'vitest';
import { declusterConstituents } from '../../../lib/physics/decluster';
import { TWO_PI, fromPtYPhiM } from '../../../lib/physics/fourvector';
import { primaryMultiplicity, softDrop } from '../../../lib/physics/observables';
import { SPLIT_STRIDE } from '../../../lib/physics/types';

function particles(list: [number, number, number][]): Float64Array {
  const p = new Float64Array(4 * list.length);
  list.forEach(([pt, y, phi], i) => fromPtYPhiM(pt, y, phi, 0, p, 4 * i));
  return p;
}

// The jet of decluster.test.ts: hard pair H (pt 50 + 50 at φ = ±0.05) and soft pair S (pt 10 + 10 at y 0.3,
// φ 0.4 ± 0.02). Primary sequence:
//   1. root H | S:  z = 0.16681262, Δ = 0.5, kt = 9.998000, m = 22.969316 (whole jet)
//   2. H1 | H2:     z = 0.5,        Δ = 0.1, kt = 5,        m = 4.9979169 (= 100 sin 0.05)
const { primary } = declusterConstituents(particles([[50, 0, 0.05], [50, 0, TWO_PI - 0.05], [10, 0.3, 0.42], [10, 0.3, 0.38]]));
const n = primary.length / SPLIT_STRIDE;
const M_JET = 22.969316093181394;
const M_H = 4.997916927067833;

describe('SoftDrop on a known primary sequence', () => {
  it('β = 0, z_cut = 0.1 keeps everything: the root passes (0.1668 > 0.1), m_g is the jet mass', () => {
    const sd = softDrop(primary, n, { zCut: 0.1, beta: 0, R0: 0.4 }, 0);
    expect(sd.mg).toBeCloseTo(M_JET, 10);
    expect(sd.zg).toBeCloseTo(0.1668126216296975, 12);
    expect(sd.Rg).toBeCloseTo(0.5, 12);
  });

  it('β = 0, z_cut = 0.2 drops the soft branch S (0.1668 < 0.2) and stops at H1|H2 (0.5 > 0.2)', () => {
    const sd = softDrop(primary, n, { zCut: 0.2, beta: 0, R0: 0.4 }, 0);
    expect(sd.mg).toBeCloseTo(M_H, 11);
    expect(sd.zg).toBeCloseTo(0.5, 13);
    expect(sd.Rg).toBeCloseTo(0.1, 13);
  });

  it('β = 1, z_cut = 0.15, R0 = 0.4: the angle raises the root threshold to 0.15·(0.5/0.4) = 0.1875 > 0.1668', () => {
    // Same z_cut with β = 0 would keep the root (0.1668 > 0.15); with β = 1 the root fails and H1|H2
    // (threshold 0.15·0.1/0.4 = 0.0375 < 0.5) stops the grooming.
    expect(softDrop(primary, n, { zCut: 0.15, beta: 0, R0: 0.4 }, 0).Rg).toBeCloseTo(0.5, 12);
    const sd = softDrop(primary, n, { zCut: 0.15, beta: 1, R0: 0.4 }, 0);
    expect(sd.mg).toBeCloseTo(M_H, 11);
    expect(sd.Rg).toBeCloseTo(0.1, 13);
  });

  it('β = 2, z_cut = 0.12, R0 = 1: the root threshold falls to 0.12·0.25 = 0.03, so the root passes', () => {
    const sd = softDrop(primary, n, { zCut: 0.12, beta: 2, R0: 1 }, 0);
    expect(sd.mg).toBeCloseTo(M_JET, 10);
  });

  it('nothing passes, tagging mode: the jet fails, NaN (z_cut = 0.6 > every z; z = z_cut exactly fails too)', () => {
    // z = pt_b/(pt_a + pt_b) ≤ 1/2 exactly in floating point when pt_b ≤ pt_a, and H1|H2 has z = 1/2.
    expect(primary[SPLIT_STRIDE + 2]).toBeLessThanOrEqual(0.5);
    for (const zCut of [0.6, 0.5]) {
      const sd = softDrop(primary, n, { zCut, beta: 0, R0: 0.4, mode: 'tagging' }, 0);
      expect(Number.isNaN(sd.mg)).toBe(true);
      expect(Number.isNaN(sd.zg)).toBe(true);
      expect(Number.isNaN(sd.Rg)).toBe(true);
    }
  });

  it('nothing passes, grooming mode (the default): the last constituent stays, m_g = its mass, z_g = R_g = 0', () => {
    for (const mode of [undefined, 'grooming'] as const) {
      const sd = softDrop(primary, n, { zCut: 0.6, beta: 0, R0: 0.4, mode }, 0.13957);
      expect(sd).toEqual({ mg: 0.13957, zg: 0, Rg: 0 });
    }
  });

  it('a single particle has no splitting: it is its own groomed jet (grooming), or fails (tagging)', () => {
    expect(softDrop(new Float64Array(0), 0, { zCut: 0.1, beta: 0, R0: 0.4 }, 0)).toEqual({ mg: 0, zg: 0, Rg: 0 });
    const tagged = softDrop(new Float64Array(0), 0, { zCut: 0.1, beta: 0, R0: 0.4, mode: 'tagging' }, 0);
    expect(Number.isNaN(tagged.mg)).toBe(true);
  });
});

describe('primary emission multiplicity', () => {
  it('counts primary splittings with kt above the cut (kt = 9.998 and 5 here)', () => {
    expect(primaryMultiplicity(primary, n, 1)).toBe(2);
    expect(primaryMultiplicity(primary, n, 6)).toBe(1);
    expect(primaryMultiplicity(primary, n, 10)).toBe(0);
    expect(primaryMultiplicity(primary, n, 5)).toBe(primary[SPLIT_STRIDE + 4] > 5 ? 2 : 1); // strict: kt = 5 only counts if above
  });
});
