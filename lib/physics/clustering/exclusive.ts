// Exclusive jets: the whole event clustered to exactly n jets, or until the distance of the next step would exceed
// d_cut (or y_cut · E_vis² in e+e-), with FastJet 3.4's definitions (ClusterSequence::exclusive_jets_up_to and
// n_exclusive_jets, FastJet manual arXiv:1111.6097): the jets are the pseudojets that exist at the stopping point
// of the clustering history (steps are counted in history order; d_cut compares with the largest d so far).
// Durham: Phys. Lett. B269 (1991) 432; kt: "Longitudinally invariant kt clustering algorithms for hadron-hadron
// collisions", Nucl. Phys. B406 (1993) 187; C/A: arXiv:hep-ph/9707323.

import type { ExclusiveJets } from '../types';
import { clusterStepwise, StepHistory, type StepDistance } from './stepwise';
import type { ClusterWorkspace } from './workspace';

const history = new StepHistory();
let histOf = new Int32Array(0);
let list = new Int32Array(0);

/** FastJet's n_exclusive_jets(dcut): the number of jets left when the largest d so far first exceeds dcut. */
export function exclusiveCount(h: StepHistory, dcut: number): number {
  let max = 0;
  let last = -1; // the last step (history index − n) whose running maximum is ≤ dcut
  for (let s = 0; s < h.nSteps; s++) {
    if (h.stepDij[s] > max) max = h.stepDij[s];
    if (max <= dcut) last = s;
  }
  // stop point = n + last + 1 (initial entries have max 0 ≤ dcut); jets = 2n − stop point.
  return h.n - (last + 1);
}

/**
 * Puts the exclusive jets (at most njets; fewer only when there are fewer particles) into ws.jets, in the
 * reverse of FastJet's exclusive_jets order (the order in which the engine's selection takes jets is then
 * FastJet's): the parents, made before the stopping point, of the steps after it, parent1 first.
 */
export function setExclusiveJets(ws: ClusterWorkspace, h: StepHistory, njets: number): void {
  const n = h.n;
  if (histOf.length < ws.nNodes) histOf = new Int32Array(Math.max(ws.nNodes, 2 * histOf.length));
  if (list.length < n) list = new Int32Array(Math.max(n, 2 * list.length));
  for (let i = 0; i < n; i++) histOf[i] = i;
  for (let s = 0; s < h.nSteps; s++) if (h.stepNode[s] >= 0) histOf[h.stepNode[s]] = n + s;
  let stop = 2 * n - njets;
  if (stop < n) stop = n;
  let count = 0;
  for (let s = stop - n; s < h.nSteps; s++) {
    const k = h.stepNode[s];
    if (k >= 0) {
      const p1 = ws.parent1[k], p2 = ws.parent2[k];
      if (histOf[p1] < stop) list[count++] = p1;
      if (histOf[p2] < stop) list[count++] = p2;
    } else {
      const j = -1 - k;
      if (histOf[j] < stop) list[count++] = j;
    }
  }
  for (let q = 0; q < count; q++) ws.jets[count - 1 - q] = list[q];
  ws.nJets = count;
}

/** Clusters the particles in ws with distance d and leaves the exclusive jets of `ex` in ws.jets. */
export function clusterExclusive(ws: ClusterWorkspace, d: StepDistance, ex: ExclusiveJets): void {
  clusterStepwise(ws, d, history);
  let njets: number;
  if ('n' in ex) njets = ex.n;
  else if ('dcut' in ex) njets = exclusiveCount(history, ex.dcut);
  else njets = exclusiveCount(history, ex.ycut * (history.Q * history.Q));
  setExclusiveJets(ws, history, njets);
}
