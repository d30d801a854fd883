// The tiled strategy (generalised-kt jet finding from TILED_MIN_PARTICLES on): NN searches in the block of tiles
// around a jet, reverse-NN lists and a tournament tree for the smallest diJ. Sources: "Dispelling the N³ myth for
// the kt jet-finder", arXiv:hep-ph/0512210, and FastJet's N2Tiled / N2MinHeapTiled / lazy-tiling strategies
// (FastJet manual, arXiv:1111.6097 §3 and appendix).
//
// Tiles of side ≥ R/K (K = 1, 2 or 3 from the particle density, see TILE_DENSE) in (y, φ), φ periodic: a jet's
// neighbours within R lie at most K tiles away, in the (2K+1)² block around its tile. Three devices keep the work per
// step proportional to the local density rather than to the block population:
//  - NN searches visit the block's tiles ring by ring and skip a tile when the lower bound of the distance from
//    the jet to the tile's rectangle is not below the best distance found so far;
//  - reverse-NN lists (for each jet, the jets that have it as NN) give the jets to re-search after a merge
//    without scanning;
//  - each tile keeps an upper bound of its jets' NN distances, so that the check "is the new jet closer than
//    my current NN?" skips tiles that are too far from the new jet for any of their jets.
// The smallest diJ is kept in a tournament tree. Slots: the merged jet takes the lower of the two slots, the
// higher one dies, as in FastJet's tiled strategies.

import { TWO_PI } from '../fourvector';
import { loadSlots, setDiJ, setMomentumFactor, setSlot } from './brief-jets';
import { verifyState } from './nn-check';
import { recombine } from './recombination';
import { detachPair, relinkNN } from './reverse-nn';
import { resetTiles, tileEdges, tileInsert, tileOf, tileRemove } from './tiles';
import { treeBuild, treeFix } from './tournament';
import type { ClusterWorkspace } from './workspace';

const PI = Math.PI;

/** Particles per R² above which tiles of side R/2 (5×5 blocks) replace tiles of side R (3×3 blocks) (measured). */
const TILE_DENSE = 25;
/** Particles per R² above which tiles of side R/3 (7×7 blocks) are used (measured: large R on 10 000 particles). */
const TILE_DENSER = 150;

/** Sets the NN of slot i (j, squared distance d), keeping the reverse lists and the tile bound. */
function setNN(ws: ClusterWorkspace, i: number, j: number, d: number): void {
  relinkNN(ws, i, j);
  ws.sNND[i] = d;
  const t = ws.sTile[i];
  if (d > ws.tileMax[t]) ws.tileMax[t] = d;
}

/** diJ of slot i and the tournament tree update. */
function updateDiJ(ws: ClusterWorkspace, i: number): void {
  setDiJ(ws, i);
  treeFix(ws.tree, ws.diJ, i, ws.gP);
}

/** Takes slot i out of the tournament (diJ = ∞). */
function killSlot(ws: ClusterWorkspace, i: number): void {
  const diJ = ws.diJ, tree = ws.tree;
  diJ[i] = Infinity;
  treeFix(tree, diJ, i, ws.gP);
}

/**
 * Squared distance lower bounds from slot i to the rows (ws.lbY2[K+di]) and columns (ws.lbU2[K+dj]) of its
 * block; rows outside the grid get ∞. Returns i's tile.
 */
function blockBounds(ws: ClusterWorkspace, i: number): number {
  const K = ws.gK, nY = ws.gNY, wY = ws.gWY, wPhi = ws.gWPhi;
  const lbY2 = ws.lbY2, lbU2 = ws.lbU2;
  const t = tileEdges(ws, i, ws.sPhi);
  const iy = ws.tRow;
  const dyLo = ws.eYLo, dyHi = ws.eYHi, duLo = ws.eULo, duHi = ws.eUHi;
  lbY2[K] = 0;
  lbU2[K] = 0;
  for (let d = 1; d <= K; d++) {
    let up = (d - 1) * wY + dyHi, dn = (d - 1) * wY + dyLo;
    if (up < 0) up = 0;
    if (dn < 0) dn = 0;
    lbY2[K + d] = iy + d < nY ? up * up : Infinity;
    lbY2[K - d] = iy - d >= 0 ? dn * dn : Infinity;
    let r = (d - 1) * wPhi + duHi, l = (d - 1) * wPhi + duLo;
    if (r < 0) r = 0;
    if (l < 0) l = 0;
    lbU2[K + d] = r * r;
    lbU2[K - d] = l * l;
  }
  return t;
}

