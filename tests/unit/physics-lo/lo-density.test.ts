// Leading-order expectation, checked against the formulas of PHYSICS.md and their sources:
// one-loop running with α_s(M_Z) = 0.1180 (PDG, Review of Particle Physics 2024), the Altarelli–Parisi splitting
// functions (Nucl. Phys. B126 (1977) 298) and the SU(3) colour factors C_F = 4/3, C_A = 3.
import { describe, expect, it } from 'vitest';
import { ALPHA_S_MZ, alphaS, B0, isPerturbative, M_Z, PERTURBATIVE_KT_MIN } from '@/lib/physics/running-coupling';
import {
  colourFactor,
  hardCollinearDensity,
  type Parton,
  softCollinearDensity,
  splittingWeight,
} from '@/lib/physics/lo-density';

describe('one-loop α_s', () => {
  it('equals the PDG 2024 world average 0.1180 at k = M_Z = 91.1876 GeV', () => {
    expect(ALPHA_S_MZ).toBe(0.118);
    expect(alphaS(91.1876)).toBeCloseTo(0.118, 15);
  });

  it('uses b0 = (11 C_A − 2 n_f)/(12π) = 23/(12π) for n_f = 5', () => {
    expect(B0).toBeCloseTo(23 / (12 * Math.PI), 15);
  });

  it('matches the one-loop formula worked by hand at 1, 10 and 1000 GeV', () => {
    // 2 b0 α_s(M_Z) = 2 · 0.6100939 · 0.118 = 0.1439822
    // k = 1 GeV:    ln(1/91.1876)   = −4.5129189 → 0.118 / (1 − 0.6497807) = 0.3369309
    // k = 10 GeV:   ln(10/91.1876)  = −2.2103338 → 0.118 / (1 − 0.3182488) = 0.1730836
    // k = 1000 GeV: ln(1000/91.1876) = 2.3948364 → 0.118 / (1 + 0.3448138) = 0.0877445
    expect(alphaS(1)).toBeCloseTo(0.3369309, 6);
    expect(alphaS(10)).toBeCloseTo(0.1730836, 6);
    expect(alphaS(1000)).toBeCloseTo(0.0877445, 6);
  });

  it('decreases strictly with the scale (asymptotic freedom)', () => {
    let previous = Infinity;
    for (let lnK = 0; lnK <= Math.log(1e4); lnK += 0.01) {
      const a = alphaS(Math.exp(lnK));
      expect(a).toBeLessThan(previous);
      previous = a;
    }
  });

  it('stops at the ~1 GeV non-perturbative boundary (common practice, no single source)', () => {
    expect(PERTURBATIVE_KT_MIN).toBe(1);
    expect(isPerturbative(1)).toBe(true);
    expect(isPerturbative(0.999)).toBe(false);
    expect(isPerturbative(Number.NaN)).toBe(false);
    expect(() => alphaS(0.5)).toThrow(/perturbative region/);
    expect(() => alphaS(Number.POSITIVE_INFINITY)).toThrow(/perturbative region/);
    expect(() => softCollinearDensity('quark', 0.9)).toThrow(/0.9 GeV/);
    expect(M_Z).toBe(91.1876);
  });
});

describe('leading-order primary density', () => {
  it('soft-collinear limit is 2 α_s(kt) C_i / π with C_F = 4/3, C_A = 3', () => {
    // at kt = M_Z: quark 2 · 0.118 · (4/3) / π = 0.1001615, gluon 2 · 0.118 · 3 / π = 0.2253634
    expect(softCollinearDensity('quark', M_Z)).toBeCloseTo(0.1001615, 6);
    expect(softCollinearDensity('gluon', M_Z)).toBeCloseTo(0.2253634, 6);
  });

  it('gluon/quark ratio is C_A/C_F = 9/4 at every kt', () => {
    for (const kt of [1, 3, 20, 500]) {
      expect(softCollinearDensity('gluon', kt) / softCollinearDensity('quark', kt)).toBeCloseTo(9 / 4, 12);
    }
  });

  it('both hard-collinear forms reduce to 2 C_i α_s/π as z → 0 (PHYSICS.md check)', () => {
    for (const parton of ['quark', 'gluon'] as Parton[]) {
      const soft = softCollinearDensity(parton, 5);
      // corrections are O(z): quark −C_F z, gluon −2 C_A z + 2 n_f T_R z, so z = 1e-7 leaves < 1e-6 relative
      expect(hardCollinearDensity(parton, 1e-7, 5) / soft).toBeCloseTo(1, 6);
      expect(splittingWeight(parton, 1e-7)).toBeCloseTo(2 * colourFactor(parton), 5);
    }
    const ratio = splittingWeight('gluon', 1e-7) / splittingWeight('quark', 1e-7);
    expect(ratio).toBeCloseTo(9 / 4, 5);
  });

  it('hard-collinear z-dependence at the symmetric point z = 1/2, worked by hand', () => {
    // quark: z [P_gq(½) + P_gq(½)] = ½ · 2 · C_F (1 + ¼)/½ = 2.5 C_F = 10/3
    expect(splittingWeight('quark', 0.5)).toBeCloseTo(10 / 3, 12);
    // gluon: ½ · 2·3 (1 + 1 + ¼) = 6.75, plus ½ · 2·5·½ (¼ + ¼) = 1.25 → 8
    expect(splittingWeight('gluon', 0.5)).toBeCloseTo(8, 12);
    // z = 0.1, quark: 0.1 · (4/3) [(1 + 0.81)/0.1 + (1 + 0.01)/0.9] = (4/3)(1.81 + 0.1122222) = 2.5629630
    expect(splittingWeight('quark', 0.1)).toBeCloseTo(2.562963, 6);
  });

  it('rejects z outside (0, 1/2] and unknown partons', () => {
    expect(() => splittingWeight('quark', 0)).toThrow(/0 < z <= 1\/2/);
    expect(() => splittingWeight('gluon', 0.6)).toThrow(/0 < z <= 1\/2/);
    expect(() => splittingWeight('quark', Number.NaN)).toThrow(/0 < z <= 1\/2/);
    expect(() => colourFactor('photon' as Parton)).toThrow(/unknown parton "photon"/);
    expect(() => splittingWeight('top' as Parton, 0.2)).toThrow(/unknown parton "top"/);
  });
});
