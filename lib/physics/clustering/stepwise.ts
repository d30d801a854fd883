// Sequential recombination with the whole step history kept (the distance d of every step, and whether it merged
// two jets or made one a jet): what exclusive jets (exclusive.ts) read, for the hadron-collider generalised-kt
// distances in (y, φ) and for the e+e- distances in angle.
//
// The loop is a plain N² nearest-neighbour port of FastJet 3.4's N2Plain (ClusterSequence::_simple_N2_cluster,
// FastJet manual arXiv:1111.6097; the NN idea of arXiv:hep-ph/0512210), so that the merging order, the history and
// exact ties follow FastJet. Distances:
//  - 'hadron': d_ij = min(pt_i^2p, pt_j^2p) ΔR_ij² / R², d_iB = pt_i^2p (PHYSICS.md "Jet clustering");
//  - 'ee': FastJet's e+e- brief jets: 2(1 − cos θ_ij) from unit momentum vectors, momentum factor E^2p;
//    Durham ("New clustering algorithm for multijet cross sections in e+e- annihilation", Phys. Lett. B269
//    (1991) 432): d_ij = 2 min(E_i², E_j²)(1 − cos θ_ij), never a beam step while two jets remain; generalised
//    e+e- kt (ee_genkt of the FastJet manual): d_ij = min(E_i^2p, E_j^2p)(1 − cos θ_ij)/(1 − cos R), d_iB = E^2p.
// Recombination is the E-scheme of recombination.ts, so nodes, history and constituent lists are those of every
// other strategy (ws.jets are the jets made by beam steps, in order).

import { dist2 } from './brief-jets';
import { recombine } from './recombination';
import type { ClusterWorkspace } from './workspace';

export type StepDistance =
  | { kind: 'hadron'; p: number; R: number }
  | { kind: 'durham' }
  | { kind: 'ee-genkt'; p: number; R: number };

/** The steps of one clustering: step s made node stepNode[s] (a merge) or made node −1 − stepNode[s] a jet. */
export class StepHistory {
  n = 0;
  nSteps = 0;
  stepNode = new Int32Array(0);
  /** d of the step (FastJet's history dij: the normalisation of the distance put back). */
  stepDij = new Float64Array(0);
  /** Sum of the particles' energies (FastJet's Q, the e+e- visible energy). */
  Q = 0;

  ensure(n: number): void {
    if (this.stepNode.length >= n) return;
    this.stepNode = new Int32Array(Math.max(n, 64));
    this.stepDij = new Float64Array(this.stepNode.length);
  }
}

// Slot arrays of the loop (module scratch, grown on demand).
let a1 = new Float64Array(0);
let a2 = new Float64Array(0);
let a3 = new Float64Array(0);
let mf = new Float64Array(0);
let nnDist = new Float64Array(0);
let nnSlot = new Int32Array(0);
let node = new Int32Array(0);
let diJ = new Float64Array(0);

function ensureSlots(n: number): void {
  if (a1.length >= n) return;
  const c = Math.max(n, 2 * a1.length, 64);
  a1 = new Float64Array(c);
  a2 = new Float64Array(c);
  a3 = new Float64Array(c);
  mf = new Float64Array(c);
  nnDist = new Float64Array(c);
  nnSlot = new Int32Array(c);
  node = new Int32Array(c);
  diJ = new Float64Array(c);
}

/** The e+e- squared-angle normalisation R² of FastJet (2(1 − cos R), or 2(3 + cos R) above π so all merge). */
export function eeR2(R: number): number {
  return R > Math.PI ? 2 * (3.0 + Math.cos(R)) : 2 * (1.0 - Math.cos(R));
}

/**
 * Clusters the particles loaded in ws to the end (every particle ends in a jet), recording every step in `h`.
 * Constituent lists are kept (ws.first/next/count).
 */
