// One splitting of an e+e- jet's angular-ordered tree (PHYSICS.md "Lepton-collider (e+e-) events", declustering;
// the plane of the primary-emission-plane paper, JHEP 12 (2018) 064, arXiv:1807.04758, in energy and angle).
// For j → a, b with E_a ≥ E_b:
//   θ = θ_ab (opening angle), kt = E_b sin θ, z = E_b / (E_a + E_b), m = m_{a+b}, κ = z θ,
//   ψ = atan2(−p_b·ê_θ(a), p_b·ê_φ(a)) with ê_θ, ê_φ the polar and azimuthal unit vectors at a's direction;
// written in the slots of the hadron-collider splitting (types.ts): ln(1/θ) in lnInvDelta, θ in delta.

import type { ClusterWorkspace } from './clustering';
import { putSplitting } from './decluster';

/**
 * Writes the e+e- splitting of node k at out[at..) and returns the harder branch a: the larger energy; on an
 * exact tie the order FastJet's has_parents gives (larger pt², then the earlier node).
 */
export function writeSplittingEe(ws: ClusterWorkspace, k: number, generation: number, out: Float64Array, at: number): number {
  let a = ws.parent1[k];
  let b = ws.parent2[k];
  if (ws.kt2[a] < ws.kt2[b]) {
    const t = a;
    a = b;
    b = t;
  }
  if (ws.E[a] < ws.E[b]) {
    const t = a;
    a = b;
    b = t;
  }
  const ax = ws.px[a], ay = ws.py[a], az = ws.pz[a];
  const bx = ws.px[b], by = ws.py[b], bz = ws.pz[b];
  const cx = ay * bz - az * by;
  const cy = az * bx - ax * bz;
  const cz = ax * by - ay * bx;
  const cross = Math.sqrt(cx * cx + cy * cy + cz * cz);
  const dot = ax * bx + ay * by + az * bz;
  const theta = Math.atan2(cross, dot);
  const magA = Math.sqrt(ax * ax + ay * ay + az * az);
  const magB = Math.sqrt(bx * bx + by * by + bz * bz);
  const eA = ws.E[a], eB = ws.E[b];
  const z = eB / (eA + eB);
  const kt = eB * (cross / (magA * magB));
  // ψ: b's direction around a in a's (ê_θ, ê_φ) frame; a along the beam axis takes φ_a = 0.
  const ptA = Math.sqrt(ws.kt2[a]);
  const cosPhi = ptA > 0 ? ax / ptA : 1;
  const sinPhi = ptA > 0 ? ay / ptA : 0;
  const cosTheta = az / magA;
  const sinTheta = ptA / magA;
  const alongTheta = cosTheta * (cosPhi * bx + sinPhi * by) - sinTheta * bz;
  const alongPhi = -sinPhi * bx + cosPhi * by;
  putSplitting(ws, k, theta, kt, z, Math.atan2(-alongTheta, alongPhi), generation, out, at);
  return a;
}
