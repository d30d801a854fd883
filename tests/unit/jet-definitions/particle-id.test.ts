// Particle codes against the "Monte Carlo particle numbering scheme" and the particle listings of the Review of
// Particle Physics (Particle Data Group): charges and heavy-quark content of well-known particles.
import { describe, expect, it } from 'vitest';
import { heavyFlavour, isNeutrino, threeCharge } from '@/lib/physics/particle-id';

describe('charges from particle codes (Review of Particle Physics listings)', () => {
  const charges: Array<[number, string, number]> = [
    [11, 'e−', -1], [-11, 'e+', 1], [13, 'μ−', -1], [-15, 'τ+', 1], [12, 'νe', 0], [22, 'γ', 0], [21, 'g', 0],
    [24, 'W+', 1], [-24, 'W−', -1], [2, 'u', 2 / 3], [-1, 'd̄', 1 / 3],
    [211, 'π+', 1], [-211, 'π−', -1], [111, 'π0', 0], [321, 'K+', 1], [-321, 'K−', -1], [311, 'K0', 0],
    [130, 'K0L', 0], [310, 'K0S', 0], [411, 'D+', 1], [421, 'D0', 0], [431, 'Ds+', 1], [511, 'B0', 0],
    [521, 'B+', 1], [-521, 'B−', -1], [531, 'Bs0', 0], [541, 'Bc+', 1], [443, 'J/ψ', 0], [553, 'Υ(1S)', 0],
    [100553, 'Υ(2S)', 0], [2212, 'p', 1], [-2212, 'p̄', -1], [2112, 'n', 0], [3122, 'Λ', 0], [3112, 'Σ−', -1],
    [3222, 'Σ+', 1], [3334, 'Ω−', -1], [4122, 'Λc+', 1], [4422, 'Ξcc++', 2], [5122, 'Λb0', 0], [5132, 'Ξb−', -1],
    [2224, 'Δ++', 2], [1000010020, 'deuteron', 1], [1000020040, 'α', 2],
  ];
  for (const [pid, name, q] of charges) {
    it(`${name} (${pid}) has charge ${q}`, () => expect(threeCharge(pid) / 3).toBeCloseTo(q, 12));
  }
  it('codes outside the scheme have no charge', () => {
    expect(threeCharge(0)).toBeNaN();
    expect(threeCharge(99)).toBeNaN();
  });
});

describe('heavy-flavour hadrons: a b (else c) quark among the quark digits (PHYSICS.md "Flavour tags")', () => {
  it('b hadrons', () => {
    for (const pid of [511, -511, 521, 531, 541, 5122, -5122, 5132, 553, 513, 10521]) expect(heavyFlavour(pid), String(pid)).toBe(5);
  });
  it('c hadrons', () => {
    for (const pid of [411, -421, 431, 443, 4122, 4422, 413, -4132]) expect(heavyFlavour(pid), String(pid)).toBe(4);
  });
  it('light hadrons, quarks, leptons, diquarks and nuclei tag nothing', () => {
    for (const pid of [211, 2212, 3122, 130, 5, 4, -5, 11, 22, 5101, 4301, 1000010020]) expect(heavyFlavour(pid), String(pid)).toBe(0);
  });
  it('neutrinos', () => {
    expect([12, -12, 14, 16, -18].every(isNeutrino)).toBe(true);
    expect([11, 13, 22, 211].some(isNeutrino)).toBe(false);
  });
});
