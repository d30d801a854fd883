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
//    every result unchanged are described above clusterPlain. clusterPlainCA is the same loop specialised to C/A
//    with R = ∞ (the re-clustering of a jet into one tree): same operations, order and tie-breaking.
//  - tiled (jet finding from TILED_MIN_PARTICLES on): the (y, φ) plane is cut into tiles of side ≥ R or ≥ R/2
//    (φ wraps around); a jet's NN within R can only be in the block of tiles around its own, so NN searches cost
//    O(local density) instead of O(N); the smallest diJ is kept in a tournament tree (O(log N) per change)
//    instead of a linear scan. In the spirit of FastJet's N2Tiled / N2MinHeapTiled / lazy-tiling strategies
//    (arXiv:1111.6097 §3 and appendix; arXiv:hep-ph/0512210); details above clusterTiled.
//  - grid (C/A with R = ∞ for large jets, from GRID_MIN_PARTICLES on): a (y, φ) grid over the jet that is
//    rebuilt as the number of jets falls; details above clusterGridCA.
// In the tiled and grid strategies the merged jet takes the lower of the two slots (as in FastJet's tiled
// strategies); exact ties between different pairs (measure zero for real data) are resolved deterministically,
// by the lower slot. In every strategy the history's parent1 is the earlier of the two merged nodes (FastJet).
// All strategies choose the same globally smallest distance at every step, so with distances computed
// bit-identically to FastJet (same rapidity/azimuth formulas of the summed four-momentum, same ΔR² expression,
// same diJ product) they reproduce FastJet's clustering sequence; the tests check this against FastJet itself
// and the strategies against each other.
//
// Everything lives in typed arrays inside a reusable ClusterWorkspace: no allocation per step.

import type { Algorithm } from './types';
import { FJ_MAX_RAP, TWO_PI } from './fourvector';

const PI = Math.PI;

export type ClusterStrategy = 'auto' | 'plain' | 'tiled';

/** Generalised-kt exponent p: 1 kt, 0 Cambridge/Aachen, −1 anti-kt. */
export function algorithmExponent(a: Algorithm): number {
  return a === 'kt' ? 1 : a === 'ca' ? 0 : -1;
}

/** Above this many particles 'auto' uses tiles (when R allows at least 3 tiles in φ). */
export const TILED_MIN_PARTICLES = 64;

/**
 * Pseudojets (nodes of the clustering history) and the scratch arrays of the NN bookkeeping.
 * Nodes 0..n−1 are the input particles, n.. the recombinations in the order they happened.
 */
export class ClusterWorkspace {
  /** Capacity in input particles. */
  cap = 0;
  /** Number of input particles loaded. */
  n = 0;
  /** Number of nodes (particles + recombinations). */
  nNodes = 0;

  // Nodes (size 2·cap).
  px = new Float64Array(0);
  py = new Float64Array(0);
  pz = new Float64Array(0);
  E = new Float64Array(0);
  /** pt² = px² + py². */
  kt2 = new Float64Array(0);
  /** Rapidity (FastJet's formula). */
  rap = new Float64Array(0);
  /** Azimuth in [0, 2π). */
  phi = new Float64Array(0);
  /** History: the two nodes merged into this one (parent1 the earlier, as FastJet's), −1 for input particles. */
  parent1 = new Int32Array(0);
  parent2 = new Int32Array(0);
  /** Constituent lists (only filled when asked): first/last particle of a node, next particle, count. */
  first = new Int32Array(0);
  last = new Int32Array(0);
  count = new Int32Array(0);
  next = new Int32Array(0);

  /** Inclusive jets (node indices) in the order they became jets. */
  jets = new Int32Array(0);
  nJets = 0;

  // Brief-jet slots (size cap): the active jets of the NN bookkeeping.
  sEta = new Float64Array(0);
  sPhi = new Float64Array(0);
  /** Momentum factor pt^{2p} (FastJet's jet_scale_for_algorithm). */
  sMf = new Float64Array(0);
  /** Squared distance to the NN (R² when none). */
  sNND = new Float64Array(0);
  /** Plain strategy: lower bound of the squared distance to every live jet other than the NN. */
  sLB = new Float64Array(0);
  /** NN slot, −1 when none within R. */
  sNN = new Int32Array(0);
  /** Node held by the slot. */
  sNode = new Int32Array(0);
  /** R² · min(d_iNN, d_iB); size ≥ next power of two of cap (tournament leaves). */
  diJ = new Float64Array(0);

