// Leading-order primary emission density per unit ln(1/Δ) and ln kt (PHYSICS.md "Leading-order expectation"):
// the soft-collinear limit 2 α_s(kt) C_i / π and the hard-collinear forms built from the Altarelli–Parisi
// splitting functions ("Asymptotic freedom in parton language", Nucl. Phys. B126 (1977) 298).
import { alphaS, C_A, C_F, N_F, T_R } from './running-coupling';

export type Parton = 'quark' | 'gluon';

/** Colour factor of the emitting parton: C_F for a quark, C_A for a gluon. */
export function colourFactor(parton: Parton): number {
  if (parton === 'quark') return C_F;
  if (parton === 'gluon') return C_A;
  throw unknownParton(parton);
}

function unknownParton(parton: unknown): RangeError {
  return new RangeError(`unknown parton "${String(parton)}" (expected "quark" or "gluon")`);
}

/** Soft-collinear density ρ = 2 α_s(kt) C_i / π; kt in GeV, at least PERTURBATIVE_KT_MIN. */
export function softCollinearDensity(parton: Parton, kt: number): number {
  return (2 * alphaS(kt) * colourFactor(parton)) / Math.PI;
}

/** q → qg with the gluon carrying x: P_gq(x) = C_F (1 + (1−x)²)/x. */
function pGq(x: number): number {
  return (C_F * (1 + (1 - x) * (1 - x))) / x;
}

/** g → gg: P_gg(x) = 2 C_A [x/(1−x) + (1−x)/x + x(1−x)]. */
function pGg(x: number): number {
  return 2 * C_A * (x / (1 - x) + (1 - x) / x + x * (1 - x));
}

/**
 * z-dependence of the hard-collinear density without α_s/π, z the softer fraction in (0, 1/2]:
 * quark z [P_gq(z) + P_gq(1−z)], gluon z [P_gg(z) + 2 n_f T_R (z² + (1−z)²)]. Tends to 2 C_i as z → 0.
 */
export function splittingWeight(parton: Parton, z: number): number {
  if (!(z > 0 && z <= 0.5)) {
    throw new RangeError(`splittingWeight: z = ${z} must be the softer momentum fraction, 0 < z <= 1/2`);
  }
  if (parton === 'quark') return z * (pGq(z) + pGq(1 - z));
  if (parton === 'gluon') return z * (pGg(z) + 2 * N_F * T_R * (z * z + (1 - z) * (1 - z)));
  throw unknownParton(parton);
}

/** Hard-collinear density ρ = (α_s(kt)/π) · splittingWeight(z) at fixed Δ; kt = z pt Δ in GeV. */
export function hardCollinearDensity(parton: Parton, z: number, kt: number): number {
  return (alphaS(kt) / Math.PI) * splittingWeight(parton, z);
}
