// The plain strategy specialised to Cambridge/Aachen with an infinite radius (the re-clustering of a jet into
// one tree, when the C/A grid of grid-ca.ts is not used): the loop of plain.ts with its operations, order and
// tie-breaking, kept as a separate loop because it is faster. Sources: FastJet 3.4's N2Plain (FastJet manual, arXiv:1111.6097) and
// "Dispelling the N³ myth for the kt jet-finder", arXiv:hep-ph/0512210.

import { TWO_PI } from '../fourvector';
import { loadSlots, setSlot } from './brief-jets';
import { crosscheckNN, firstMin, moveSlot } from './plain';
import { recombine } from './recombination';
import type { ClusterWorkspace } from './workspace';

const PI = Math.PI;

// A separate loop for speed only: clusterPlain's loop run for C/A measured 6–10% slower on the re-clustering.
/**
 * clusterPlain for Cambridge/Aachen with an infinite radius (the re-clustering of a jet into one tree): every
 * momentum factor is 1, so diJ is the squared distance to the NN (no diJ table), every jet but the last has an
 * NN and there are no beam steps. Same operations, order and tie-breaking.
 */
export function clusterPlainCA(ws: ClusterWorkspace, track: boolean): void {
  let n = ws.n;
  const { sEta, sPhi, sNND, sNN, sNode, sLB } = ws;
  let ops = (n * (n - 1)) / 2;
  loadSlots(ws, n);
  for (let a = 0; a < n; a++) crosscheckNN(ws, a);

  let imin = firstMin(sNND, n);
  while (n > 1) {
    let a = imin;
    let b = sNN[a];
    if (a < b) {
      const t = a;
      a = b;
      b = t;
    }
    const k = recombine(ws, sNode[a], sNode[b], track);
    setSlot(ws, b, k);
    const eb = sEta[b], fb = sPhi[b];
    n--;
    const tail = n;
    moveSlot(ws, tail, a);

    // As clusterPlain's loop with diJ = sNND.
    let bBest = Infinity, bBest2 = Infinity, bBi = -1;
    imin = -1;
    let dmin = Infinity;
    ops += n;
    for (let i = 0; i < n; i++) {
      if (i === b) continue;
      const nn = sNN[i];
      let nd = sNND[i];
      // dist2 (brief-jets.ts) written out, same operations.
      let dp = Math.abs(sPhi[i] - fb);
      const de = sEta[i] - eb;
      if (dp > PI) dp = TWO_PI - dp;
      const dist = dp * dp + de * de;
      if (nn === a || nn === b) {
        if (dist < sLB[i]) {
          sNN[i] = b;
          sNND[i] = nd = dist;
        } else {
          // plainSearch (plain.ts) written out: as a call it measured ~7% slower on 300-constituent jets.
          const ei = sEta[i], fi = sPhi[i];
          let best = Infinity, best2 = Infinity, bi = -1;
          ops += n;
          for (let j = 0; j < n; j++) {
            if (j === i) continue;
            let dq = Math.abs(fi - sPhi[j]);
            const dr = ei - sEta[j];
            if (dq > PI) dq = TWO_PI - dq;
            const dd = dq * dq + dr * dr;
            if (dd < best) {
              best2 = best;
              best = dd;
              bi = j;
            } else if (dd < best2) {
              best2 = dd;
            }
          }
          sNN[i] = bi;
          sNND[i] = nd = best;
          sLB[i] = best2;
        }
      } else if (dist < nd) {
        sLB[i] = nd;
        sNND[i] = nd = dist;
        sNN[i] = b;
      } else {
        if (dist < sLB[i]) sLB[i] = dist;
        if (nn === tail) sNN[i] = a;
      }
      if (dist < bBest) {
        bBest2 = bBest;
        bBest = dist;
        bBi = i;
      } else if (dist < bBest2) {
        bBest2 = dist;
      }
      if (nd < dmin) {
        dmin = nd;
        imin = i;
      }
    }
    sNND[b] = bBest;
    sLB[b] = bBest2;
    sNN[b] = bBi;
    if (bBest < dmin || (bBest === dmin && b < imin)) {
      dmin = bBest;
      imin = b;
    }
  }
  ws.jets[0] = sNode[0];
  ws.nJets = 1;
  ws.ops += ops;
}
