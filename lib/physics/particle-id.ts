// Particle codes of the "Monte Carlo particle numbering scheme" (Review of Particle Physics, Particle Data Group):
// electric charge from a code, neutrinos, and the heavy quark (b or c) among a hadron's quark digits.
//
// A hadron's code is ±n nr nL nq1 nq2 nq3 nJ (decimal digits). Mesons have nq1 = 0 and quark digits nq2, nq3
// (a quark and an antiquark); baryons have three quark digits nq1 nq2 nq3; a diquark has nq3 = 0. Nuclei are
// ±10LZZZAAAI. Quark codes 1..8 are d u s c b t b' t'; leptons 11..18 are e νe μ νμ τ ντ τ' ντ'.

/** Three times the charge of quark code 1..8 (d u s c b t b' t'). */
const QUARK_3CHARGE = [0, -1, 2, -1, 2, -1, 2, -1, 2];

/** Three times the charge of the particle with a positive fundamental code below 100, or NaN if unknown. */
function fundamental3Charge(a: number): number {
  if (a >= 1 && a <= 8) return QUARK_3CHARGE[a];
  if (a >= 11 && a <= 18) return a % 2 === 1 ? -3 : 0;
  if (a === 24 || a === 34 || a === 37) return 3; // W+, W'+, H+
  if (a === 21 || a === 22 || a === 23 || a === 25 || a === 32 || a === 33 || a === 35 || a === 36 || a === 39) return 0;
  return NaN;
}

/** Quark digits of a hadron code (absolute value): [nq1, nq2, nq3]. */
function quarkDigits(a: number): [number, number, number] {
  return [Math.floor(a / 1000) % 10, Math.floor(a / 100) % 10, Math.floor(a / 10) % 10];
}

/** True for codes with the digit pattern of a meson or a baryon (not a quark, lepton, boson, diquark or nucleus). */
export function isHadronCode(pid: number): boolean {
  const a = Math.abs(pid);
  if (!Number.isInteger(a) || a < 100 || a >= 1_000_000_000) return false;
  const [, q2, q3] = quarkDigits(a);
  return q2 !== 0 && q3 !== 0;
}

/**
 * Three times the electric charge of a particle code (so that quarks give integers), or NaN when the code is
 * not one this scheme defines a charge for.
 */
export function threeCharge(pid: number): number {
  if (!Number.isInteger(pid) || pid === 0) return NaN;
  const sign = pid < 0 ? -1 : 1;
  const a = Math.abs(pid);
  if (a >= 1_000_000_000) return sign * 3 * (Math.floor(a / 10_000) % 1000); // nucleus: Z
  if (a < 100) return sign * fundamental3Charge(a);
  const n = Math.floor(a / 1_000_000) % 10;
  const core = a % 1_000_000;
  // Supersymmetric partners (n = 1, 2) carry the charge of their standard partner.
  if ((n === 1 || n === 2) && core < 100) return sign * fundamental3Charge(core);
  const [q1, q2, q3] = quarkDigits(a);
  if (q2 === 0) return NaN;
  if (q3 === 0) return sign * (QUARK_3CHARGE[q1] + QUARK_3CHARGE[q2]); // diquark
  if (q1 === 0) {
    // Meson q q̄': the first quark digit is the quark for up-type, the antiquark for down-type (odd) digits.
    const c = QUARK_3CHARGE[q2] - QUARK_3CHARGE[q3];
    return sign * (q2 % 2 === 1 ? -c : c);
  }
  return sign * (QUARK_3CHARGE[q1] + QUARK_3CHARGE[q2] + QUARK_3CHARGE[q3]);
}

/** Neutrinos: |pid| 12, 14, 16, 18. */
export function isNeutrino(pid: number): boolean {
  const a = Math.abs(pid);
  return a === 12 || a === 14 || a === 16 || a === 18;
}

/** Flavour codes of a tag: 5 b, 4 c, 0 light (no heavy quark). */
export const FLAVOUR_B = 5;
export const FLAVOUR_C = 4;
export const FLAVOUR_LIGHT = 0;

/** 5 for a hadron with a b quark among its quark digits, else 4 for one with a c quark, else 0. */
export function heavyFlavour(pid: number): number {
  if (!isHadronCode(pid)) return FLAVOUR_LIGHT;
  const d = quarkDigits(Math.abs(pid));
  if (d.includes(5)) return FLAVOUR_B;
  if (d.includes(4)) return FLAVOUR_C;
  return FLAVOUR_LIGHT;
}
