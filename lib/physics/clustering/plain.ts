// The plain strategy: the generalised-kt N² nearest-neighbour loop for any p and R (jet finding on small events),
// and the NN searches and array compaction it shares with its C/A specialisation (plain-ca.ts). Sources: FastJet
// 3.4's N2Plain (FastJet manual, arXiv:1111.6097) and the NN idea of "Dispelling the N³ myth for the kt
// jet-finder", arXiv:hep-ph/0512210.
//
// N2Plain: port of FastJet 3.4 ClusterSequence::_simple_N2_cluster (ClusterSequence_N2.icc) with
// _bj_set_jetinfo, _bj_dist, _bj_diJ, _bj_set_NN_nocross, _bj_set_NN_crosscheck (ClusterSequence.hh).
// Same merging sequence, parents and tie-breaking, with two savings:
//  - the next step's smallest diJ is found during the update loop instead of by a separate scan;
//  - each jet also keeps sLB, a lower bound of its distance to every live jet other than its NN (the second
//    smallest distance within R of its last full search, lowered as new jets come closer). When its NN is
//    merged away and the new jet is strictly closer than that bound, the new jet is its unique nearest
//    neighbour — what FastJet's full re-search would find — and the O(n) re-search is skipped.

import { dist2, loadSlots, setDiJ, setMomentumFactor, setSlot } from './brief-jets';
import { recombine } from './recombination';
import type { ClusterWorkspace } from './workspace';

/**
 * _bj_set_NN_crosscheck of slot a with slots 0..a−1 (run for a = 0, 1, … n−1): a's NN within R (the first slot at
 * the smallest distance), its squared distance and the second smallest (sLB), and a offered to the earlier slots.
 */
export function crosscheckNN(ws: ClusterWorkspace, a: number): void {
  const { sEta, sPhi, sNND, sLB, sNN } = ws;
  const R2 = ws.gR2;
  const ea = sEta[a], fa = sPhi[a];
  let best = R2, best2 = R2, bi = -1;
  for (let b = 0; b < a; b++) {
    const dist = dist2(ea, fa, sEta[b], sPhi[b]);
    if (dist < best) {
      best2 = best;
      best = dist;
      bi = b;
    } else if (dist < best2) {
      best2 = dist;
    }
    if (dist < sNND[b]) {
      sLB[b] = sNND[b];
      sNND[b] = dist;
      sNN[b] = a;
    } else if (dist < sLB[b]) {
      sLB[b] = dist;
    }
  }
  sNN[a] = bi;
  sNND[a] = best;
  sLB[a] = best2;
}

/** _bj_set_NN_nocross of slot i over slots 0..n−1 (slot order, first at the smallest distance), with sLB. */
function plainSearch(ws: ClusterWorkspace, i: number, n: number): void {
  const sEta = ws.sEta, sPhi = ws.sPhi;
  const R2 = ws.gR2;
  const y = sEta[i], f = sPhi[i];
  let best = R2, best2 = R2, bi = -1;
  for (let j = 0; j < n; j++) {
    if (j === i) continue;
    const dist = dist2(y, f, sEta[j], sPhi[j]);
    if (dist < best) {
      best2 = best;
      best = dist;
      bi = j;
    } else if (dist < best2) {
      best2 = dist;
    }
  }
  ws.sNN[i] = bi;
  ws.sNND[i] = best;
  ws.sLB[i] = best2;
}

/** FastJet's array compaction: the jet in slot `from` moves to slot `to` (sMf and diJ: clusterPlain's part). */
export function moveSlot(ws: ClusterWorkspace, from: number, to: number): void {
  ws.sEta[to] = ws.sEta[from];
  ws.sPhi[to] = ws.sPhi[from];
  ws.sNND[to] = ws.sNND[from];
  ws.sLB[to] = ws.sLB[from];
  ws.sNN[to] = ws.sNN[from];
  ws.sNode[to] = ws.sNode[from];
}

