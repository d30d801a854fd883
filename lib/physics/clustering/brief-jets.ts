// The slot-level pieces every nearest-neighbour strategy shares: brief-jet slots (FastJet's name for the active
// jets of the bookkeeping: rapidity, azimuth, node), the momentum factor pt^{2p}, the (y, φ) distance and diJ,
// written as FastJet 3.4 writes them so that every distance is bit-identical to FastJet's (FastJet manual,
// arXiv:1111.6097; NN bookkeeping: "Dispelling the N³ myth for the kt jet-finder", arXiv:hep-ph/0512210).

import { TWO_PI } from '../fourvector';
import type { ClusterWorkspace } from './workspace';

const PI = Math.PI;

/** Slot s's momentum factor from node k: FastJet's jet_scale_for_algorithm, pt^{2p} with its safety limits. */
export function setMomentumFactor(ws: ClusterWorkspace, s: number, k: number, p: number): void {
  const kt2 = ws.kt2[k];
  ws.sMf[s] = p === 0 ? 1 : p > 0 ? kt2 : kt2 > 1e-300 ? 1 / kt2 : 1e300;
}

/**
 * Squared distance in (y, φ) with |Δφ| folded into [0, π], as FastJet's _bj_dist; the same bits whichever point
 * comes first (x − y is exactly −(y − x)).
 */
export function dist2(y1: number, f1: number, y2: number, f2: number): number {
  let dphi = Math.abs(f1 - f2);
  const deta = y1 - y2;
  if (dphi > PI) dphi = TWO_PI - dphi;
  return dphi * dphi + deta * deta;
}

/** Puts node k into brief-jet slot s (rapidity, azimuth, node). */
export function setSlot(ws: ClusterWorkspace, s: number, k: number): void {
  ws.sEta[s] = ws.rap[k];
  ws.sPhi[s] = ws.phi[k];
  ws.sNode[s] = k;
}

/** Slots 0..n−1 hold the input particles. */
export function loadSlots(ws: ClusterWorkspace, n: number): void {
  for (let i = 0; i < n; i++) setSlot(ws, i, i);
}

/** diJ of slot i from its NN (FastJet's _bj_diJ). */
export function setDiJ(ws: ClusterWorkspace, i: number): void {
  const sMf = ws.sMf;
  const nn = ws.sNN[i];
  let mf = sMf[i];
  if (nn >= 0 && sMf[nn] < mf) mf = sMf[nn];
  ws.diJ[i] = ws.sNND[i] * mf;
}
