// One-loop running of the strong coupling and the SU(3) constants of PHYSICS.md ("Leading-order expectation").

/** α_s(M_Z): Particle Data Group world average, Review of Particle Physics (2024). */
export const ALPHA_S_MZ = 0.118;
/** Z boson mass in GeV, the reference scale of ALPHA_S_MZ (PHYSICS.md). */
export const M_Z = 91.1876;

/** SU(3) colour factors. */
export const C_F = 4 / 3;
export const C_A = 3;
export const T_R = 1 / 2;
/** Active quark flavours in the running and in g → qq̄ (PHYSICS.md). */
export const N_F = 5;

/** One-loop β-function coefficient b0 = (11 C_A − 2 n_f)/(12π). */
export const B0 = (11 * C_A - 2 * N_F) / (12 * Math.PI);

/**
 * Below this scale (GeV) the perturbative expectation is not meaningful. Common practice, no single source.
 * The curves stop here rather than freeze: alphaS refuses smaller scales, so an overlay shows the boundary as
 * the end of the curve instead of drawing a made-up plateau.
 */
export const PERTURBATIVE_KT_MIN = 1;

/** Whether the leading-order expectation is defined at this scale (GeV). */
export function isPerturbative(k: number): boolean {
  return Number.isFinite(k) && k >= PERTURBATIVE_KT_MIN;
}

/** One-loop α_s(k) = α_s(M_Z) / (1 + 2 b0 α_s(M_Z) ln(k/M_Z)), k in GeV, k ≥ PERTURBATIVE_KT_MIN. */
export function alphaS(k: number): number {
  if (!isPerturbative(k)) {
    throw new RangeError(
      `alphaS: scale ${k} GeV is outside the perturbative region (needs a finite k >= ${PERTURBATIVE_KT_MIN} GeV)`,
    );
  }
  return ALPHA_S_MZ / (1 + 2 * B0 * ALPHA_S_MZ * Math.log(k / M_Z));
}