/** The first slot of 0..n−1 with the smallest key (FastJet's scan for the smallest diJ). */
export function firstMin(key: Float64Array, n: number): number {
  let m = 0;
  let dmin = key[0];
  for (let i = 1; i < n; i++) {
    if (key[i] < dmin) {
      dmin = key[i];
      m = i;
    }
  }
  return m;
}

/** The generalised-kt loop (any p and R); R² in ws.gR2. */
export function clusterPlain(ws: ClusterWorkspace, p: number, track: boolean): void {
  let n = ws.n;
  const R2 = ws.gR2;
  let ops = (n * (n - 1)) / 2;
  const { sEta, sPhi, sMf, sNND, sLB, sNN, sNode, diJ } = ws;
  loadSlots(ws, n);
  for (let i = 0; i < n; i++) setMomentumFactor(ws, i, i, p);
  for (let a = 0; a < n; a++) crosscheckNN(ws, a);
  for (let i = 0; i < n; i++) setDiJ(ws, i);

  // The smallest diJ (first slot on ties, as FastJet's scan); later found during the update loop.
  let imin = firstMin(diJ, n);
  while (n > 0) {
    let a = imin;
    let b = sNN[a];
    if (b >= 0) {
      if (a < b) {
        const t = a;
        a = b;
        b = t;
      }
      const k = recombine(ws, sNode[a], sNode[b], track);
      setSlot(ws, b, k);
      setMomentumFactor(ws, b, k, p);
    } else {
      ws.jets[ws.nJets++] = sNode[a];
    }

    n--;
    const tail = n;
    moveSlot(ws, tail, a);
    sMf[a] = sMf[tail];
    diJ[a] = diJ[tail];

    let dmin = Infinity;
    imin = -1;
    if (b >= 0) {
      // The new jet's NN (first slot at the smallest distance, as FastJet's in-place updates give) and its
      // second smallest distance are accumulated in locals. The next step's smallest diJ is tracked on the
      // way: slot i's entry is final after its iteration (only b's changes later).
      const eb = sEta[b], fb = sPhi[b], mfb = sMf[b];
      let bBest = R2, bBest2 = R2, bBi = -1;
      ops += n;
      for (let i = 0; i < n; i++) {
        if (i === b) continue; // FastJet: jetB's own entry (NN none at this point) is only relabelled.
        const nn = sNN[i];
        const dist = dist2(sEta[i], sPhi[i], eb, fb);
        if (nn === a || nn === b) {
          // Its NN was merged away.
          if (dist < sLB[i]) {
            sNN[i] = b;
            sNND[i] = dist;
          } else {
            ops += n;
            plainSearch(ws, i, n);
          }
          setDiJ(ws, i);
        } else if (dist < sNND[i]) {
          sLB[i] = sNND[i];
          sNND[i] = dist;
          sNN[i] = b;
          const mf = sMf[i];
          diJ[i] = dist * (mfb < mf ? mfb : mf);
        } else if (dist < sLB[i]) {
          sLB[i] = dist;
        }
        if (dist < bBest) {
          bBest2 = bBest;
          bBest = dist;
          bBi = i;
        } else if (dist < bBest2) {
          bBest2 = dist;
        }
        if (sNN[i] === tail) sNN[i] = a;
        const d = diJ[i];
        if (d < dmin) {
          dmin = d;
          imin = i;
        }
      }
      sNND[b] = bBest;
      sLB[b] = bBest2;
      sNN[b] = bBi;
      setDiJ(ws, b);
      const d = diJ[b];
      if (d < dmin || (d === dmin && b < imin)) {
        dmin = d;
        imin = b;
      }
    } else {
      for (let i = 0; i < n; i++) {
        // Its NN became a jet. (FastJet also re-searches jets without NN; they can only find none again.)
        if (sNN[i] === a) {
          ops += n;
          plainSearch(ws, i, n);
          setDiJ(ws, i);
        }
        if (sNN[i] === tail) sNN[i] = a;
        const d = diJ[i];
        if (d < dmin) {
          dmin = d;
          imin = i;
        }
      }
    }
    if (imin < 0) imin = 0; // every diJ infinite: the first slot, as the scan
  }
  ws.ops += ops;
}
