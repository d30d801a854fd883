// The grid strategy for Cambridge/Aachen with an infinite radius (the re-clustering of a large jet into one tree,
// from GRID_MIN_PARTICLES on): a (y, φ) grid over the jet, rebuilt coarser as the number of jets falls. Sources:
// the tiling and NN ideas of "Dispelling the N³ myth for the kt jet-finder", arXiv:hep-ph/0512210, and FastJet's
// tiled strategies (FastJet manual, arXiv:1111.6097).
//
// With p = 0 all momentum factors are 1, so diJ = ΔR² to the NN and the clustering merges, at each step, the
// geometrically closest pair. The jet's constituents occupy a compact (y, φ) region, tiled here by a grid in
// (y, u = φ − φ_ref folded into (−π, π]) (valid while the region is narrower than π in φ: |Δu| is then the
// folded Δφ; GRID_MAX_SPREAD keeps a margin below π, and a merged jet's azimuth stays between its parents'); tiles
// hold GRID_OCC jets on average and the grid is rebuilt, coarser, each time the number of jets has fallen by
// GRID_REBUILD. NN searches go ring by ring and stop when the ring's distance lower bound exceeds
// the best distance. A jet is "near" when its NN is closer than GRID_NEAR tile sides; the tiles keep an upper
// bound of their near jets' NN distances, and the other ("far") jets are kept in a list, so that the jets for
// which a new jet becomes the NN are found among the near tiles around it and in the far list.

import { TWO_PI } from '../fourvector';
import { dist2, loadSlots, setSlot } from './brief-jets';
import { verifyState } from './nn-check';
import { recombine } from './recombination';
import { detachPair, relinkNN } from './reverse-nn';
import { resetTiles, tileEdges, tileInsert, tileNearest, tileOf, tileRemove } from './tiles';
import { treeBuild, treeFix } from './tournament';
import type { ClusterWorkspace } from './workspace';

const PI = Math.PI;

const GRID_OCC = 2;
/** Widest spread in φ the grid takes (wide jets, such as R = 1.2 ones, up to 2.8 rad); wider ones use the plain loop. */
const GRID_MAX_SPREAD = 0.9 * PI;
const GRID_NEAR = 1;
const GRID_REBUILD = 4;

function foldU(phi: number, ref: number): number {
  let d = phi - ref;
  if (d > PI) d -= TWO_PI;
  else if (d <= -PI) d += TWO_PI;
  return d;
}

function farAdd(ws: ClusterWorkspace, i: number): void {
  ws.farPos[i] = ws.nFar;
  ws.farList[ws.nFar++] = i;
}

function farRemove(ws: ClusterWorkspace, i: number): void {
  const pos = ws.farPos[i];
  const last = ws.farList[--ws.nFar];
  ws.farList[pos] = last;
  ws.farPos[last] = pos;
  ws.farPos[i] = -1;
}

/** Sets the NN of slot i (grid strategy): reverse lists, near/far class, tile bound. */
function gridSetNN(ws: ClusterWorkspace, i: number, j: number, d: number): void {
  relinkNN(ws, i, j);
  ws.sNND[i] = d;
  if (d < ws.gR2) {
    if (ws.farPos[i] >= 0) farRemove(ws, i);
    const t = ws.sTile[i];
    if (d > ws.tileMax[t]) ws.tileMax[t] = d;
  } else if (ws.farPos[i] < 0) {
    farAdd(ws, i);
  }
}

/** Tournament update with key sNND (diJ of C/A). */
function gridTreeUpdate(ws: ClusterWorkspace, i: number): void {
  treeFix(ws.tree, ws.sNND, i, ws.gP);
}

/**
 * The new jet in slot b is offered to slot j as NN (taken when closer than j's NN), and j to b's NN search
 * (ws.gBest, ws.gBestD).
 */
function gridOffer(ws: ClusterWorkspace, j: number, b: number): void {
  const dist = dist2(ws.sEta[j], ws.sPhi[j], ws.sEta[b], ws.sPhi[b]);
  if (dist < ws.sNND[j]) {
    gridSetNN(ws, j, b, dist);
    gridTreeUpdate(ws, j);
  }
  if (dist < ws.gBestD) {
    ws.gBestD = dist;
    ws.gBest = j;
  }
}

