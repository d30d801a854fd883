// Tournament tree (a binary tree of winners over the slots) that keeps the smallest diJ of the tiled and grid
// strategies in O(log N) per change instead of a linear scan, in the spirit of FastJet's N2MinHeapTiled strategy
// (FastJet manual, arXiv:1111.6097). Ties go to the lower slot.

import type { ClusterWorkspace } from './workspace';

/** Builds the tournament tree over key[0..n) (padded with ∞ to a power of two). */
export function treeBuild(ws: ClusterWorkspace, key: Float64Array, n: number): void {
  const tree = ws.tree;
  let P = 1;
  while (P < n) P <<= 1;
  ws.gP = P;
  for (let i = n; i < P; i++) key[i] = Infinity;
  for (let i = 0; i < P; i++) tree[P + i] = i;
  for (let t = P - 1; t >= 1; t--) {
    const l = tree[2 * t], r = tree[2 * t + 1];
    tree[t] = key[r] < key[l] ? r : l;
  }
}

/**
 * Restores the tournament tree above leaf i after key[i] changed. Ties go to the left (lower slot). The walk
 * stops where the winner is unchanged and is not i (nothing above can change then).
 */
export function treeFix(tree: Int32Array, key: Float64Array, i: number, P: number): void {
  let t = (i + P) >> 1;
  while (t >= 1) {
    const l = tree[2 * t], r = tree[2 * t + 1];
    const w = key[r] < key[l] ? r : l;
    const old = tree[t];
    if (w === old && old !== i) return;
    tree[t] = w;
    t >>= 1;
  }
}
