// Declustering of the C/A tree into the emission plane's splittings, worked on paper.
// Source: the primary-emission-plane paper, JHEP 12 (2018) 064, arXiv:1807.04758 (PHYSICS.md "Declustering and
// the emission plane"): j → a, b with pt_a ≥ pt_b; Δ = ΔR_ab, kt = pt_b Δ, z = pt_b/(pt_a+pt_b), m = m_{a+b},
// κ = zΔ, ψ = atan2(y_b − y_a, Δφ folded into (−π, π]); generation = 1 + softer branches followed.

import { describe, expect, it } from 'vitest';
import { declusterConstituents } from '../../../lib/physics/decluster';
import { TWO_PI, fromPtYPhiM } from '../../../lib/physics/fourvector';
import {
  SPLIT_STRIDE, S_DELTA, S_GENERATION, S_KAPPA, S_KT, S_LN_INV_DELTA, S_LN_KT, S_M, S_PSI, S_Z,
} from '../../../lib/physics/types';

function particles(list: [number, number, number][]): Float64Array {
  const p = new Float64Array(4 * list.length);
  list.forEach(([pt, y, phi], i) => fromPtYPhiM(pt, y, phi, 0, p, 4 * i));
  return p;
}

function row(a: Float64Array, k: number) {
  const o = k * SPLIT_STRIDE;
  return {
    lnInvDelta: a[o + S_LN_INV_DELTA], lnKt: a[o + S_LN_KT], z: a[o + S_Z], delta: a[o + S_DELTA], kt: a[o + S_KT],
    psi: a[o + S_PSI], m: a[o + S_M], kappa: a[o + S_KAPPA], generation: a[o + S_GENERATION],
  };
}

describe('one splitting (two massless particles)', () => {
  // a: pt 100, y 0, φ 0;  b: pt 20, y 0.3, φ 0.4.
  //   Δ = sqrt(0.3² + 0.4²) = 0.5;  kt = 20 · 0.5 = 10;  z = 20/120 = 1/6;  κ = zΔ = 1/12;
  //   ψ = atan2(0.3, 0.4) = atan(3/4) = 0.6435011087932844;  ln(1/Δ) = ln 2;  ln kt = ln 10;
  //   m² = 2 pt_a pt_b (cosh Δy − cos Δφ) = 4000 (1.0453385141288605 − 0.9210609940028851) = 497.11008,
  //   m = 22.295965565633203 GeV.
  const { primary, all } = declusterConstituents(particles([[100, 0, 0], [20, 0.3, 0.4]]), true);

  it('has the values computed by hand', () => {
    expect(primary.length).toBe(SPLIT_STRIDE);
    const s = row(primary, 0);
    expect(s.delta).toBeCloseTo(0.5, 13);
    expect(s.kt).toBeCloseTo(10, 12);
    expect(s.z).toBeCloseTo(1 / 6, 14);
    expect(s.kappa).toBeCloseTo(1 / 12, 13);
    expect(s.psi).toBeCloseTo(0.6435011087932844, 12);
    expect(s.lnInvDelta).toBeCloseTo(Math.LN2, 12);
    expect(s.lnKt).toBeCloseTo(Math.LN10, 12);
    expect(s.m).toBeCloseTo(22.295965565633203, 11);
    expect(s.generation).toBe(1);
    expect(all).toEqual(primary);
  });

  it('ψ follows the softer branch: mirrored in y it changes sign, across φ = 0 ≡ 2π it uses the folded Δφ', () => {
    // b at y = −0.3: ψ = atan2(−0.3, 0.4) = −0.6435.
    const mirrored = declusterConstituents(particles([[100, 0, 0], [20, -0.3, 0.4]])).primary;
    expect(row(mirrored, 0).psi).toBeCloseTo(-0.6435011087932844, 12);
    // a at φ = 0.1, b at φ = 2π − 0.3 (i.e. −0.3): Δφ = −0.4 after folding, ψ = atan2(0.3, −0.4) = π − 0.6435.
    const wrapped = declusterConstituents(particles([[100, 0, 0.1], [20, 0.3, TWO_PI - 0.3]])).primary;
    expect(row(wrapped, 0).psi).toBeCloseTo(Math.PI - 0.6435011087932844, 12);
    expect(row(wrapped, 0).delta).toBeCloseTo(0.5, 12);
  });
});

