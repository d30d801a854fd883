// Sequential-recombination jet finding with the generalised-kt distances (PHYSICS.md "Jet clustering"):
//   d_ij = min(pt_i^{2p}, pt_j^{2p}) ΔR_ij² / R²,  d_iB = pt_i^{2p};  p = 1 kt, 0 Cambridge/Aachen, −1 anti-kt;
// E-scheme recombination, inclusive jets.
//
// Sources: "The anti-kt jet clustering algorithm", JHEP 04 (2008) 063, arXiv:0802.1189; "Better jet clustering
// algorithms", JHEP 08 (1997) 001, arXiv:hep-ph/9707323 and arXiv:hep-ph/9907280 (Cambridge/Aachen); the FastJet
// user manual, Eur. Phys. J. C72 (2012) 1896, arXiv:1111.6097; and for the nearest-neighbour (NN) and tiling
// strategies "Dispelling the N³ myth for the kt jet-finder", Phys. Lett. B641 (2006) 57, arXiv:hep-ph/0512210.
//
// The N³ textbook loop is replaced by nearest-neighbour bookkeeping (the "N2" idea of arXiv:hep-ph/0512210):
// the smallest d_ij always involves a pair in which the jet with the smaller pt^{2p} has the other one as its
// *geometric* nearest neighbour, so it is enough to keep, for every jet i, its geometric NN within R and
//   diJ_i = ΔR²_{i,NN(i)} · min(pt_i^{2p}, pt_NN^{2p})   (or R² · pt_i^{2p} when i has no neighbour within R),
// which is R² times min(d_iNN, d_iB). After each recombination only the jets whose NN was one of the two merged
// ones, and the neighbours of the new jet, change.
//
// Strategies (cluster() picks one; 'plain' and 'tiled' can be forced, e.g. by the tests):
//  - plain (jet finding below TILED_MIN_PARTICLES, or R too large for ≥ 3 tiles in φ): a port of FastJet 3.4's
//    N2Plain (ClusterSequence::_simple_N2_cluster), including its array compaction, so that even exact ties are
//    resolved as FastJet resolves them when it uses N2Plain (which it does for small N); two savings that leave
//    every result unchanged are described in plain.ts. clusterPlainCA (plain-ca.ts) is the same loop specialised to
//    C/A with R = ∞ (the re-clustering of a jet into one tree): same operations, order and tie-breaking.
//  - tiled (jet finding from TILED_MIN_PARTICLES on): the (y, φ) plane is cut into tiles of side ≥ R or ≥ R/2
//    (φ wraps around); a jet's NN within R can only be in the block of tiles around its own, so NN searches cost
//    O(local density) instead of O(N); the smallest diJ is kept in a tournament tree (O(log N) per change)
//    instead of a linear scan. In the spirit of FastJet's N2Tiled / N2MinHeapTiled / lazy-tiling strategies
//    (arXiv:1111.6097 §3 and appendix; arXiv:hep-ph/0512210); details in tiled.ts.
//  - grid (C/A with R = ∞ for large jets, from GRID_MIN_PARTICLES on): a (y, φ) grid over the jet that is
//    rebuilt as the number of jets falls; details in grid-ca.ts.
// In the tiled and grid strategies the merged jet takes the lower of the two slots (as in FastJet's tiled
// strategies); exact ties between different pairs (measure zero for real data) are resolved deterministically,
// by the lower slot. In every strategy the history's parent1 is the earlier of the two merged nodes (FastJet).
// All strategies choose the same globally smallest distance at every step, so with distances computed
// bit-identically to FastJet (same rapidity/azimuth formulas of the summed four-momentum, same ΔR² expression,
// same diJ product) they reproduce FastJet's clustering sequence; the tests check this against FastJet itself
// and the strategies against each other.
//
// Everything lives in typed arrays inside a reusable ClusterWorkspace: no allocation per step.
//
// This file holds the public entry points (cluster, findJets, the strategy choice and its thresholds); the rest
// of the folder, one file per part:
//   workspace.ts      ClusterWorkspace (nodes and scratch arrays), loading particles or constituents, kinematics
//   recombination.ts  E-scheme recombination of two nodes (history, constituent lists)
//   brief-jets.ts     slots of the active jets, momentum factor pt^{2p}, ΔR², diJ (shared by every strategy)
//   plain.ts          the plain generalised-kt loop (FastJet's N2Plain), with the NN searches plain-ca.ts shares
//   plain-ca.ts       the plain loop specialised to C/A with R = ∞
//   tiles.ts          tile grid helpers shared by the tiled and grid strategies
//   reverse-nn.ts     reverse-NN lists (tiled and grid)
//   tournament.ts     tournament tree of the smallest diJ (tiled and grid)
//   tiled.ts          the tiled strategy
//   grid-ca.ts        the C/A grid for large jets
//   nn-check.ts       brute-force check of the tiled and grid bookkeeping (tests only)

