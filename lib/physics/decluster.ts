// Cambridge/Aachen re-clustering of a jet's constituents and its declustering into splittings
// (PHYSICS.md "Declustering and the emission plane"; source: the primary-emission-plane paper,
// JHEP 12 (2018) 064, arXiv:1807.04758).
//
// The C/A tree is the clustering history kept in typed arrays by the clustering workspace
// (clustering/workspace.ts: parent1/parent2 of each node); a splitting j → a, b (pt_a ≥ pt_b) is written as
// SPLIT_STRIDE doubles (types.ts):
//   Δ = ΔR_ab in (y, φ), kt = pt_b Δ, z = pt_b / (pt_a + pt_b), m = m_{a+b} (= m_j, E-scheme), κ = z Δ,
//   ψ = atan2(y_b − y_a, φ_b − φ_a folded into (−π, π]), ln(1/Δ), ln(kt/GeV), generation.

import { ClusterWorkspace, cluster, loadParticles } from './clustering';
import { TWO_PI } from './fourvector';
import {
  SPLIT_STRIDE, S_DELTA, S_GENERATION, S_KAPPA, S_KT, S_LN_INV_DELTA, S_LN_KT, S_M, S_PSI, S_Z,
} from './types';

const PI = Math.PI;

/**
 * Re-clusters the particles loaded in ws with Cambridge/Aachen so that all end in one jet: the radius is
 * infinite, i.e. d_iB is never the smallest distance while two jets remain (FastJet gives the same tree with
 * R = JetDefinition::max_allowable_R = 1000 as long as all ΔR < 1000). The plain loop below
 * GRID_MIN_PARTICLES constituents (FastJet's own N2Plain order, exact ties included), the C/A grid above.
 * Returns the root node (−1 if empty).
 */
export function reclusterCA(ws: ClusterWorkspace): number {
  cluster(ws, { p: 0, R: Infinity });
  return ws.nJets > 0 ? ws.jets[0] : -1;
}

/**
 * Writes the splitting of node k (which must have parents) at out[at..at+SPLIT_STRIDE) with the given
 * generation, and returns the harder branch a: the larger pt², and on an exact tie parent1 (the earlier node),
 * as FastJet's ClusterSequence::has_parents orders them. The softer branch is the other parent.
 */
export function writeSplitting(ws: ClusterWorkspace, k: number, generation: number, out: Float64Array, at: number): number {
  const kt2 = ws.kt2, rap = ws.rap, phi = ws.phi;
  let a = ws.parent1[k];
  let b = ws.parent2[k];
  if (kt2[a] < kt2[b]) {
    const t = a;
    a = b;
    b = t;
  }
  // ΔR as FastJet's PseudoJet::delta_R (plain_distance): |Δφ| folded into [0, π].
  let dphi = Math.abs(phi[a] - phi[b]);
  if (dphi > PI) dphi = TWO_PI - dphi;
  const dy = rap[a] - rap[b];
  const delta = Math.sqrt(dphi * dphi + dy * dy);
  const ptA = Math.sqrt(kt2[a]);
  const ptB = Math.sqrt(kt2[b]);
  const z = ptB / (ptA + ptB);
  const kt = ptB * delta;
  // Signed azimuth difference b − a folded into (−π, π] (both azimuths are in [0, 2π)).
  let sphi = phi[b] - phi[a];
  if (sphi > PI) sphi -= TWO_PI;
  else if (sphi <= -PI) sphi += TWO_PI;
  putSplitting(ws, k, delta, kt, z, Math.atan2(rap[b] - rap[a], sphi), generation, out, at);
  return a;
}