describe('primary sequence and full tree', () => {
  // A hard pair H = H1 (pt 50, y 0, φ 0.05) + H2 (pt 50, y 0, φ 2π − 0.05), and a softer pair
  // S = S1 (pt 10, y 0.3, φ 0.42) + S2 (pt 10, y 0.3, φ 0.38). C/A merges by increasing ΔR:
  // S1–S2 (0.04), then H1–H2 (0.1, across the φ cut), then H–S (0.5). For a symmetric pair the sum points at
  // the middle: H at (y 0, φ 0) with pt = 100 cos 0.05 = 99.87502603949663 and m = 100 sin 0.05 = 4.997916927067833
  // (m = 2 pt sin(Δφ/2) for two massless particles of equal pt and y); S at (0.3, 0.4), pt = 20 cos 0.02 =
  // 19.996000133331556, m = 20 sin 0.02 = 0.3999733338666616.
  const p = particles([[50, 0, 0.05], [50, 0, TWO_PI - 0.05], [10, 0.3, 0.42], [10, 0.3, 0.38]]);
  const { primary, all } = declusterConstituents(p, true);

  it('the root splitting H → (a = H, b = S)', () => {
    // Δ = 0.5; z = 19.996/(19.996 + 99.875) = 0.1668126216296975; kt = 19.996 · 0.5 = 9.998000066665778;
    // ψ = atan2(0.3, 0.4); m² = m_H² + m_S² + 2 (mt_H mt_S cosh 0.3 − pt_H pt_S cos 0.4) with mt_H = 100,
    // mt_S = 20: = 24.979 + 0.160 + 2 (2090.677 − 1839.453) = 527.58948, m = 22.969316093181394.
    const s = row(primary, 0);
    expect(s.delta).toBeCloseTo(0.5, 12);
    expect(s.z).toBeCloseTo(0.1668126216296975, 12);
    expect(s.kt).toBeCloseTo(9.998000066665778, 11);
    expect(s.psi).toBeCloseTo(0.6435011087932844, 12);
    expect(s.m).toBeCloseTo(22.969316093181394, 10);
    expect(s.lnKt).toBeCloseTo(Math.log(9.998000066665778), 12);
    expect(s.generation).toBe(1);
  });

  it('a symmetric splitting: z = 1/2 (H1 | H2 across φ = 0)', () => {
    // Δ = 0.1 (|Δφ| = 2π − 0.1 folds to 0.1), z = 50/100 = 1/2, kt = 50 · 0.1 = 5, κ = 0.05,
    // m = 100 sin 0.05; with equal pt either particle may be "a", so ψ = atan2(0, ±0.1) ∈ {0, π}.
    expect(primary.length).toBe(2 * SPLIT_STRIDE);
    const s = row(primary, 1);
    expect(s.z).toBeCloseTo(0.5, 14);
    expect(s.delta).toBeCloseTo(0.1, 13);
    expect(s.kt).toBeCloseTo(5, 12);
    expect(s.kappa).toBeCloseTo(0.05, 13);
    expect(s.m).toBeCloseTo(4.997916927067833, 11);
    expect(s.lnInvDelta).toBeCloseTo(Math.LN10, 12);
    expect(s.lnKt).toBeCloseTo(Math.log(5), 12);
    expect(Math.abs(Math.sin(s.psi))).toBeLessThan(1e-12);
    expect(s.generation).toBe(1);
  });

  it('full tree: depth first, harder branch first, the softer pair is generation 2', () => {
    // Order: root (gen 1), H1|H2 (gen 1, harder branch), S1|S2 (gen 2: one softer step from the root).
    // S1|S2: Δ = 0.04, z = 1/2, kt = 10 · 0.04 = 0.4, m = 20 sin 0.02, ln(1/Δ) = ln 25, ln kt = ln 0.4.
    expect(all!.length).toBe(3 * SPLIT_STRIDE);
    expect(row(all!, 0)).toEqual(row(primary, 0));
    expect(row(all!, 1)).toEqual(row(primary, 1));
    const s = row(all!, 2);
    expect(s.generation).toBe(2);
    expect(s.delta).toBeCloseTo(0.04, 13);
    expect(s.z).toBeCloseTo(0.5, 13);
    expect(s.kt).toBeCloseTo(0.4, 12);
    expect(s.m).toBeCloseTo(0.3999733338666616, 12);
    expect(s.lnInvDelta).toBeCloseTo(Math.log(25), 11);
    expect(s.lnKt).toBeCloseTo(Math.log(0.4), 11);
  });

  it('generation 3 after two softer steps', () => {
    // As above with S2 split into S2a (pt 4, φ 0.385) + S2b (pt 4, φ 0.375), Δ = 0.01: S2 (pt ≈ 8) is softer
    // than S1 (pt 10), so its splitting is two softer steps away from the root: generation 3.
    // Depth-first order: root (1), H1|H2 (1), S1|S2 (2), S2a|S2b (3).
    const q = particles([[50, 0, 0.05], [50, 0, TWO_PI - 0.05], [10, 0.3, 0.42], [4, 0.3, 0.385], [4, 0.3, 0.375]]);
    const t = declusterConstituents(q, true).all!;
    expect(t.length).toBe(4 * SPLIT_STRIDE);
    expect([0, 1, 2, 3].map((k) => row(t, k).generation)).toEqual([1, 1, 2, 3]);
    expect(row(t, 3).delta).toBeCloseTo(0.01, 13);
    expect(row(t, 2).delta).toBeCloseTo(0.04, 6);
  });

  it('one particle: no splitting', () => {
    const { primary: p1, all: a1 } = declusterConstituents(particles([[30, 1, 2]]), true);
    expect(p1.length).toBe(0);
    expect(a1!.length).toBe(0);
  });
});
