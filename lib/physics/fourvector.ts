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

/**
 * Azimuth atan2(py, px) mapped to [0, 2π). Zero pt gives 0 (FastJet's convention; atan2(0, −0) would be π).
 * The two checks are sequential on purpose: atan2 = −1e−17 becomes 2π − 1e−17, which rounds to exactly 2π,
 * and must then wrap to 0 (as in FastJet's PseudoJet::_set_rap_phi).
 */
export function azimuth(px: number, py: number): number {
  if (px === 0 && py === 0) return 0;
  let phi = Math.atan2(py, px);
  if (phi < 0) phi += TWO_PI;
  if (phi >= TWO_PI) phi -= TWO_PI;
  return phi;
}

/** FastJet's cap for the rapidity of a zero-pt massless momentum (PseudoJet.hh, MaxRap). */
export const FJ_MAX_RAP = 1e5;

/**
 * Rapidity computed exactly the way FastJet 3.4 does (PseudoJet::_set_rap_phi), which is the same quantity as
 * `rapidity` but less sensitive to rounding when E ≈ |pz|: y = ½ ln((pt² + max(m², 0)) / (E + |pz|)²), sign of pz.
 * The clustering uses this form so that distances agree with FastJet to the last bits.
 */
export function rapidityFJ(px: number, py: number, pz: number, E: number): number {
  const kt2 = px * px + py * py;
  const apz = Math.abs(pz);
  if (E === apz && kt2 === 0) return pz >= 0 ? FJ_MAX_RAP + apz : -(FJ_MAX_RAP + apz);
  const m2 = (E + pz) * (E - pz) - kt2;
  const ePlus = E + apz;
  const y = 0.5 * Math.log((kt2 + (m2 > 0 ? m2 : 0)) / (ePlus * ePlus));
  return pz > 0 ? -y : y;
}

/** m² in FastJet's form (E+pz)(E−pz) − pt², which rounds differently from E² − p². */
export function mass2FJ(px: number, py: number, pz: number, E: number): number {
  return (E + pz) * (E - pz) - (px * px + py * py);
}

/** Signed mass from FastJet's m² (−sqrt(|m²|) when m² < 0, as `mass`). */
export function massFJ(px: number, py: number, pz: number, E: number): number {
  const m2 = (E + pz) * (E - pz) - (px * px + py * py);
  return m2 >= 0 ? Math.sqrt(m2) : -Math.sqrt(-m2);
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
