// The (y, u) tile grid shared by the tiled strategy (tiled.ts, u = φ) and the C/A grid (grid-ca.ts, u = folded
// φ): which tile a slot is in, the tiles' jet lists, a slot's distances to its tile's sides, and a search along
// one tile's list. Sources: the tiling of "Dispelling the N³ myth for the kt jet-finder", arXiv:hep-ph/0512210,
// and FastJet's tiled strategies (FastJet manual, arXiv:1111.6097).
//
// The tiled and grid strategies' helpers are module-level functions (closures re-created per call would defeat
// V8's inlining); the grid geometry lives in the workspace (g* fields). Both grids have rows in y from gYMin and
// columns in u from gUMin: u = φ and gUMin = 0 for the tiled strategy, the folded φ for the grid one.

import { dist2 } from './brief-jets';
import type { ClusterWorkspace } from './workspace';

/** Absolute margin (in y/φ units) that keeps tile distance bounds below the true distance despite rounding. */
const BOUND_MARGIN = 1e-12;

/** Tile of slot s (at sEta[s], u[s]; u is sPhi or sU), clamped to the grid. */
export function tileOf(ws: ClusterWorkspace, s: number, u: Float64Array): number {
  const nY = ws.gNY, nU = ws.gNPhi;
  const y = ws.sEta[s], x = u[s];
  let iy = Math.floor((y - ws.gYMin) / ws.gWY);
  if (!(iy >= 0)) iy = 0;
  else if (iy >= nY) iy = nY - 1;
  let iu = Math.floor((x - ws.gUMin) / ws.gWPhi);
  if (!(iu >= 0)) iu = 0;
  else if (iu >= nU) iu = nU - 1;
  return iy * nU + iu;
}

/** Empties the first nTiles tiles (lists and bounds), growing the tile arrays when needed. */
export function resetTiles(ws: ClusterWorkspace, nTiles: number): void {
  if (ws.tileHead.length < nTiles) {
    const c = Math.max(nTiles, 2 * ws.tileHead.length);
    ws.tileHead = new Int32Array(c);
    ws.tileMax = new Float64Array(c);
  }
  ws.tileHead.fill(-1, 0, nTiles);
  ws.tileMax.fill(0, 0, nTiles);
}

export function tileInsert(ws: ClusterWorkspace, s: number, t: number): void {
  const sNext = ws.sNext, sPrev = ws.sPrev, tileHead = ws.tileHead;
  ws.sTile[s] = t;
  const h = tileHead[t];
  sPrev[s] = -1;
  sNext[s] = h;
  if (h >= 0) sPrev[h] = s;
  tileHead[t] = s;
}

export function tileRemove(ws: ClusterWorkspace, s: number): void {
  const sNext = ws.sNext, sPrev = ws.sPrev;
  const pv = sPrev[s], nx = sNext[s];
  if (pv >= 0) sNext[pv] = nx;
  else ws.tileHead[ws.sTile[s]] = nx;
  if (nx >= 0) sPrev[nx] = pv;
}

/**
 * Distances from slot i to the four sides of its tile, less BOUND_MARGIN, left in ws.eYLo, eYHi, eULo, eUHi
 * (u[i] is the column coordinate: sPhi or sU); the tile's row and column in ws.tRow, tCol. Returns the tile.
 */
export function tileEdges(ws: ClusterWorkspace, i: number, u: Float64Array): number {
  const nU = ws.gNPhi, wY = ws.gWY, wU = ws.gWPhi;
  const y = ws.sEta[i], x = u[i];
  const t = ws.sTile[i];
  const iy = (t / nU) | 0;
  const iu = t - iy * nU;
  const yLo = ws.gYMin + iy * wY;
  ws.eYLo = y - yLo - BOUND_MARGIN;
  ws.eYHi = yLo + wY - y - BOUND_MARGIN;
  const uLo = ws.gUMin + iu * wU;
  ws.eULo = x - uLo - BOUND_MARGIN;
  ws.eUHi = uLo + wU - x - BOUND_MARGIN;
  ws.tRow = iy;
  ws.tCol = iu;
  return t;
}

/**
 * NN search of slot i in the tile list that starts at j: a jet closer than ws.gBestD becomes the best (ws.gBest,
 * ws.gBestD).
 */
export function tileNearest(ws: ClusterWorkspace, j: number, i: number): void {
  const sEta = ws.sEta, sPhi = ws.sPhi, sNext = ws.sNext;
  const y = sEta[i], f = sPhi[i];
  let best = ws.gBestD, bi = ws.gBest;
  let ops = 0;
  for (; j >= 0; j = sNext[j]) {
    if (j === i) continue;
    ops++;
    const dist = dist2(y, f, sEta[j], sPhi[j]);
    if (dist < best) {
      best = dist;
      bi = j;
    }
  }
  ws.gBestD = best;
  ws.gBest = bi;
  ws.ops += ops;
}