/** Nearest neighbour of slot i within R: block search, tiles skipped by their distance lower bound. */
function findNN(ws: ClusterWorkspace, i: number): void {
  const sEta = ws.sEta, sPhi = ws.sPhi, sNext = ws.sNext, tileHead = ws.tileHead;
  const offY = ws.offY, offU = ws.offU, nOff = ws.gNOff, K = ws.gK, nPhi = ws.gNPhi;
  const lbY2 = ws.lbY2, lbU2 = ws.lbU2;
  const t = blockBounds(ws, i);
  const iy = (t / nPhi) | 0;
  const iu = t - iy * nPhi;
  const y = sEta[i], f = sPhi[i];
  let best = ws.gR2, bi = -1;
  let ops = 0;
  for (let q = 0; q < nOff; q++) {
    const di = offY[q], dj = offU[q];
    if (lbY2[K + di] + lbU2[K + dj] >= best) continue;
    let col = iu + dj;
    if (col < 0) col += nPhi;
    else if (col >= nPhi) col -= nPhi;
    // tileNearest (tiles.ts) written out: this is the tiled strategy's hottest loop, and the call measured slower
    // here.
    for (let j = tileHead[(iy + di) * nPhi + col]; j >= 0; j = sNext[j]) {
      if (j === i) continue;
      ops++;
      let dphi = Math.abs(f - sPhi[j]);
      const deta = y - sEta[j];
      if (dphi > PI) dphi = TWO_PI - dphi;
      const dist = dphi * dphi + deta * deta;
      if (dist < best) {
        best = dist;
        bi = j;
      }
    }
  }
  ws.ops += ops;
  setNN(ws, i, bi, best);
}

/**
 * After the new jet has been put in slot b: finds its NN, and gives it as NN to the jets for which it is closer
 * than their current NN (tiles whose bound says none of their jets can be are skipped).
 */
function scanNewJet(ws: ClusterWorkspace, b: number): void {
  const sEta = ws.sEta, sPhi = ws.sPhi, sNND = ws.sNND, sNext = ws.sNext, tileHead = ws.tileHead, tileMax = ws.tileMax;
  const offY = ws.offY, offU = ws.offU, nOff = ws.gNOff, K = ws.gK, nPhi = ws.gNPhi;
  const lbY2 = ws.lbY2, lbU2 = ws.lbU2;
  const t = blockBounds(ws, b);
  const iy = (t / nPhi) | 0;
  const iu = t - iy * nPhi;
  const y = sEta[b], f = sPhi[b];
  let best = ws.gR2, bi = -1;
  let ops = 0;
  for (let q = 0; q < nOff; q++) {
    const di = offY[q], dj = offU[q];
    const lb2 = lbY2[K + di] + lbU2[K + dj];
    if (lb2 === Infinity) continue;
    let col = iu + dj;
    if (col < 0) col += nPhi;
    else if (col >= nPhi) col -= nPhi;
    const tt = (iy + di) * nPhi + col;
    if (lb2 >= best && lb2 >= tileMax[tt]) continue;
    let mx = 0;
    for (let i = tileHead[tt]; i >= 0; i = sNext[i]) {
      if (i === b) continue;
      ops++;
      let dphi = Math.abs(sPhi[i] - f);
      const deta = sEta[i] - y;
      if (dphi > PI) dphi = TWO_PI - dphi;
      const dist = dphi * dphi + deta * deta;
      if (dist < sNND[i]) {
        setNN(ws, i, b, dist);
        updateDiJ(ws, i);
      }
      if (dist < best) {
        best = dist;
        bi = i;
      }
      const d = sNND[i];
      if (d > mx) mx = d;
    }
    // Every jet of the tile was seen: its bound becomes exact (b's own NN distance is added below).
    tileMax[tt] = mx;
  }
  ws.ops += ops;
  setNN(ws, b, bi, best);
  updateDiJ(ws, b);
}