import type { Algorithm } from '../types';
import { TWO_PI } from '../fourvector';
import { clusterGridCA } from './grid-ca';
import { clusterPlain } from './plain';
import { clusterPlainCA } from './plain-ca';
import { clusterTiled } from './tiled';
import { ClusterWorkspace, loadParticles } from './workspace';

export { ClusterWorkspace, loadConstituents, loadParticles, setKinematics } from './workspace';

export type ClusterStrategy = 'auto' | 'plain' | 'tiled';

/** Generalised-kt exponent p: 1 kt, 0 Cambridge/Aachen, −1 anti-kt. */
export function algorithmExponent(a: Algorithm): number {
  return a === 'kt' ? 1 : a === 'ca' ? 0 : -1;
}

/** Above this many particles 'auto' uses tiles (when R allows at least 3 tiles in φ). */
export const TILED_MIN_PARTICLES = 64;

/**
 * From this many particles the C/A re-clustering (R = ∞) uses the grid instead of the plain loop (measured: the
 * two cost the same near 230 constituents; the grid grows more slowly).
 */
export const GRID_MIN_PARTICLES = 240;

export interface ClusterOptions {
  /** Generalised-kt exponent: 1 kt, 0 C/A, −1 anti-kt. */
  p: number;
  /** Jet radius; Infinity merges everything into one jet (d_iB never smallest). */
  R: number;
  strategy?: ClusterStrategy;
  /** Keep constituent lists (first/next/count) for the jets. */
  trackConstituents?: boolean;
}

/**
 * Clusters the particles loaded in ws. Afterwards ws.jets[0..nJets) are the inclusive jets (nodes), and
 * parent1/parent2 hold the history.
 */
export function cluster(ws: ClusterWorkspace, opts: ClusterOptions): void {
  const R = opts.R;
  const R2 = R * R;
  const track = opts.trackConstituents === true;
  ws.nNodes = ws.n;
  ws.nJets = 0;
  if (ws.n === 0) return;
  const strategy = opts.strategy ?? 'auto';
  if (R === Infinity && opts.p === 0 && ws.n > 1 && (strategy === 'tiled' || (strategy === 'auto' && ws.n >= GRID_MIN_PARTICLES))) {
    if (clusterGridCA(ws, track)) return;
  }
  const tilesPossible = Number.isFinite(R2) && R > 0 && Math.floor(TWO_PI / (R * (1 + 1e-6))) >= 3;
  const tiled = tilesPossible && (strategy === 'tiled' || (strategy === 'auto' && ws.n >= TILED_MIN_PARTICLES));
  if (tiled) clusterTiled(ws, R, R2, opts.p, track);
  else {
    ws.gR2 = R2;
    if (R === Infinity && opts.p === 0) clusterPlainCA(ws, track);
    else clusterPlain(ws, opts.p, track);
  }
}

// ---------------------------------------------------------------------------------------------------------
// Convenience (tests, tools): not the hot path.

export interface FoundJet {
  px: number;
  py: number;
  pz: number;
  E: number;
  pt: number;
  y: number;
  phi: number;
  /** Number of constituents. */
  n: number;
  /** Constituent particle indices (input order numbers), in FastJet's constituents() order. */
  constituents: number[];
}

/** Inclusive jets of particles p (px,py,pz,E interleaved), in the order the algorithm found them. */
export function findJets(p: Float64Array, algorithm: Algorithm, R: number, strategy: ClusterStrategy = 'auto'): FoundJet[] {
  const ws = new ClusterWorkspace();
  loadParticles(ws, p, p.length / 4);
  cluster(ws, { p: algorithmExponent(algorithm), R, strategy, trackConstituents: true });
  const out: FoundJet[] = [];
  for (let j = 0; j < ws.nJets; j++) {
    const k = ws.jets[j];
    const constituents: number[] = [];
    for (let c = ws.first[k]; c >= 0; c = ws.next[c]) constituents.push(c);
    out.push({
      px: ws.px[k], py: ws.py[k], pz: ws.pz[k], E: ws.E[k],
      pt: Math.sqrt(ws.kt2[k]), y: ws.rap[k], phi: ws.phi[k],
      n: ws.count[k], constituents,
    });
  }
  return out;
}