  // Tiled strategy.
  tree = new Int32Array(0);
  sTile = new Int32Array(0);
  sNext = new Int32Array(0);
  sPrev = new Int32Array(0);
  /** Reverse NN lists: first slot whose NN is this slot; links of a slot in its NN's list. */
  rHead = new Int32Array(0);
  rNext = new Int32Array(0);
  rPrev = new Int32Array(0);
  tmp = new Int32Array(0);
  tileHead = new Int32Array(0);
  /** Upper bound of the NN distances of the jets in each tile. */
  tileMax = new Float64Array(0);
  offY = new Int32Array(64);
  offU = new Int32Array(64);
  // Grid strategy of the C/A re-clustering.
  sU = new Float64Array(0);
  alive = new Uint8Array(0);
  farPos = new Int32Array(0);
  farList = new Int32Array(0);
  nFar = 0;
  gUMin = 0;
  gWMin = 1;
  gBuiltActive = 0;
  /** Result of the grid strategy's last NN search (gridSearch, gridOffer): best slot, its squared distance. */
  gBest = -1;
  gBestD = Infinity;
  // The tile of the last tileEdges call: row, column, and distances to its sides less BOUND_MARGIN.
  tRow = 0;
  tCol = 0;
  eYLo = 0;
  eYHi = 0;
  eULo = 0;
  eUHi = 0;
  // Grid geometry of the current tiled run.
  gNY = 1;
  gNPhi = 1;
  gWY = 1;
  gWPhi = 1;
  gYMin = 0;
  gR2 = 0;
  gNOff = 0;
  gP = 1;
  gK = 1;
  lbY2 = new Float64Array(16);
  lbU2 = new Float64Array(16);
  /** Tiles are at least R/tileRings wide; 0 = chosen from the particle density (see TILE_DENSE). */
  tileRings = 0;

  /** Pair distances evaluated so far (a cost measure for tests; never reset by the engine). */
  ops = 0;
  /**
   * Tests only: after every step of the tiled and grid strategies, check by brute force that every active
   * jet's NN distance is the true one and that the tile bounds hold (throws on the first violation).
   */
  verify = false;

  /** Makes room for n input particles (keeps the contents of nothing). */
  ensure(n: number): void {
    if (n <= this.cap) return;
    const cap = Math.max(n, 2 * this.cap, 64);
    const nodes = 2 * cap;
    this.cap = cap;
    this.px = new Float64Array(nodes);
    this.py = new Float64Array(nodes);
    this.pz = new Float64Array(nodes);
    this.E = new Float64Array(nodes);
    this.kt2 = new Float64Array(nodes);
    this.rap = new Float64Array(nodes);
    this.phi = new Float64Array(nodes);
    this.parent1 = new Int32Array(nodes);
    this.parent2 = new Int32Array(nodes);
    this.first = new Int32Array(nodes);
    this.last = new Int32Array(nodes);
    this.count = new Int32Array(nodes);
    this.next = new Int32Array(cap);
    this.jets = new Int32Array(cap);
    this.sEta = new Float64Array(cap);
    this.sPhi = new Float64Array(cap);
    this.sMf = new Float64Array(cap);
    this.sNND = new Float64Array(cap);
    this.sLB = new Float64Array(cap);
    this.sNN = new Int32Array(cap);
    this.sNode = new Int32Array(cap);
    let P = 1;
    while (P < cap) P <<= 1;
    this.diJ = new Float64Array(P);
    this.tree = new Int32Array(2 * P);
    this.sTile = new Int32Array(cap);
    this.sNext = new Int32Array(cap);
    this.sPrev = new Int32Array(cap);
    this.rHead = new Int32Array(cap);
    this.rNext = new Int32Array(cap);
    this.rPrev = new Int32Array(cap);
    this.tmp = new Int32Array(cap);
    this.sU = new Float64Array(cap);
    this.alive = new Uint8Array(cap);
    this.farPos = new Int32Array(cap);
    this.farList = new Int32Array(cap);
  }
}

/** Computes pt², azimuth and rapidity of node k from its four-momentum, exactly as FastJet 3.4 does. */
export function setKinematics(ws: ClusterWorkspace, k: number): void {
  const x = ws.px[k], y = ws.py[k], z = ws.pz[k], e = ws.E[k];
  const k2 = x * x + y * y;
  ws.kt2[k] = k2;
  let f = k2 === 0 ? 0 : Math.atan2(y, x);
  if (f < 0) f += TWO_PI;
  if (f >= TWO_PI) f -= TWO_PI;
  ws.phi[k] = f;
  const az = Math.abs(z);
  if (e === az && k2 === 0) {
    ws.rap[k] = z >= 0 ? FJ_MAX_RAP + az : -(FJ_MAX_RAP + az);
  } else {
    const m2 = (e + z) * (e - z) - k2;
    const ep = e + az;
    const r = 0.5 * Math.log((k2 + (m2 > 0 ? m2 : 0)) / (ep * ep));
    ws.rap[k] = z > 0 ? -r : r;
  }
}