/** (Re)builds the grid over the alive slots; the NN information is kept, the near/far classes recomputed. */
function gridBuild(ws: ClusterWorkspace, n: number, active: number): void {
  const { sEta, sU, alive, sNN, sNND, farPos } = ws;
  let yMin = Infinity, yMax = -Infinity, uMin = Infinity, uMax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (!alive[i]) continue;
    const y = sEta[i], u = sU[i];
    if (y < yMin) yMin = y;
    if (y > yMax) yMax = y;
    if (u < uMin) uMin = u;
    if (u > uMax) uMax = u;
  }
  const T = Math.max(1, Math.floor(active / GRID_OCC));
  const yR = yMax - yMin, uR = uMax - uMin;
  let nY = 1, nU = 1;
  if (yR > 0 && uR > 0) {
    const w = Math.sqrt((yR * uR) / T);
    nY = Math.min(T, Math.max(1, Math.round(yR / w)));
    nU = Math.min(Math.max(1, Math.floor((2 * T) / nY)), Math.max(1, Math.round(uR / w)));
  } else if (yR > 0) {
    nY = T;
  } else if (uR > 0) {
    nU = T;
  }
  resetTiles(ws, nY * nU);
  ws.gNY = nY;
  ws.gNPhi = nU;
  ws.gYMin = yMin;
  ws.gUMin = uMin;
  ws.gWY = nY > 1 ? yR / nY : 1;
  ws.gWPhi = nU > 1 ? uR / nU : 1;
  const wMin = nY > 1 && nU > 1 ? Math.min(ws.gWY, ws.gWPhi) : nY > 1 ? ws.gWY : nU > 1 ? ws.gWPhi : Infinity;
  ws.gWMin = wMin;
  const rs = GRID_NEAR * wMin;
  ws.gR2 = rs * rs;
  ws.gBuiltActive = active;
  ws.nFar = 0;
  for (let i = n - 1; i >= 0; i--) {
    if (!alive[i]) continue;
    tileInsert(ws, i, tileOf(ws, i, sU));
    farPos[i] = -1;
  }
  for (let i = 0; i < n; i++) {
    if (!alive[i]) continue;
    const d = sNND[i];
    if (sNN[i] >= 0 && d < ws.gR2) {
      const t = ws.sTile[i];
      if (d > ws.tileMax[t]) ws.tileMax[t] = d;
    } else {
      farAdd(ws, i);
    }
  }
}

/**
 * Ring search around slot i for its nearest jet (ws.gBest, and ws.gBestD: ∞ when none); with `reverse`, also
 * gives i as NN to the near jets for which it is closer than their NN (rings ≤ GRID_NEAR, tiles pruned by their
 * bound).
 */
function gridSearch(ws: ClusterWorkspace, i: number, reverse: boolean): void {
  const { sNND, sNext, tileHead, tileMax, farPos } = ws;
  const nY = ws.gNY, nU = ws.gNPhi, wY = ws.gWY, wU = ws.gWPhi, wMin = ws.gWMin;
  tileEdges(ws, i, ws.sU);
  const iy = ws.tRow, iu = ws.tCol;
  const dyLo = ws.eYLo, dyHi = ws.eYHi, duLo = ws.eULo, duHi = ws.eUHi;
  let edge = Infinity;
  if (nY > 1) edge = dyLo < dyHi ? dyLo : dyHi;
  if (nU > 1) {
    if (duLo < edge) edge = duLo;
    if (duHi < edge) edge = duHi;
  }
  if (edge < 0) edge = 0;
  const maxR = nY > nU ? nY : nU;
  ws.gBestD = Infinity;
  ws.gBest = -1;
  let ops = 0;
  for (let r = 0; r < maxR; r++) {
    if (r > 0) {
      const rlb = (r - 1) * wMin + edge;
      const rlb2 = rlb * rlb;
      if (rlb2 >= ws.gBestD && (!reverse || r > GRID_NEAR)) break;
    }
    const rev = reverse && r <= GRID_NEAR;
    const r0 = iy - r < 0 ? 0 : iy - r, r1 = iy + r >= nY ? nY - 1 : iy + r;
    for (let row = r0; row <= r1; row++) {
      const di = row - iy;
      const fullRow = di === -r || di === r;
      const c0 = iu - r < 0 ? 0 : iu - r, c1 = iu + r >= nU ? nU - 1 : iu + r;
      let lbY = di > 0 ? (di - 1) * wY + dyHi : di < 0 ? (-di - 1) * wY + dyLo : 0;
      if (lbY < 0) lbY = 0;
      const lbY2 = lbY * lbY;
      for (let col = c0; col <= c1; col++) {
        const dj = col - iu;
        if (!fullRow && dj !== -r && dj !== r) {
          // Interior of the ring: jump to its right edge.
          if (dj < r) col = iu + r - 1;
          continue;
        }
        let lbU = dj > 0 ? (dj - 1) * wU + duHi : dj < 0 ? (-dj - 1) * wU + duLo : 0;
        if (lbU < 0) lbU = 0;
        const lb2 = lbY2 + lbU * lbU;
        const tt = row * nU + col;
        if (lb2 >= ws.gBestD && (!rev || lb2 >= tileMax[tt])) continue;
        if (!rev) {
          tileNearest(ws, tileHead[tt], i);
          continue;
        }
        let mx = 0;
        for (let j = tileHead[tt]; j >= 0; j = sNext[j]) {
          if (j === i) continue;
          ops++;
          gridOffer(ws, j, i);
          if (farPos[j] < 0) {
            const d = sNND[j];
            if (d > mx) mx = d;
          }
        }
        tileMax[tt] = mx;
      }
    }
  }
  ws.ops += ops;
}

