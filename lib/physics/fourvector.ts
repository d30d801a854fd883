// Four-vector conventions of PHYSICS.md: rapidity (not pseudorapidity), azimuth in [0, 2π),
// signed mass for negative m² from rounding.

export const TWO_PI = 2 * Math.PI;

export type EnergyUnit = 'GeV' | 'MeV' | 'TeV';
export type MomentumConvention = 'px,py,pz,E' | 'pt,y,phi,m';

/** Factor that turns a value in `unit` into GeV. */
export function toGeV(unit: EnergyUnit): number {
  return unit === 'MeV' ? 1e-3 : unit === 'TeV' ? 1e3 : 1;
}

export function pt(px: number, py: number): number {
  return Math.hypot(px, py);
}

/** Rapidity y = ½ ln((E+pz)/(E−pz)); callers must have checked E > |pz|. */
export function rapidity(pz: number, E: number): number {
  return 0.5 * Math.log((E + pz) / (E - pz));
}

/** Azimuth atan2(py, px) mapped to [0, 2π). */
export function azimuth(px: number, py: number): number {
  const phi = Math.atan2(py, px);
  return phi < 0 ? phi + TWO_PI : phi >= TWO_PI ? phi - TWO_PI : phi;
}

/** m = sqrt(E² − p²); a negative m² (rounding) is reported as −sqrt(|m²|). */
export function mass(px: number, py: number, pz: number, E: number): number {
  const m2 = E * E - px * px - py * py - pz * pz;
  return m2 >= 0 ? Math.sqrt(m2) : -Math.sqrt(-m2);
}

/** Fold an azimuth difference into [0, π]. */
export function deltaPhiAbs(phi1: number, phi2: number): number {
  let d = Math.abs(phi1 - phi2);
  if (d > Math.PI) d = TWO_PI - d;
  return d;
}

/** Fold an azimuth difference into (−π, π]. */
export function deltaPhiSigned(phiTo: number, phiFrom: number): number {
  let d = phiTo - phiFrom;
  while (d > Math.PI) d -= TWO_PI;
  while (d <= -Math.PI) d += TWO_PI;
  return d;
}

/** Writes (px, py, pz, E) of a (pt, y, phi, m) particle into out[at..at+3]. */
export function fromPtYPhiM(ptv: number, y: number, phi: number, m: number, out: Float64Array, at: number): void {
  const mt = Math.sqrt(ptv * ptv + m * m);
  out[at] = ptv * Math.cos(phi);
  out[at + 1] = ptv * Math.sin(phi);
  out[at + 2] = mt * Math.sinh(y);
  out[at + 3] = mt * Math.cosh(y);
}

/** Relative tolerance for E < |p| (PHYSICS.md: invalid beyond 1e-6 relative). */
export const MASS_SHELL_TOLERANCE = 1e-6;

/**
 * Why a particle (px, py, pz, E in GeV) is not acceptable input, or null when it is.
 * The reader adds the record line and particle index to the message.
 */
export function particleProblem(px: number, py: number, pz: number, E: number): string | null {
  if (!Number.isFinite(px) || !Number.isFinite(py) || !Number.isFinite(pz) || !Number.isFinite(E)) {
    return 'momentum components must be finite numbers (NaN or Infinity found)';
  }
  if (E < 0) return `negative energy E = ${E}`;
  const p = Math.sqrt(px * px + py * py + pz * pz);
  if (E < p * (1 - MASS_SHELL_TOLERANCE)) return `energy below momentum: E = ${E} < |p| = ${p}`;
  if (E <= Math.abs(pz)) return `no finite rapidity: E = ${E} <= |pz| = ${Math.abs(pz)} (particle along the beam)`;
  return null;
}