export function clusterTiled(ws: ClusterWorkspace, R: number, R2: number, p: number, track: boolean): void {
  const n = ws.n;
  const { sPhi, sNND, sNN, sNode, diJ, tree, rap, rHead } = ws;

  let yMin = Infinity, yMax = -Infinity;
  for (let i = 0; i < n; i++) {
    const y = rap[i];
    if (y < yMin) yMin = y;
    if (y > yMax) yMax = y;
  }
  // Geometry: tiles of side ≥ R/K, K rings; nPhi ≥ 2K+1 so that the block's φ columns are distinct.
  // Measured: R-sized tiles (K = 1) are best up to about 25 particles per R² on average, R/2 (K = 2) above,
  // R/3 (K = 3) from about 150.
  const side = R * (1 + 1e-6);
  const density = (n * R * R) / ((yMax - yMin + R) * TWO_PI);
  let K = ws.tileRings > 0 ? ws.tileRings : density > TILE_DENSER ? 3 : density > TILE_DENSE ? 2 : 1;
  let nPhi = Math.floor((TWO_PI * K) / side);
  while (K > 1 && nPhi < 2 * K + 1) {
    K--;
    nPhi = Math.floor((TWO_PI * K) / side);
  }
  let nY = Math.floor(((yMax - yMin) * K) / side);
  // Bound the tile count by the particle count (a far-out particle must not create a huge grid).
  const maxY = Math.max(1, Math.floor((4 * n) / nPhi));
  if (nY > maxY) nY = maxY;
  if (nY < 1) nY = 1;
  resetTiles(ws, nY * nPhi);
  ws.gNY = nY;
  ws.gNPhi = nPhi;
  ws.gWY = nY === 1 ? side / K : (yMax - yMin) / nY;
  ws.gWPhi = TWO_PI / nPhi;
  ws.gYMin = yMin;
  ws.gUMin = 0;
  ws.gR2 = R2;
  // Block offsets ordered by ring (own tile first), so that searches shrink their radius early.
  let nOff = 0;
  for (let r = 0; r <= K; r++) {
    for (let di = -r; di <= r; di++) {
      for (let dj = -r; dj <= r; dj++) {
        if (Math.max(Math.abs(di), Math.abs(dj)) !== r) continue;
        ws.offY[nOff] = di;
        ws.offU[nOff] = dj;
        nOff++;
      }
    }
  }
  ws.gNOff = nOff;
  ws.gK = K;

  loadSlots(ws, n);
  for (let i = 0; i < n; i++) {
    setMomentumFactor(ws, i, i, p);
    sNN[i] = -1;
    sNND[i] = R2;
    rHead[i] = -1;
  }
  for (let i = n - 1; i >= 0; i--) tileInsert(ws, i, tileOf(ws, i, sPhi));
  for (let i = 0; i < n; i++) findNN(ws, i);
  for (let i = 0; i < n; i++) setDiJ(ws, i);
  treeBuild(ws, diJ, n);

  let active = n;
  while (active > 0) {
    let a = tree[1];
    let b = sNN[a];
    if (b >= 0 && a < b) {
      const t = a;
      a = b;
      b = t;
    }
    const hasB = b >= 0;
    // Detach a and b from the NN graph; the jets that had either as NN are collected in tmp.
    const nt = detachPair(ws, a, b);
    tileRemove(ws, a);
    killSlot(ws, a);
    active--;
    if (hasB) {
      const k = recombine(ws, sNode[a], sNode[b], track);
      tileRemove(ws, b);
      setSlot(ws, b, k);
      setMomentumFactor(ws, b, k, p);
      sNND[b] = R2;
      tileInsert(ws, b, tileOf(ws, b, sPhi));
    } else {
      ws.jets[ws.nJets++] = sNode[a];
    }

    // Jets that lost their NN search again (they may find the new jet).
    for (let q = 0; q < nt; q++) {
      const i = ws.tmp[q];
      findNN(ws, i);
      updateDiJ(ws, i);
    }
    if (hasB) scanNewJet(ws, b);
    if (ws.verify) verifyState(ws, n, (i) => ws.diJ[i] !== Infinity, R2, false);
  }
}
