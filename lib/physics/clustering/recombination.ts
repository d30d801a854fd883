// E-scheme recombination of two nodes into a new one (four-momenta added), with FastJet 3.4's history and
// constituent order (FastJet manual, arXiv:1111.6097). Every strategy merges through this one function, so that
// the history and the kinematics of a merged jet do not depend on the strategy.

import { type ClusterWorkspace, setKinematics } from './workspace';

/**
 * E-scheme recombination of nodes i and j into a new node; returns its index. As FastJet's history
 * (ClusterSequence::_do_ij_recombination_step), parent1 is the earlier node (smaller index) and parent2 the
 * later one, and a jet's constituents are parent1's followed by parent2's (ClusterSequence::add_constituents).
 */
export function recombine(ws: ClusterWorkspace, i: number, j: number, track: boolean): number {
  const k = ws.nNodes++;
  ws.px[k] = ws.px[i] + ws.px[j];
  ws.py[k] = ws.py[i] + ws.py[j];
  ws.pz[k] = ws.pz[i] + ws.pz[j];
  ws.E[k] = ws.E[i] + ws.E[j];
  const p1 = i < j ? i : j, p2 = i < j ? j : i;
  ws.parent1[k] = p1;
  ws.parent2[k] = p2;
  setKinematics(ws, k);
  if (track) {
    ws.next[ws.last[p1]] = ws.first[p2];
    ws.first[k] = ws.first[p1];
    ws.last[k] = ws.last[p2];
    ws.count[k] = ws.count[p1] + ws.count[p2];
  }
  return k;
}