/** Loads n particles (px, py, pz, E interleaved) as nodes 0..n−1. */
export function loadParticles(ws: ClusterWorkspace, p: Float64Array, n: number): void {
  ws.ensure(n);
  const { px, py, pz, E, parent1, parent2, first, last, count, next } = ws;
  for (let i = 0, at = 0; i < n; i++, at += 4) {
    px[i] = p[at];
    py[i] = p[at + 1];
    pz[i] = p[at + 2];
    E[i] = p[at + 3];
    setKinematics(ws, i);
    parent1[i] = -1;
    parent2[i] = -1;
    first[i] = i;
    last[i] = i;
    count[i] = 1;
    next[i] = -1;
  }
  ws.n = n;
  ws.nNodes = n;
  ws.nJets = 0;
}

/**
 * Loads the constituents of node `jet` of `src` (in FastJet's constituents() order: parent1's before parent2's)
 * as the particles of `dst`, copying their kinematics. Needs src's constituent lists. Returns the count.
 */
export function loadConstituents(dst: ClusterWorkspace, src: ClusterWorkspace, jet: number): number {
  const n = src.count[jet];
  dst.ensure(n);
  const { px, py, pz, E, kt2, rap, phi, parent1, parent2, first, last, count, next } = dst;
  let c = src.first[jet];
  for (let i = 0; i < n; i++) {
    px[i] = src.px[c];
    py[i] = src.py[c];
    pz[i] = src.pz[c];
    E[i] = src.E[c];
    kt2[i] = src.kt2[c];
    rap[i] = src.rap[c];
    phi[i] = src.phi[c];
    parent1[i] = -1;
    parent2[i] = -1;
    first[i] = i;
    last[i] = i;
    count[i] = 1;
    next[i] = -1;
    c = src.next[c];
  }
  dst.n = n;
  dst.nNodes = n;
  dst.nJets = 0;
  return n;
}

/**
 * E-scheme recombination of nodes i and j into a new node; returns its index. As FastJet's history
 * (ClusterSequence::_do_ij_recombination_step), parent1 is the earlier node (smaller index) and parent2 the
 * later one, and a jet's constituents are parent1's followed by parent2's (ClusterSequence::add_constituents).
 */
