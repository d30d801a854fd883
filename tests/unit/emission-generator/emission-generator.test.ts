// The leading-order emission generator, checked against the soft-collinear density ρ = 2 α_s(kt) C_i / π of
// PHYSICS.md (one-loop α_s with α_s(M_Z) = 0.1180 from PDG 2024; C_F = 4/3, C_A = 3 of SU(3); plane of
// arXiv:1807.04758), on the emissions as the particles show them.
// These are statistical checks with fixed seeds; each tolerance is stated with its reasons.
import { describe, expect, it } from 'vitest';
import { PlaneHistogram, defaultGrid } from '@/lib/physics/density';
import {
  type EmissionSettings,
  emissionSettingsProblem,
  generateEmissionJet,
  generateEmissionRecords,
} from '@/lib/physics/emission-generator';
import { azimuth, deltaPhiAbs, mass, particleProblem, rapidity } from '@/lib/physics/fourvector';
import { colourFactor, type Parton, splittingWeight } from '@/lib/physics/lo-density';
import { alphaS } from '@/lib/physics/running-coupling';
import { Rng } from '@/lib/physics/random';

const R = 0.8;
const settingsOf = (parton: Parton, extra: Partial<EmissionSettings> = {}): EmissionSettings => ({
  parton,
  pt: 1000,
  R,
  yMax: 2,
  ktCut: 1,
  hardCollinear: false,
  background: null,
  ...extra,
});

/** Per-jet number of emissions expected at leading order in ln(R/Δ) ∈ [l1, l2], ln kt ∈ [t1, t2] (midpoint rule). */
function expectedPerJet(parton: Parton, l1: number, l2: number, t1: number, t2: number): number {
  const steps = 2000;
  let integral = 0;
  for (let k = 0; k < steps; k++) integral += alphaS(Math.exp(t1 + ((k + 0.5) * (t2 - t1)) / steps));
  integral *= (t2 - t1) / steps;
  return ((2 * colourFactor(parton)) / Math.PI) * integral * (l2 - l1);
}

/** Measured per-jet emissions in a region of fine edges (0.05 grid) of a ln(R/Δ) histogram. */
function measuredPerJet(h: PlaneHistogram, l1: number, l2: number, t1: number, t2: number): number {
  const merge = (a: number, b: number) => Math.round((b - a) / 0.05);
  const map = h.rebin({ min: l1, max: l2, merge: merge(l1, l2) }, { min: t1, max: t2, merge: merge(t1, t2) });
  return map.density[0] * (l2 - l1) * (t2 - t1);
}

const ptOf = (p: Float64Array, i: number) => Math.hypot(p[4 * i], p[4 * i + 1]);

/**
 * The emissions as generated: the generator lists the leading parton, then the emissions in order of emission.
 * Undoing them in reverse order, the harder branch of emission i is the leader plus all later emissions.
 */
function fillGenerated(h: PlaneHistogram, p: Float64Array): void {
  h.addJet(1);
  const a = Array.from(p.subarray(0, 4));
  for (let i = p.length / 4 - 1; i >= 1; i--) {
    const b = p.subarray(4 * i, 4 * i + 4);
    const dy = rapidity(a[2], a[3]) - rapidity(b[2], b[3]);
    const delta = Math.hypot(dy, deltaPhiAbs(azimuth(a[0], a[1]), azimuth(b[0], b[1])));
    h.fillEmission(Math.log(1 / delta), Math.log(ptOf(p, i) * delta), 1);
    for (let k = 0; k < 4; k++) a[k] += b[k];
  }
}