/** Writes one splitting's fields (angle, kt, z, ψ given; m = m of node k, the logarithms and κ derived). */
export function putSplitting(ws: ClusterWorkspace, k: number, delta: number, kt: number, z: number, psi: number, generation: number, out: Float64Array, at: number): void {
  const px = ws.px[k], py = ws.py[k], pz = ws.pz[k], e = ws.E[k];
  const m2 = (e + pz) * (e - pz) - (px * px + py * py);
  out[at + S_LN_INV_DELTA] = Math.log(1 / delta);
  out[at + S_LN_KT] = Math.log(kt);
  out[at + S_Z] = z;
  out[at + S_DELTA] = delta;
  out[at + S_KT] = kt;
  out[at + S_PSI] = psi;
  out[at + S_M] = m2 >= 0 ? Math.sqrt(m2) : -Math.sqrt(-m2);
  out[at + S_KAPPA] = z * delta;
  out[at + S_GENERATION] = generation;
}

/** Writes one splitting of node k and returns its harder branch (writeSplitting; e+e-: ee-decluster.ts). */
export type SplittingWriter = (ws: ClusterWorkspace, k: number, generation: number, out: Float64Array, at: number) => number;

/** Where the primary sequence ended: the single particle at the end of the harder branch (−1 for no jet). */
export interface PrimaryEnd {
  node: number;
}

/**
 * Primary sequence: from the root, undo the last clustering and follow the harder branch until it is a single
 * particle. Writes the splittings (generation 1) from out[at] on; out needs (n−1)·SPLIT_STRIDE doubles at most.
 * Returns the number of splittings; `end`, when given, receives the node of that last particle.
 */
export function declusterPrimary(
  ws: ClusterWorkspace,
  root: number,
  out: Float64Array,
  at = 0,
  write: SplittingWriter = writeSplitting,
  end?: PrimaryEnd,
): number {
  let c = 0;
  let k = root;
  const p1 = ws.parent1;
  while (k >= 0 && p1[k] >= 0) {
    k = write(ws, k, 1, out, at + c * SPLIT_STRIDE);
    c++;
  }
  if (end) end.node = k;
  return c;
}

/**
 * Full tree: every splitting, depth first with the harder branch first (pre-order), each with its generation =
 * 1 + the number of softer branches on the path from the root. `stack` needs 2·(n+1) ints. The primary
 * splittings are exactly the generation-1 ones, in the same order. Returns the number of splittings (n − 1).
 */
export function declusterAll(ws: ClusterWorkspace, root: number, out: Float64Array, at: number, stack: Int32Array, write: SplittingWriter = writeSplitting): number {
  if (root < 0) return 0;
  let c = 0;
  let sp = 0;
  stack[sp++] = root;
  stack[sp++] = 1;
  const p1 = ws.parent1, p2 = ws.parent2;
  while (sp > 0) {
    const g = stack[--sp];
    const k = stack[--sp];
    if (p1[k] < 0) continue;
    const a = write(ws, k, g, out, at + c * SPLIT_STRIDE);
    c++;
    const b = a === p1[k] ? p2[k] : p1[k];
    // Softer branch below, harder branch on top: the harder subtree is walked first.
    if (p1[b] >= 0) {
      stack[sp++] = b;
      stack[sp++] = g + 1;
    }
    if (p1[a] >= 0) {
      stack[sp++] = a;
      stack[sp++] = g;
    }
  }
  return c;
}

/** Splittings of one jet given as its constituents (px,py,pz,E interleaved); allocating, for tests and tools. */
export function declusterConstituents(p: Float64Array, fullTree = false): { primary: Float64Array; all: Float64Array | null } {
  const ws = new ClusterWorkspace();
  const n = p.length / 4;
  loadParticles(ws, p, n);
  const root = reclusterCA(ws);
  const buf = new Float64Array(Math.max(1, n) * SPLIT_STRIDE);
  const np = declusterPrimary(ws, root, buf, 0);
  const primary = buf.slice(0, np * SPLIT_STRIDE);
  let all: Float64Array | null = null;
  if (fullTree) {
    const na = declusterAll(ws, root, buf, 0, new Int32Array(2 * (n + 1)));
    all = buf.slice(0, na * SPLIT_STRIDE);
  }
  return { primary, all };
}