function recombine(ws: ClusterWorkspace, i: number, j: number, track: boolean): number {
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

/** Slot s's momentum factor from node k: FastJet's jet_scale_for_algorithm, pt^{2p} with its safety limits. */
function setMomentumFactor(ws: ClusterWorkspace, s: number, k: number, p: number): void {
  const kt2 = ws.kt2[k];
  ws.sMf[s] = p === 0 ? 1 : p > 0 ? kt2 : kt2 > 1e-300 ? 1 / kt2 : 1e300;
}

/**
 * Squared distance in (y, φ) with |Δφ| folded into [0, π], as FastJet's _bj_dist; the same bits whichever point
 * comes first (x − y is exactly −(y − x)).
 */
function dist2(y1: number, f1: number, y2: number, f2: number): number {
  let dphi = Math.abs(f1 - f2);
  const deta = y1 - y2;
  if (dphi > PI) dphi = TWO_PI - dphi;
  return dphi * dphi + deta * deta;
}

/** Puts node k into brief-jet slot s (rapidity, azimuth, node). */
function setSlot(ws: ClusterWorkspace, s: number, k: number): void {
  ws.sEta[s] = ws.rap[k];
  ws.sPhi[s] = ws.phi[k];
  ws.sNode[s] = k;
}

/** Slots 0..n−1 hold the input particles. */
function loadSlots(ws: ClusterWorkspace, n: number): void {
  for (let i = 0; i < n; i++) setSlot(ws, i, i);
}

/** diJ of slot i from its NN (FastJet's _bj_diJ). */
function setDiJ(ws: ClusterWorkspace, i: number): void {
  const sMf = ws.sMf;
  const nn = ws.sNN[i];
  let mf = sMf[i];
  if (nn >= 0 && sMf[nn] < mf) mf = sMf[nn];
  ws.diJ[i] = ws.sNND[i] * mf;
}

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
// N2Plain: port of FastJet 3.4 ClusterSequence::_simple_N2_cluster (ClusterSequence_N2.icc) with
// _bj_set_jetinfo, _bj_dist, _bj_diJ, _bj_set_NN_nocross, _bj_set_NN_crosscheck (ClusterSequence.hh).
// Same merging sequence, parents and tie-breaking, with two savings:
//  - the next step's smallest diJ is found during the update loop instead of by a separate scan;
//  - each jet also keeps sLB, a lower bound of its distance to every live jet other than its NN (the second
//    smallest distance within R of its last full search, lowered as new jets come closer). When its NN is
//    merged away and the new jet is strictly closer than that bound, the new jet is its unique nearest
//    neighbour — what FastJet's full re-search would find — and the O(n) re-search is skipped.

/**
 * _bj_set_NN_crosscheck of slot a with slots 0..a−1 (run for a = 0, 1, … n−1): a's NN within R (the first slot at
 * the smallest distance), its squared distance and the second smallest (sLB), and a offered to the earlier slots.
 */
function crosscheckNN(ws: ClusterWorkspace, a: number): void {
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
function moveSlot(ws: ClusterWorkspace, from: number, to: number): void {
  ws.sEta[to] = ws.sEta[from];
  ws.sPhi[to] = ws.sPhi[from];
  ws.sNND[to] = ws.sNND[from];
  ws.sLB[to] = ws.sLB[from];
  ws.sNN[to] = ws.sNN[from];
  ws.sNode[to] = ws.sNode[from];
}

/** The first slot of 0..n−1 with the smallest key (FastJet's scan for the smallest diJ). */
function firstMin(key: Float64Array, n: number): number {
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
function clusterPlain(ws: ClusterWorkspace, p: number, track: boolean): void {
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

// A separate loop for speed only: clusterPlain's loop run for C/A measured 6–10% slower on the re-clustering.
/**
 * clusterPlain for Cambridge/Aachen with an infinite radius (the re-clustering of a jet into one tree): every
 * momentum factor is 1, so diJ is the squared distance to the NN (no diJ table), every jet but the last has an
 * NN and there are no beam steps. Same operations, order and tie-breaking.
 */
function clusterPlainCA(ws: ClusterWorkspace, track: boolean): void {
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
      const dist = dist2(sEta[i], sPhi[i], eb, fb);
      if (nn === a || nn === b) {
        if (dist < sLB[i]) {
          sNN[i] = b;
          sNND[i] = dist;
        } else {
          // plainSearch written out: as a call it measured ~7% slower on 300-constituent jets.
          const ei = sEta[i], fi = sPhi[i];
          let best = Infinity, best2 = Infinity, bi = -1;
          ops += n;
          for (let j = 0; j < n; j++) {
            if (j === i) continue;
            let dp = Math.abs(fi - sPhi[j]);
            const de = ei - sEta[j];
            if (dp > PI) dp = TWO_PI - dp;
            const dd = dp * dp + de * de;
            if (dd < best) {
              best2 = best;
              best = dd;
              bi = j;
            } else if (dd < best2) {
              best2 = dd;
            }
          }
          sNN[i] = bi;
          sNND[i] = best;
          sLB[i] = best2;
        }
      } else if (dist < sNND[i]) {
        sLB[i] = sNND[i];
        sNND[i] = dist;
        sNN[i] = b;
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
      const d = sNND[i];
      if (d < dmin) {
        dmin = d;
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

// ---------------------------------------------------------------------------------------------------------
// Tiled NN strategy.
//
// Tiles of side ≥ R/K (K = 1 or 2 from the particle density, see TILE_DENSE) in (y, φ), φ periodic: a jet's
// neighbours within R lie at most K tiles away, in the (2K+1)² block around its tile. Three devices keep the work per
// step proportional to the local density rather than to the block population:
//  - NN searches visit the block's tiles ring by ring and skip a tile when the lower bound of the distance from
//    the jet to the tile's rectangle is not below the best distance found so far;
//  - reverse-NN lists (for each jet, the jets that have it as NN) give the jets to re-search after a merge
//    without scanning;
//  - each tile keeps an upper bound of its jets' NN distances, so that the check "is the new jet closer than
//    my current NN?" skips tiles that are too far from the new jet for any of their jets.
// The smallest diJ is kept in a tournament tree. Slots: the merged jet takes the lower of the two slots, the
// higher one dies, as in FastJet's tiled strategies.

/** Particles per R² above which tiles of side R/2 (5×5 blocks) replace tiles of side R (3×3 blocks). */
const TILE_DENSE = 2;
/** Absolute margin (in y/φ units) that keeps tile distance bounds below the true distance despite rounding. */
const BOUND_MARGIN = 1e-12;

// The tiled and grid strategies' helpers are module-level functions (closures re-created per call would defeat
// V8's inlining); the grid geometry lives in the workspace (g* fields). Both grids have rows in y from gYMin and
// columns in u from gUMin: u = φ and gUMin = 0 for the tiled strategy, the folded φ for the grid one.

/** Tile of slot s (at sEta[s], u[s]; u is sPhi or sU), clamped to the grid. */
function tileOf(ws: ClusterWorkspace, s: number, u: Float64Array): number {
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
function resetTiles(ws: ClusterWorkspace, nTiles: number): void {
  if (ws.tileHead.length < nTiles) {
    const c = Math.max(nTiles, 2 * ws.tileHead.length);
    ws.tileHead = new Int32Array(c);
    ws.tileMax = new Float64Array(c);
  }
  ws.tileHead.fill(-1, 0, nTiles);
  ws.tileMax.fill(0, 0, nTiles);
}

function tileInsert(ws: ClusterWorkspace, s: number, t: number): void {
  const sNext = ws.sNext, sPrev = ws.sPrev, tileHead = ws.tileHead;
  ws.sTile[s] = t;
  const h = tileHead[t];
  sPrev[s] = -1;
  sNext[s] = h;
  if (h >= 0) sPrev[h] = s;
  tileHead[t] = s;
}

function tileRemove(ws: ClusterWorkspace, s: number): void {
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
function tileEdges(ws: ClusterWorkspace, i: number, u: Float64Array): number {
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

/** Makes j slot i's NN in the reverse lists (j = −1: none) and in sNN. */
function relinkNN(ws: ClusterWorkspace, i: number, j: number): void {
  const sNN = ws.sNN;
  const old = sNN[i];
  if (old === j) return;
  const rHead = ws.rHead, rNext = ws.rNext, rPrev = ws.rPrev;
  if (old >= 0) {
    const pv = rPrev[i], nx = rNext[i];
    if (pv >= 0) rNext[pv] = nx;
    else rHead[old] = nx;
    if (nx >= 0) rPrev[nx] = pv;
  }
  if (j >= 0) {
    const h = rHead[j];
    rPrev[i] = -1;
    rNext[i] = h;
    if (h >= 0) rPrev[h] = i;
    rHead[j] = i;
  }
  sNN[i] = j;
}

/**
 * Takes slots a and b (b = −1: none) out of the NN graph; the jets that had either as NN are left without NN
 * in ws.tmp[0..count), and the count is returned.
 */
function detachPair(ws: ClusterWorkspace, a: number, b: number): number {
  const { sNN, rHead, rNext, tmp } = ws;
  relinkNN(ws, a, -1);
  if (b >= 0) relinkNN(ws, b, -1);
  let nt = 0;
  for (let j = rHead[a]; j >= 0; j = rNext[j]) tmp[nt++] = j;
  rHead[a] = -1;
  if (b >= 0) {
    for (let j = rHead[b]; j >= 0; j = rNext[j]) tmp[nt++] = j;
    rHead[b] = -1;
  }
  for (let q = 0; q < nt; q++) sNN[tmp[q]] = -1;
  return nt;
}

/** Sets the NN of slot i (j, squared distance d), keeping the reverse lists and the tile bound. */
function setNN(ws: ClusterWorkspace, i: number, j: number, d: number): void {
  relinkNN(ws, i, j);
  ws.sNND[i] = d;
  const t = ws.sTile[i];
  if (d > ws.tileMax[t]) ws.tileMax[t] = d;
}

/** diJ of slot i and the tournament tree update. */
function updateDiJ(ws: ClusterWorkspace, i: number): void {
  setDiJ(ws, i);
  treeFix(ws.tree, ws.diJ, i, ws.gP);
}

/** Builds the tournament tree over key[0..n) (padded with ∞ to a power of two). */
function treeBuild(ws: ClusterWorkspace, key: Float64Array, n: number): void {
  const tree = ws.tree;
  let P = 1;
  while (P < n) P <<= 1;
  ws.gP = P;
  for (let i = n; i < P; i++) key[i] = Infinity;
  for (let i = 0; i < P; i++) tree[P + i] = i;
  for (let t = P - 1; t >= 1; t--) {
    const l = tree[2 * t], r = tree[2 * t + 1];
    tree[t] = key[r] < key[l] ? r : l;
  }
}

/**
 * Restores the tournament tree above leaf i after key[i] changed. Ties go to the left (lower slot). The walk
 * stops where the winner is unchanged and is not i (nothing above can change then).
 */
function treeFix(tree: Int32Array, key: Float64Array, i: number, P: number): void {
  let t = (i + P) >> 1;
  while (t >= 1) {
    const l = tree[2 * t], r = tree[2 * t + 1];
    const w = key[r] < key[l] ? r : l;
    const old = tree[t];
    if (w === old && old !== i) return;
    tree[t] = w;
    t >>= 1;
  }
}

/** Takes slot i out of the tournament (diJ = ∞). */
function killSlot(ws: ClusterWorkspace, i: number): void {
  const diJ = ws.diJ, tree = ws.tree;
  diJ[i] = Infinity;
  treeFix(tree, diJ, i, ws.gP);
}

/**
 * NN search of slot i in the tile list that starts at j: a jet closer than ws.gBestD becomes the best (ws.gBest,
 * ws.gBestD).
 */
function tileNearest(ws: ClusterWorkspace, j: number, i: number): void {
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

/**
 * Squared distance lower bounds from slot i to the rows (ws.lbY2[K+di]) and columns (ws.lbU2[K+dj]) of its
 * block; rows outside the grid get ∞. Returns i's tile.
 */
function blockBounds(ws: ClusterWorkspace, i: number): number {
  const K = ws.gK, nY = ws.gNY, wY = ws.gWY, wPhi = ws.gWPhi;
  const lbY2 = ws.lbY2, lbU2 = ws.lbU2;
  const t = tileEdges(ws, i, ws.sPhi);
  const iy = ws.tRow;
  const dyLo = ws.eYLo, dyHi = ws.eYHi, duLo = ws.eULo, duHi = ws.eUHi;
  lbY2[K] = 0;
  lbU2[K] = 0;
  for (let d = 1; d <= K; d++) {
    let up = (d - 1) * wY + dyHi, dn = (d - 1) * wY + dyLo;
    if (up < 0) up = 0;
    if (dn < 0) dn = 0;
    lbY2[K + d] = iy + d < nY ? up * up : Infinity;
    lbY2[K - d] = iy - d >= 0 ? dn * dn : Infinity;
    let r = (d - 1) * wPhi + duHi, l = (d - 1) * wPhi + duLo;
    if (r < 0) r = 0;
    if (l < 0) l = 0;
    lbU2[K + d] = r * r;
    lbU2[K - d] = l * l;
  }
  return t;
}

/** Nearest neighbour of slot i within R: block search, tiles skipped by their distance lower bound. */
function findNN(ws: ClusterWorkspace, i: number): void {
  const sEta = ws.sEta, sPhi = ws.sPhi, sNext = ws.sNext, tileHead = ws.tileHead;
  const offY = ws.offY, offU = ws.offU, nOff = ws.gNOff, K = ws.gK, nPhi = ws.gNPhi;
  const lbY2 = ws.lbY2, lbU2 = ws.lbU2;
  const t = blockBounds(ws, i);
  const iy = (t / nPhi) | 0;
  const iu = t - iy * nPhi;
  const y = sEta[i], f = sPhi[i];
  let best = ws.gR2, bi = -1;
  let ops = 0;
  for (let q = 0; q < nOff; q++) {
    const di = offY[q], dj = offU[q];
    if (lbY2[K + di] + lbU2[K + dj] >= best) continue;
    let col = iu + dj;
    if (col < 0) col += nPhi;
    else if (col >= nPhi) col -= nPhi;
    // tileNearest written out: this is the tiled strategy's hottest loop, and the call measured slower here.
    for (let j = tileHead[(iy + di) * nPhi + col]; j >= 0; j = sNext[j]) {
      if (j === i) continue;
      ops++;
      let dphi = Math.abs(f - sPhi[j]);
      const deta = y - sEta[j];
      if (dphi > PI) dphi = TWO_PI - dphi;
      const dist = dphi * dphi + deta * deta;
      if (dist < best) {
        best = dist;
        bi = j;
      }
    }
  }
  ws.ops += ops;
  setNN(ws, i, bi, best);
}

/**
 * After the new jet has been put in slot b: finds its NN, and gives it as NN to the jets for which it is closer
 * than their current NN (tiles whose bound says none of their jets can be are skipped).
 */
function scanNewJet(ws: ClusterWorkspace, b: number): void {
  const sEta = ws.sEta, sPhi = ws.sPhi, sNND = ws.sNND, sNext = ws.sNext, tileHead = ws.tileHead, tileMax = ws.tileMax;
  const offY = ws.offY, offU = ws.offU, nOff = ws.gNOff, K = ws.gK, nPhi = ws.gNPhi;
  const lbY2 = ws.lbY2, lbU2 = ws.lbU2;
  const t = blockBounds(ws, b);
  const iy = (t / nPhi) | 0;
  const iu = t - iy * nPhi;
  const y = sEta[b], f = sPhi[b];
  let best = ws.gR2, bi = -1;
  let ops = 0;
  for (let q = 0; q < nOff; q++) {
    const di = offY[q], dj = offU[q];
    const lb2 = lbY2[K + di] + lbU2[K + dj];
    if (lb2 === Infinity) continue;
    let col = iu + dj;
    if (col < 0) col += nPhi;
    else if (col >= nPhi) col -= nPhi;
    const tt = (iy + di) * nPhi + col;
    if (lb2 >= best && lb2 >= tileMax[tt]) continue;
    let mx = 0;
    for (let i = tileHead[tt]; i >= 0; i = sNext[i]) {
      if (i === b) continue;
      ops++;
      let dphi = Math.abs(sPhi[i] - f);
      const deta = sEta[i] - y;
      if (dphi > PI) dphi = TWO_PI - dphi;
      const dist = dphi * dphi + deta * deta;
      if (dist < sNND[i]) {
        setNN(ws, i, b, dist);
        updateDiJ(ws, i);
      }
      if (dist < best) {
        best = dist;
        bi = i;
      }
      const d = sNND[i];
      if (d > mx) mx = d;
    }
    // Every jet of the tile was seen: its bound becomes exact (b's own NN distance is added below).
    tileMax[tt] = mx;
  }
  ws.ops += ops;
  setNN(ws, b, bi, best);
  updateDiJ(ws, b);
}

/**
 * Brute-force check of the NN bookkeeping (tests: ws.verify). `alive(i)` tells the active slots; `R2` is the
 * NN range (Infinity for the C/A grid); `grid` selects the grid strategy's near/far rules.
 */
function verifyState(ws: ClusterWorkspace, n: number, isAlive: (i: number) => boolean, R2: number, grid: boolean): void {
  const { sEta, sPhi, sNND, sNN, sTile, tileMax } = ws;
  for (let i = 0; i < n; i++) {
    if (!isAlive(i)) continue;
    let best = R2;
    for (let j = 0; j < n; j++) {
      if (j === i || !isAlive(j)) continue;
      const dist = dist2(sEta[i], sPhi[i], sEta[j], sPhi[j]);
      if (dist < best) best = dist;
    }
    if (sNND[i] !== best) throw new Error(`NN check: slot ${i} has NN distance ${sNND[i]} (NN ${sNN[i]}), true ${best}`);
    if (sNN[i] >= 0 && !isAlive(sNN[i])) throw new Error(`NN check: slot ${i} has a dead NN ${sNN[i]}`);
    const near = grid ? sNND[i] < ws.gR2 : true;
    if (near && sNND[i] > tileMax[sTile[i]]) throw new Error(`NN check: tile ${sTile[i]} bound ${tileMax[sTile[i]]} < NN distance ${sNND[i]} of slot ${i}`);
    if (grid && !near && ws.farPos[i] < 0) throw new Error(`NN check: slot ${i} is far but not in the far list`);
  }
}

function clusterTiled(ws: ClusterWorkspace, R: number, R2: number, p: number, track: boolean): void {
  const n = ws.n;
  const { sPhi, sNND, sNN, sNode, diJ, tree, rap, rHead } = ws;

  let yMin = Infinity, yMax = -Infinity;
  for (let i = 0; i < n; i++) {
    const y = rap[i];
    if (y < yMin) yMin = y;
    if (y > yMax) yMax = y;
  }
  // Geometry: tiles of side ≥ R/K, K rings; nPhi ≥ 2K+1 so that the block's φ columns are distinct.
  // Measured: R-sized tiles (K = 1) are best for sparse events, R/2 (K = 2) once there are a few particles
  // per R² on average.
  const side = R * (1 + 1e-6);
  let K = ws.tileRings > 0 ? ws.tileRings : (n * R * R) / ((yMax - yMin + R) * TWO_PI) > TILE_DENSE ? 2 : 1;
  let nPhi = Math.floor((TWO_PI * K) / side);
  while (K > 1 && nPhi < 2 * K + 1) {
    K--;
    nPhi = Math.floor((TWO_PI * K) / side);
  }
  let nY = Math.floor(((yMax - yMin) * K) / side);
  // Bound the tile count by the particle count (a far-out particle must not create a huge grid).
  const maxY = Math.max(1, Math.floor((4 * n) / nPhi));
  if (nY > maxY) nY = maxY;
  if (nY < 1) nY = 1;
  resetTiles(ws, nY * nPhi);
  ws.gNY = nY;
  ws.gNPhi = nPhi;
  ws.gWY = nY === 1 ? side / K : (yMax - yMin) / nY;
  ws.gWPhi = TWO_PI / nPhi;
  ws.gYMin = yMin;
  ws.gUMin = 0;
  ws.gR2 = R2;
  // Block offsets ordered by ring (own tile first), so that searches shrink their radius early.
  let nOff = 0;
  for (let r = 0; r <= K; r++) {
    for (let di = -r; di <= r; di++) {
      for (let dj = -r; dj <= r; dj++) {
        if (Math.max(Math.abs(di), Math.abs(dj)) !== r) continue;
        ws.offY[nOff] = di;
        ws.offU[nOff] = dj;
        nOff++;
      }
    }
  }
  ws.gNOff = nOff;
  ws.gK = K;

  loadSlots(ws, n);
  for (let i = 0; i < n; i++) {
    setMomentumFactor(ws, i, i, p);
    sNN[i] = -1;
    sNND[i] = R2;
    rHead[i] = -1;
  }
  for (let i = n - 1; i >= 0; i--) tileInsert(ws, i, tileOf(ws, i, sPhi));
  for (let i = 0; i < n; i++) findNN(ws, i);
  for (let i = 0; i < n; i++) setDiJ(ws, i);
  treeBuild(ws, diJ, n);

  let active = n;
  while (active > 0) {
    let a = tree[1];
    let b = sNN[a];
    if (b >= 0 && a < b) {
      const t = a;
      a = b;
      b = t;
    }
    const hasB = b >= 0;
    // Detach a and b from the NN graph; the jets that had either as NN are collected in tmp.
    const nt = detachPair(ws, a, b);
    tileRemove(ws, a);
    killSlot(ws, a);
    active--;
    if (hasB) {
      const k = recombine(ws, sNode[a], sNode[b], track);
      tileRemove(ws, b);
      setSlot(ws, b, k);
      setMomentumFactor(ws, b, k, p);
      sNND[b] = R2;
      tileInsert(ws, b, tileOf(ws, b, sPhi));
    } else {
      ws.jets[ws.nJets++] = sNode[a];
    }

    // Jets that lost their NN search again (they may find the new jet).
    for (let q = 0; q < nt; q++) {
      const i = ws.tmp[q];
      findNN(ws, i);
      updateDiJ(ws, i);
    }
    if (hasB) scanNewJet(ws, b);
    if (ws.verify) verifyState(ws, n, (i) => ws.diJ[i] !== Infinity, R2, false);
  }
}

// ---------------------------------------------------------------------------------------------------------
// Grid strategy for Cambridge/Aachen with an infinite radius (the re-clustering of a jet into one tree).
//
// With p = 0 all momentum factors are 1, so diJ = ΔR² to the NN and the clustering merges, at each step, the
// geometrically closest pair. The jet's constituents occupy a compact (y, φ) region, tiled here by a grid in
// (y, u = φ − φ_ref folded into (−π, π]) (valid because the region is narrower than π/2 in φ, so |Δu| is the
// folded Δφ); tiles hold GRID_OCC jets on average and the grid is rebuilt, coarser, each time the number of jets
// has fallen by GRID_REBUILD. NN searches go ring by ring and stop when the ring's distance lower bound exceeds
// the best distance. A jet is "near" when its NN is closer than GRID_NEAR tile sides; the tiles keep an upper
// bound of their near jets' NN distances, and the other ("far") jets are kept in a list, so that the jets for
// which a new jet becomes the NN are found among the near tiles around it and in the far list.

const GRID_OCC = 2;
const GRID_NEAR = 1;
const GRID_REBUILD = 4;
/** Below this many particles the plain strategy is used (measured: the grid only pays off for large jets). */
export const GRID_MIN_PARTICLES = 400;

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
 * when the particles are spread over π/2 or more in φ (the plain strategy must then be used).
 */
function clusterGridCA(ws: ClusterWorkspace, track: boolean): boolean {
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
  if (!(uMax - uMin < PI / 2)) return false;
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