describe('generated jets', () => {
  it('are reproducible from the seed', () => {
    const a = [...generateEmissionRecords(settingsOf('gluon'), 5, 42)];
    const b = [...generateEmissionRecords(settingsOf('gluon'), 5, 42)];
    const c = [...generateEmissionRecords(settingsOf('gluon'), 5, 43)];
    expect(a.map((r) => Array.from(r.particles))).toEqual(b.map((r) => Array.from(r.particles)));
    expect(a[0].particles).not.toEqual(c[0].particles);
    expect(a.map((r) => r.id)).toEqual(['j1', 'j2', 'j3', 'j4', 'j5']);
  });

  it('hold valid massless particles and conserve the leading parton’s three-momentum', () => {
    for (const record of generateEmissionRecords(settingsOf('gluon', { hardCollinear: true }), 300, 7)) {
      const p = record.particles;
      let px = 0;
      let py = 0;
      for (let i = 0; i < p.length / 4; i++) {
        expect(particleProblem(p[4 * i], p[4 * i + 1], p[4 * i + 2], p[4 * i + 3])).toBeNull();
        expect(Math.abs(mass(p[4 * i], p[4 * i + 1], p[4 * i + 2], p[4 * i + 3]))).toBeLessThan(1e-6 * p[4 * i + 3]);
        px += p[4 * i];
        py += p[4 * i + 1];
      }
      expect(Math.hypot(px, py)).toBeCloseTo(1000, 8);
    }
  });

  it('have hard-collinear weights below the veto overestimate 3 C_i for 0 < z ≤ 1/2', () => {
    // splittingWeight is largest at z = 1/2: 2.5 C_F (quark), 8 = 2.67 C_A (gluon); the generator relies on 3 C_i
    for (const parton of ['quark', 'gluon'] as Parton[]) {
      for (let z = 1e-4; z <= 0.5; z += 1e-4) expect(splittingWeight(parton, z)).toBeLessThanOrEqual(3 * colourFactor(parton));
    }
  });

  it('reject invalid settings with clear messages', () => {
    expect(emissionSettingsProblem(settingsOf('quark'))).toBeNull();
    expect(emissionSettingsProblem(settingsOf('quark', { ktCut: 0.5 }))).toMatch(/ktCut must be at least 1 GeV/);
    expect(emissionSettingsProblem(settingsOf('quark', { pt: -5 }))).toMatch(/pt must be a positive number/);
    expect(emissionSettingsProblem(settingsOf('quark', { R: 2 }))).toMatch(/R must be in \(0, 1.5\]/);
    expect(emissionSettingsProblem(settingsOf('photon' as Parton))).toMatch(/unknown parton "photon"/);
    expect(emissionSettingsProblem(settingsOf('quark', { background: { perUnitArea: 1e4, meanPt: 1 } }))).toMatch(
      /more than 500 particles a jet/,
    );
    expect(() => generateEmissionJet(new Rng(1), settingsOf('quark', { yMax: -1 }))).toThrow(/emission generator: yMax/);
    expect(() => [...generateEmissionRecords(settingsOf('quark'), 1.5, 1)]).toThrow(/jet count must be a non-negative integer/);
  });

  it('add a Poisson soft background over the jet disc', () => {
    // mean count perUnitArea · πR² = 3 · π · 0.64 = 6.03; Poisson: variance = mean. 2000 jets: the mean is known to
    // ±0.055 (1σ), the variance to about ±0.3, so 5% and 15% tolerances are > 3σ.
    const background = { perUnitArea: 3, meanPt: 0.4 };
    const counts: number[] = [];
    let ptSum = 0;
    for (let seed = 1; seed <= 2000; seed++) {
      const bare = generateEmissionJet(new Rng(seed), settingsOf('quark'));
      const full = generateEmissionJet(new Rng(seed), settingsOf('quark', { background }));
      expect(Array.from(full.subarray(0, bare.length))).toEqual(Array.from(bare));
      // the disc is centred on the initial parton, whose three-momentum the leader and emissions share
      const axis = [0, 0, 0];
      for (let at = 0; at < bare.length; at += 4) for (let k = 0; k < 3; k++) axis[k] += bare[at + k];
      const axisY = rapidity(axis[2], Math.hypot(...axis));
      const axisPhi = azimuth(axis[0], axis[1]);
      counts.push((full.length - bare.length) / 4);
      for (let at = bare.length; at < full.length; at += 4) {
        ptSum += Math.hypot(full[at], full[at + 1]);
        const d = Math.hypot(rapidity(full[at + 2], full[at + 3]) - axisY, deltaPhiAbs(azimuth(full[at], full[at + 1]), axisPhi));
        expect(d).toBeLessThan(R + 1e-9);
      }
    }
    const mean = counts.reduce((a, b) => a + b, 0) / counts.length;
    const variance = counts.reduce((a, b) => a + (b - mean) ** 2, 0) / (counts.length - 1);
    expect(Math.abs(mean / (3 * Math.PI * R * R) - 1)).toBeLessThan(0.05);
    expect(Math.abs(variance / mean - 1)).toBeLessThan(0.15);
    expect(Math.abs(ptSum / counts.reduce((a, b) => a + b, 0) / 0.4 - 1)).toBeLessThan(0.05); // ~12000 particles
  });
});

describe('density of the generated emissions (PHYSICS.md soft-collinear limit)', () => {
  // Region ln(R/Δ) ∈ [0, 2.5], ln kt ∈ [0, 3]: inside z ≤ 1/2 for 1 TeV jets (at ln(R/Δ) = 2.5 the edge is
  // ln(½ · 1000 · 0.8 e^−2.5) = 3.5). 4000 jets give ~5600 quark and ~12600 gluon emissions there: statistical
  // errors 1.3% and 0.9%. Tolerance 6% (beyond 4σ), as recoil shifts the measured Δ and kt at O(z).
  it.each([['quark'], ['gluon']] as Array<[Parton]>)('%s jets: 2 α_s(kt) C_i / π per unit ln(R/Δ) and ln kt', (parton) => {
    const h = new PlaneHistogram(defaultGrid('lnRoverDelta', R));
    for (const record of generateEmissionRecords(settingsOf(parton), 4000, parton === 'quark' ? 101 : 202)) fillGenerated(h, record.particles);
    const ratio = measuredPerJet(h, 0, 2.5, 0, 3) / expectedPerJet(parton, 0, 2.5, 0, 3);
    expect(Math.abs(ratio - 1)).toBeLessThan(0.06);
    // and nothing outside the generation region Δ < R, kt > 1 GeV, up to the second-order shifts of the
    // measured Δ and kt that recoil causes (allowed: Δ up to 1.16 R, kt down to 0.95 GeV)
    expect(measuredPerJet(h, -1, -0.15, -5, 7)).toBe(0);
    expect(measuredPerJet(h, -1, 8, -5, -0.05)).toBe(0);
  });
});

// The declustered density against the expectation (what C/A clustering does, and where it is small) is checked in
// tests/unit/maps/closure.test.ts.
