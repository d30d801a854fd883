// Four-vector conventions of PHYSICS.md "Four-vectors": rapidity (not pseudorapidity), azimuth in [0, 2π),
// signed mass for negative m², Δφ folding. The FastJet-form helpers (rapidityFJ, massFJ) follow FastJet 3.4's
// PseudoJet (arXiv:1111.6097) and must agree with the textbook forms.

import { describe, expect, it } from 'vitest';
import {
  TWO_PI, azimuth, deltaPhiAbs, deltaPhiSigned, fromPtYPhiM, mass, massFJ, particleProblem, rapidity, rapidityFJ, toGeV,
} from '../../../lib/physics/fourvector';

function p4(pt: number, y: number, phi: number, m: number): [number, number, number, number] {
  const o = new Float64Array(4);
  fromPtYPhiM(pt, y, phi, m, o, 0);
  return [o[0], o[1], o[2], o[3]];
}

describe('rapidity, not pseudorapidity', () => {
  it('a massive particle pt = 10, y = 1.2, m = 5 has y = 1.2 but η ≈ 1.2945', () => {
    // mt = sqrt(10² + 5²) = 11.18034; pz = mt sinh 1.2 = 16.87629; E = mt cosh 1.2.
    // y = ½ ln((E+pz)/(E−pz)) = ½ ln(e^{2.4}) = 1.2, whereas η = asinh(pz/pt) = asinh(1.687629) = 1.2945311.
    const [px, py, pz, E] = p4(10, 1.2, 0.3, 5);
    expect(pz).toBeCloseTo(16.87629100055294, 12);
    expect(rapidity(pz, E)).toBeCloseTo(1.2, 14);
    expect(rapidityFJ(px, py, pz, E)).toBeCloseTo(1.2, 14);
    expect(Math.asinh(pz / Math.hypot(px, py))).toBeCloseTo(1.2945311259557528, 12);
  });

  it('FastJet form and textbook form agree, including negative rapidity and pz = 0', () => {
    for (const [pt, y, m] of [[50, -3.1, 0], [0.5, 4.5, 0.14], [100, 0, 0], [7, -0.2, 2]]) {
      const [px, py, pz, E] = p4(pt, y, 1, m);
      expect(rapidityFJ(px, py, pz, E)).toBeCloseTo(y, 12);
      expect(rapidity(pz, E)).toBeCloseTo(y, 10);
    }
  });

  it('zero pt along the beam: FastJet caps the rapidity at ±(1e5 + |pz|) (such particles are rejected as input)', () => {
    expect(rapidityFJ(0, 0, 3, 3)).toBe(1e5 + 3);
    expect(rapidityFJ(0, 0, -3, 3)).toBe(-(1e5 + 3));
    expect(particleProblem(0, 0, 3, 3)).toMatch(/no finite rapidity/);
  });
});

describe('azimuth in [0, 2π)', () => {
  it('quadrants', () => {
    expect(azimuth(1, 0)).toBe(0);
    expect(azimuth(0, 1)).toBeCloseTo(Math.PI / 2, 15);
    expect(azimuth(-1, 0)).toBeCloseTo(Math.PI, 15);
    expect(azimuth(0, -1)).toBeCloseTo((3 * Math.PI) / 2, 15);
    expect(azimuth(1, -1)).toBeCloseTo((7 * Math.PI) / 4, 15);
  });

  it('a tiny negative angle wraps to 0, never to 2π', () => {
    // atan2(−1e−17, 1) = −1e−17; −1e−17 + 2π rounds to exactly 2π (one ulp of 2π is 8.9e−16),
    // which is outside [0, 2π): the second check brings it to 0 (as FastJet's PseudoJet does).
    expect(-1e-17 + TWO_PI).toBe(TWO_PI);
    const f = azimuth(1, -1e-17);
    expect(f).toBe(0);
    expect(f).toBeLessThan(TWO_PI);
  });

  it('zero pt gives 0 (FastJet convention), also for px = −0', () => {
    expect(azimuth(0, 0)).toBe(0);
    expect(azimuth(-0, 0)).toBe(0);
    expect(Math.atan2(0, -0)).toBe(Math.PI); // what a bare atan2 would give
  });
});

describe('signed mass', () => {
  it('m = sqrt(E² − p²) and the FastJet form (E+pz)(E−pz) − pt² agree', () => {
    // (3, 4, 12, 14): p² = 9 + 16 + 144 = 169, E² = 196, m² = 27, m = 5.196152.
    expect(mass(3, 4, 12, 14)).toBeCloseTo(Math.sqrt(27), 13);
    expect(massFJ(3, 4, 12, 14)).toBeCloseTo(Math.sqrt(27), 13);
  });

  it('negative m² from rounding is reported as −sqrt(|m²|)', () => {
    // (3, 0, 4, 5 − 1e−9): E² − p² = (5 − 1e−9)² − 25 ≈ −1e−8, so m ≈ −1e−4.
    expect(mass(3, 0, 4, 5 - 1e-9)).toBeCloseTo(-1e-4, 9);
    expect(massFJ(3, 0, 4, 5 - 1e-9)).toBeCloseTo(-1e-4, 9);
  });
});

describe('Δφ folding', () => {
  it('|Δφ| in [0, π] across the 0 ≡ 2π cut', () => {
    // φ = 0.1 and 2π − 0.1 are 0.2 apart, not 2π − 0.2.
    expect(deltaPhiAbs(0.1, TWO_PI - 0.1)).toBeCloseTo(0.2, 14);
    expect(deltaPhiAbs(0, Math.PI)).toBeCloseTo(Math.PI, 15);
  });

  it('signed Δφ in (−π, π]', () => {
    expect(deltaPhiSigned(0.1, TWO_PI - 0.1)).toBeCloseTo(0.2, 14);
    expect(deltaPhiSigned(TWO_PI - 0.1, 0.1)).toBeCloseTo(-0.2, 14);
    expect(deltaPhiSigned(Math.PI, 0)).toBe(Math.PI); // +π is in, −π is not
    expect(deltaPhiSigned(0, Math.PI)).toBe(Math.PI);
  });
});

describe('input conversion', () => {
  it('(pt, y, φ, m) → (px, py, pz, E) and back', () => {
    const [px, py, pz, E] = p4(25, -1.5, 5.5, 1.2);
    expect(Math.hypot(px, py)).toBeCloseTo(25, 12);
    expect(azimuth(px, py)).toBeCloseTo(5.5, 13);
    expect(rapidityFJ(px, py, pz, E)).toBeCloseTo(-1.5, 13);
    expect(massFJ(px, py, pz, E)).toBeCloseTo(1.2, 9);
  });

  it('units', () => {
    expect(toGeV('MeV')).toBe(1e-3);
    expect(toGeV('TeV')).toBe(1e3);
    expect(toGeV('GeV')).toBe(1);
  });

  it('invalid particles are named', () => {
    expect(particleProblem(1, 0, 0, 1)).toBeNull();
    expect(particleProblem(NaN, 0, 0, 1)).toMatch(/finite/);
    expect(particleProblem(0, 0, 0, -1)).toMatch(/negative energy/);
    expect(particleProblem(3, 4, 0, 4)).toMatch(/energy below momentum/);
  });
});