export function clusterStepwise(ws: ClusterWorkspace, d: StepDistance, h: StepHistory): void {
  let n = ws.n;
  ws.nNodes = n;
  ws.nJets = 0;
  h.n = n;
  h.nSteps = 0;
  h.ensure(n);
  let Q = 0;
  for (let i = 0; i < n; i++) Q += ws.E[i];
  h.Q = Q;
  if (n === 0) return;
  ensureSlots(n);
  const ee = d.kind !== 'hadron';
  const p = d.kind === 'durham' ? 1 : d.p;
  let R2: number, invR2: number;
  if (d.kind === 'hadron') {
    R2 = d.R * d.R;
    invR2 = 1 / R2;
  } else if (d.kind === 'durham') {
    R2 = 16; // FastJet sets R = 4 for Durham so that beam steps happen only to the last jet
    invR2 = 1;
  } else {
    R2 = eeR2(d.R);
    invR2 = 1 / R2;
  }

  const setSlot = (s: number, k: number): void => {
    node[s] = k;
    if (ee) {
      const e = ws.E[k];
      let scale = e * e;
      if (d.kind === 'ee-genkt') {
        if (p <= 0 && scale < 1e-300) scale = 1e-300;
        scale = Math.pow(scale, p);
      }
      mf[s] = scale;
      const x = ws.px[k], y = ws.py[k], z = ws.pz[k];
      let norm = x * x + y * y + z * z;
      if (norm > 0) {
        norm = 1.0 / Math.sqrt(norm);
        a1[s] = norm * x;
        a2[s] = norm * y;
        a3[s] = norm * z;
      } else {
        a1[s] = 0;
        a2[s] = 0;
        a3[s] = 1;
      }
    } else {
      a1[s] = ws.rap[k];
      a2[s] = ws.phi[k];
      // FastJet's momentum factor pt^2p for p = 1 (kt) and 0 (C/A), the exclusive algorithms.
      mf[s] = p === 0 ? 1 : ws.kt2[k];
    }
    nnDist[s] = R2;
    nnSlot[s] = -1;
  };
  const dist = ee
    ? (i: number, j: number): number => {
        const v = 1.0 - a1[i] * a1[j] - a2[i] * a2[j] - a3[i] * a3[j];
        return v * 2;
      }
    : (i: number, j: number): number => dist2(a1[i], a2[i], a1[j], a2[j]);
  const setDiJ = (i: number): void => {
    let m = mf[i];
    const nn = nnSlot[i];
    if (nn >= 0 && mf[nn] < m) m = mf[nn];
    diJ[i] = nnDist[i] * m;
  };
  const searchNoCross = (i: number, count: number): void => {
    let best = R2, bi = -1;
    for (let j = 0; j < count; j++) {
      if (j === i) continue;
      const v = dist(i, j);
      if (v < best) {
        best = v;
        bi = j;
      }
    }
    nnDist[i] = best;
    nnSlot[i] = bi;
  };

  for (let i = 0; i < n; i++) setSlot(i, i);
  for (let a = 1; a < n; a++) {
    let best = R2, bi = -1;
    for (let b = 0; b < a; b++) {
      const v = dist(a, b);
      if (v < best) {
        best = v;
        bi = b;
      }
      if (v < nnDist[b]) {
        nnDist[b] = v;
        nnSlot[b] = a;
      }
    }
    nnDist[a] = best;
    nnSlot[a] = bi;
  }
  for (let i = 0; i < n; i++) setDiJ(i);

  while (n > 0) {
    let m = 0;
    let dmin = diJ[0];
    for (let i = 0; i < n; i++) {
      if (diJ[i] < dmin) {
        m = i;
        dmin = diJ[i];
      }
    }
    let a = m;
    let b = nnSlot[a];
    const dij = dmin * invR2;
    const s = h.nSteps++;
    h.stepDij[s] = dij;
    if (b >= 0) {
      if (a < b) {
        const t = a;
        a = b;
        b = t;
      }
      const k = recombine(ws, node[a], node[b], true);
      h.stepNode[s] = k;
      setSlot(b, k);
    } else {
      h.stepNode[s] = -1 - node[a];
      ws.jets[ws.nJets++] = node[a];
    }
    n--;
    const tail = n;
    a1[a] = a1[tail];
    a2[a] = a2[tail];
    a3[a] = a3[tail];
    mf[a] = mf[tail];
    nnDist[a] = nnDist[tail];
    nnSlot[a] = nnSlot[tail];
    node[a] = node[tail];
    diJ[a] = diJ[tail];
    for (let i = 0; i < n; i++) {
      if (nnSlot[i] === a || (b >= 0 && nnSlot[i] === b)) {
        searchNoCross(i, n);
        setDiJ(i);
      }
      if (b >= 0) {
        const v = dist(i, b);
        if (v < nnDist[i] && i !== b) {
          nnDist[i] = v;
          nnSlot[i] = b;
          setDiJ(i);
        }
        if (v < nnDist[b] && i !== b) {
          nnDist[b] = v;
          nnSlot[b] = i;
        }
      }
      if (nnSlot[i] === tail) nnSlot[i] = a;
    }
    if (b >= 0) setDiJ(b);
  }
}
