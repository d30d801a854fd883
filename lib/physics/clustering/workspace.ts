// The clustering workspace: pseudojets (the nodes of the clustering history) and the scratch arrays of every
// strategy's nearest-neighbour bookkeeping, all in typed arrays that are reused from one event to the next (no
// allocation per step), plus loading particles or a jet's constituents as input nodes with their kinematics
// computed exactly as FastJet 3.4 computes them (FastJet manual, arXiv:1111.6097).

import { FJ_MAX_RAP, TWO_PI } from '../fourvector';

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
  /** Block offsets of the tiled strategy, ring by ring: (2K+1)² ≤ 49 for K ≤ 3. */
  offY = new Int32Array(49);
  offU = new Int32Array(49);
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
  /** Tiles are at least R/tileRings wide (1 to 3); 0 = chosen from the particle density (see TILE_DENSE). */
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
 * as the particles of `dst`, copying their kinematics. Needs src's constituent lists. Particles numbered from
 * `below` on (flavour ghosts) are left out. Returns the count loaded.
 */
export function loadConstituents(dst: ClusterWorkspace, src: ClusterWorkspace, jet: number, below = Infinity): number {
  dst.ensure(src.count[jet]);
  const { px, py, pz, E, kt2, rap, phi, parent1, parent2, first, last, count, next } = dst;
  let n = 0;
  // The count bounds the walk: the list of a node that was merged further continues into its partner's.
  for (let left = src.count[jet], c = src.first[jet]; left > 0; left--, c = src.next[c]) {
    if (c >= below) continue;
    const i = n++;
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
  }
  dst.n = n;
  dst.nNodes = n;
  dst.nJets = 0;
  return n;
}
