// The e+e- Cambridge algorithm ("Better jet clustering algorithms", JHEP 08 (1997) 001, arXiv:hep-ph/9707323;
// PHYSICS.md "Lepton-collider (e+e-) events"): pairs are taken in order of the angular variable
// v_ij = 1 − cos θ_ij (smallest first); a pair merges (E-scheme) when its Durham resolution
// y_ij = 2 min(E_i², E_j²) v_ij / E_vis² is below y_cut, otherwise the softer of the two is frozen as a jet.
// The last pseudojet left is a jet. With y_cut = ∞ nothing is frozen: every particle ends in one angular-ordered
// tree, the re-clustering that e+e- declustering undoes.
//
// The bookkeeping follows FastJet 3.4's EECambridgePlugin on its generic nearest-neighbour helper NNH (FastJet
// manual arXiv:1111.6097), so that the order of steps, the history and ties agree with that reference.

import { recombine } from './recombination';
import type { ClusterWorkspace } from './workspace';

let nx = new Float64Array(0);
let ny = new Float64Array(0);
let nz = new Float64Array(0);
let nnDist = new Float64Array(0);
let nnSlot = new Int32Array(0);
let node = new Int32Array(0);
let whereIs = new Int32Array(0);

const BEAM = Number.MAX_VALUE;

function ensure(n: number): void {
  if (nx.length < n) {
    const c = Math.max(n, 2 * nx.length, 64);
    nx = new Float64Array(c);
    ny = new Float64Array(c);
    nz = new Float64Array(c);
    nnDist = new Float64Array(c);
    nnSlot = new Int32Array(c);
    node = new Int32Array(c);
  }
  if (whereIs.length < 2 * n) whereIs = new Int32Array(Math.max(2 * n, 128));
}

function init(ws: ClusterWorkspace, s: number, k: number): void {
  const x = ws.px[k], y = ws.py[k], z = ws.pz[k];
  const norm = 1.0 / Math.sqrt(x * x + y * y + z * z);
  nx[s] = x * norm;
  ny[s] = y * norm;
  nz[s] = z * norm;
  node[s] = k;
  nnDist[s] = BEAM;
  nnSlot[s] = -1;
  whereIs[k] = s;
}

function distance(i: number, j: number): number {
  return 1 - nx[i] * nx[j] - ny[i] * ny[j] - nz[i] * nz[j];
}

function searchNoCross(i: number, end: number): void {
  let best = BEAM, bi = -1;
  for (let j = 0; j < end; j++) {
    if (j === i) continue;
    const d = distance(i, j);
    if (d < best) {
      best = d;
      bi = j;
    }
  }
  nnDist[i] = best;
  nnSlot[i] = bi;
}

function moveTail(to: number, tail: number): void {
  nx[to] = nx[tail];
  ny[to] = ny[tail];
  nz[to] = nz[tail];
  nnDist[to] = nnDist[tail];
  nnSlot[to] = nnSlot[tail];
  node[to] = node[tail];
  whereIs[node[to]] = to;
}

/**
 * Clusters the particles loaded in ws with the e+e- Cambridge algorithm at `ycut` (Infinity: one tree). Afterwards
 * ws.jets[0..nJets) are the frozen jets in the order they were frozen (the last one left comes last), with the
 * history in parent1/parent2 and the constituent lists.
 */
export function clusterEeCambridge(ws: ClusterWorkspace, ycut: number): void {
  let n = ws.n;
  ws.nNodes = n;
  ws.nJets = 0;
  if (n === 0) return;
  ensure(n);
  let Q = 0;
  for (let i = 0; i < n; i++) Q += ws.E[i];
  const Q2 = Q * Q;
  for (let i = 0; i < n; i++) init(ws, i, i);
  for (let a = 1; a < n; a++) {
    let best = BEAM, bi = -1;
    for (let b = 0; b < a; b++) {
      const d = distance(a, b);
      if (d < best) {
        best = d;
        bi = b;
      }
      if (d < nnDist[b]) {
        nnDist[b] = d;
        nnSlot[b] = a;
      }
    }
    nnDist[a] = best;
    nnSlot[a] = bi;
  }
  while (n > 0) {
    let m = 0;
    let vmin = nnDist[0];
    for (let i = 1; i < n; i++) {
      if (nnDist[i] < vmin) {
        m = i;
        vmin = nnDist[i];
      }
    }
    let iA = node[m];
    let iB = nnSlot[m] >= 0 ? node[nnSlot[m]] : -1;
    if (iB >= 0) {
      const eA = ws.E[iA], eB = ws.E[iB];
      const scale = Math.min(eA, eB);
      const dij = 2 * vmin * scale * scale;
      if (dij > Q2 * ycut) {
        // The softer of the two is frozen as a jet.
        if (eA > eB) iA = iB;
        iB = -1;
      }
    }
    if (iB >= 0) {
      const k = recombine(ws, iA, iB, true);
      let sa = whereIs[iA], sb = whereIs[iB];
      if (sa < sb) {
        const t = sa;
        sa = sb;
        sb = t;
      }
      init(ws, sb, k);
      n--;
      const tail = n;
      moveTail(sa, tail);
      for (let i = 0; i < n; i++) {
        if (nnSlot[i] === sa || nnSlot[i] === sb) searchNoCross(i, n);
        const d = distance(i, sb);
        if (d < nnDist[i] && i !== sb) {
          nnDist[i] = d;
          nnSlot[i] = sb;
        }
        if (d < nnDist[sb] && i !== sb) {
          nnDist[sb] = d;
          nnSlot[sb] = i;
        }
        if (nnSlot[i] === tail) nnSlot[i] = sa;
      }
    } else {
      ws.jets[ws.nJets++] = iA;
      const sa = whereIs[iA];
      n--;
      const tail = n;
      moveTail(sa, tail);
      for (let i = 0; i < n; i++) {
        if (nnSlot[i] === sa) searchNoCross(i, n);
        if (nnSlot[i] === tail) nnSlot[i] = sa;
      }
    }
  }
}