/**
 * C/A with an infinite radius on the particles loaded in ws, grid strategy. Returns false (having done nothing)
 * when the particles are spread over GRID_MAX_SPREAD or more in φ (the plain strategy must then be used).
 */
export function clusterGridCA(ws: ClusterWorkspace, track: boolean): boolean {
  const n = ws.n;
  const { sU, sNND, sNN, sNode, tree, phi, rHead, alive } = ws;
  const ref = phi[0];
  let uMin = Infinity, uMax = -Infinity;
  for (let i = 0; i < n; i++) {
    const u = foldU(phi[i], ref);
    if (u < uMin) uMin = u;
    if (u > uMax) uMax = u;
    sU[i] = u;
  }
  if (!(uMax - uMin < GRID_MAX_SPREAD)) return false;
  loadSlots(ws, n);
  for (let i = 0; i < n; i++) {
    sNN[i] = -1;
    sNND[i] = Infinity;
    rHead[i] = -1;
    alive[i] = 1;
  }
  gridBuild(ws, n, n);
  for (let i = 0; i < n; i++) {
    gridSearch(ws, i, false);
    gridSetNN(ws, i, ws.gBest, ws.gBestD);
  }
  treeBuild(ws, sNND, n);

  let active = n;
  let last = 0;
  while (active > 1) {
    let a = tree[1];
    let b = sNN[a];
    if (a < b) {
      const t = a;
      a = b;
      b = t;
    }
    const nt = detachPair(ws, a, b);
    if (ws.farPos[a] >= 0) farRemove(ws, a);
    if (ws.farPos[b] >= 0) farRemove(ws, b);
    tileRemove(ws, a);
    tileRemove(ws, b);
    alive[a] = 0;
    sNND[a] = Infinity;
    gridTreeUpdate(ws, a);
    const k = recombine(ws, sNode[a], sNode[b], track);
    setSlot(ws, b, k);
    sU[b] = foldU(phi[k], ref);
    sNND[b] = Infinity;
    last = b;
    active--;
    if (active === 1) break;
    if (active * GRID_REBUILD <= ws.gBuiltActive && active >= GRID_OCC * 4) {
      gridBuild(ws, n, active);
    } else {
      tileInsert(ws, b, tileOf(ws, b, sU));
      farAdd(ws, b);
    }
    for (let q = 0; q < nt; q++) {
      const i = ws.tmp[q];
      gridSearch(ws, i, false);
      gridSetNN(ws, i, ws.gBest, ws.gBestD);
      gridTreeUpdate(ws, i);
    }
    // The new jet: near jets around it and the far list may take it as NN; its own NN.
    gridSearch(ws, b, true);
    const farList = ws.farList;
    for (let q = ws.nFar - 1; q >= 0; q--) {
      const j = farList[q];
      if (j !== b) gridOffer(ws, j, b);
    }
    ws.ops += ws.nFar;
    gridSetNN(ws, b, ws.gBest, ws.gBestD);
    gridTreeUpdate(ws, b);
    if (ws.verify) verifyState(ws, n, (i) => alive[i] === 1, Infinity, true);
  }
  ws.jets[0] = sNode[last];
  ws.nJets = 1;
  return true;
}
