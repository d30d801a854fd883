// Reverse nearest-neighbour lists of the tiled and grid strategies: for each slot, the slots that have it as
// NN, so that the jets to re-search after a merge are found without scanning all of them (the NN bookkeeping of
// "Dispelling the N³ myth for the kt jet-finder", arXiv:hep-ph/0512210).

import type { ClusterWorkspace } from './workspace';

/** Makes j slot i's NN in the reverse lists (j = −1: none) and in sNN. */
export function relinkNN(ws: ClusterWorkspace, i: number, j: number): void {
  const sNN = ws.sNN;
  const old = sNN[i];
  if (old === j) return;
  const rHead = ws.rHead, rNext = ws.rNext, rPrev = ws.rPrev;
  if (old >= 0) {
    const pv = rPrev[i], nx = rNext[i];
    if (pv >= 0) rNext[pv] = nx;
    else rHead[old] = nx;
    if (nx >= 0) rPrev[nx] = pv;
  }
  if (j >= 0) {
    const h = rHead[j];
    rPrev[i] = -1;
    rNext[i] = h;
    if (h >= 0) rPrev[h] = i;
    rHead[j] = i;
  }
  sNN[i] = j;
}

/**
 * Takes slots a and b (b = −1: none) out of the NN graph; the jets that had either as NN are left without NN
 * in ws.tmp[0..count), and the count is returned.
 */
export function detachPair(ws: ClusterWorkspace, a: number, b: number): number {
  const { sNN, rHead, rNext, tmp } = ws;
  relinkNN(ws, a, -1);
  if (b >= 0) relinkNN(ws, b, -1);
  let nt = 0;
  for (let j = rHead[a]; j >= 0; j = rNext[j]) tmp[nt++] = j;
  rHead[a] = -1;
  if (b >= 0) {
    for (let j = rHead[b]; j >= 0; j = rNext[j]) tmp[nt++] = j;
    rHead[b] = -1;
  }
  for (let q = 0; q < nt; q++) sNN[tmp[q]] = -1;
  return nt;
}
