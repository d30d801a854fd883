// The engine's hot path: one record's particles → selected jets → C/A tree → splittings and observables.
// (PHYSICS.md "Jet clustering", "Declustering and the emission plane", "Derived jet observables".)
//
// Scratch memory is module-level and only grows, so processing a stream of records allocates nothing but the
// results themselves. A jet's splittings (and full tree) are views of a shared chunk of results rather than arrays
// of their own: a typed array of its own costs a separate backing store, counted by V8 as external memory, which
// drives extra garbage collections. A chunk is freed once no view of it is left.

import { ClusterWorkspace, algorithmExponent, cluster, loadConstituents, loadParticles } from './clustering';
import { clusterExclusive } from './clustering/exclusive';
import { declusterAll, declusterPrimary, reclusterCA, writeSplitting, type PrimaryEnd, type SplittingWriter } from './decluster';
import { hasRealConstituent, jetFlavour, type GhostTags } from './flavour';
import { primaryMultiplicity, softDrop } from './observables';
import type { JetResult, ProcessSettings, RecordResult } from './types';
import { SPLIT_STRIDE } from './types';

const finder = new ClusterWorkspace();
const recl = new ClusterWorkspace();
let splitBuf = new Float64Array(256 * SPLIT_STRIDE);
let stack = new Int32Array(512);
let candNode = new Int32Array(64);
let candKt2 = new Float64Array(64);
const primaryEnd: PrimaryEnd = { node: -1 };

/** Doubles in a chunk of results (256 KiB). */
const RESULT_CHUNK = 1 << 15;
let results = new Float64Array(RESULT_CHUNK);
let resultsUsed = 0;

/** A copy of splitBuf[0, n) in the current chunk of results (a new chunk when it is full). */
function keepSplittings(n: number): Float64Array {
  if (resultsUsed + n > results.length) {
    results = new Float64Array(Math.max(RESULT_CHUNK, n));
    resultsUsed = 0;
  }
  const at = resultsUsed;
  const out = results.subarray(at, at + n);
  for (let i = 0; i < n; i++) out[i] = splitBuf[i];
  resultsUsed += n;
  return out;
}

function ensureScratch(n: number): void {
  if (splitBuf.length < n * SPLIT_STRIDE) splitBuf = new Float64Array(Math.max(n, 2 * (splitBuf.length / SPLIT_STRIDE)) * SPLIT_STRIDE);
  if (stack.length < 2 * (n + 1)) stack = new Int32Array(Math.max(2 * (n + 1), 2 * stack.length));
}

/**
 * Declusters the tree in `tree` (the C/A re-clustering; e+e-: its own writer) rooted at `root` and fills a
 * JetResult with the given jet kinematics.
 */
export function jetFromTree(
  root: number, nConst: number, pt: number, y: number, phi: number, m: number, s: ProcessSettings,
  tree: ClusterWorkspace = recl, write: SplittingWriter = writeSplitting,
): JetResult {
  ensureScratch(nConst);
  const np = declusterPrimary(tree, root, splitBuf, 0, write, primaryEnd);
  const primary = keepSplittings(np * SPLIT_STRIDE);
  let all: Float64Array | null = null;
  if (s.fullTree) {
    const na = declusterAll(tree, root, splitBuf, 0, stack, write);
    all = keepSplittings(na * SPLIT_STRIDE);
  }
  return {
    pt, y, phi, m, n: nConst,
    primary,
    all,
    softDrop: softDrop(primary, np, s.softDrop, signedMass(tree, primaryEnd.node)),
    multiplicity: primaryMultiplicity(primary, np, s.multiplicityKtCut),
  };
}

export function signedMass(ws: ClusterWorkspace, k: number): number {
  const px = ws.px[k], py = ws.py[k], pz = ws.pz[k], e = ws.E[k];
  const m2 = (e + pz) * (e - pz) - (px * px + py * py);
  return m2 >= 0 ? Math.sqrt(m2) : -Math.sqrt(-m2);
}

/**
 * Processes one record. `p` holds px, py, pz, E interleaved (GeV, already validated by the reader).
 * content 'events': jets are found with s.jet, then cut in this order: pt > ptMin, |y| < yMax, at most maxJets
 * leading jets (rejections are counted by the first cut that fails); the kept jets are sorted by pt, descending
 * (exact ties: last found first, as FastJet). content 'jets': the record is one jet (the C/A
 * tree of all its particles; its four-momentum is the root's), the pt and |y| cuts still apply.
 * Each kept jet is re-clustered with C/A, declustered (primary sequence, and the full tree if s.fullTree), and
 * gets its SoftDrop and primary multiplicity.
 * Exclusive jets (s.jet.exclusive) replace the inclusive ones. With `tags`, the particles from tags.from on are
 * flavour ghosts (flavour.ts): jets made of ghosts alone are no jets, ghosts are not re-clustered, and each jet
 * gets its flavour.
 */
export function processParticles(p: Float64Array, s: ProcessSettings, tags?: GhostTags): RecordResult {
  const n = p.length >> 2;
  const jets: JetResult[] = [];
  const rejected = { pt: 0, y: 0, rank: 0 };
  if (n === 0) return { jets, rejected };
  const { ptMin, yMax } = s.jet;
  const maxJets = s.jet.maxJets == null ? Infinity : s.jet.maxJets;

  if (s.content === 'jets') {
    loadParticles(recl, p, n);
    const root = reclusterCA(recl);
    const pt = Math.sqrt(recl.kt2[root]);
    const y = recl.rap[root];
    if (!(pt > ptMin)) rejected.pt++;
    else if (!(Math.abs(y) < yMax)) rejected.y++;
    else if (maxJets < 1) rejected.rank++;
    else jets.push(jetFromTree(root, n, pt, y, recl.phi[root], signedMass(recl, root), s));
    return { jets, rejected };
  }

  loadParticles(finder, p, n);
  const exclusive = s.jet.exclusive;
  if (exclusive) clusterExclusive(finder, { kind: 'hadron', p: algorithmExponent(s.jet.algorithm), R: s.jet.R }, exclusive);
  else cluster(finder, { p: algorithmExponent(s.jet.algorithm), R: s.jet.R, trackConstituents: true });
  const nj = finder.nJets;
  if (candNode.length < nj) {
    candNode = new Int32Array(Math.max(nj, 2 * candNode.length));
    candKt2 = new Float64Array(candNode.length);
  }
  // Cuts pt, |y|; insertion into a list sorted by pt² descending. Jets are taken last-found first and the
  // insertion is stable, which orders exactly equal pt as FastJet does (inclusive_jets() walks the history
  // backwards, and sorted_by_pt's std::sort is an insertion sort below 16 jets).
  let nc = 0;
  for (let j = nj - 1; j >= 0; j--) {
    const k = finder.jets[j];
    if (tags && !hasRealConstituent(finder, k, tags)) continue;
    const k2 = finder.kt2[k];
    if (!(Math.sqrt(k2) > ptMin)) {
      rejected.pt++;
      continue;
    }
    if (!(Math.abs(finder.rap[k]) < yMax)) {
      rejected.y++;
      continue;
    }
    let i = nc++;
    while (i > 0 && candKt2[i - 1] < k2) {
      candKt2[i] = candKt2[i - 1];
      candNode[i] = candNode[i - 1];
      i--;
    }
    candKt2[i] = k2;
    candNode[i] = k;
  }
  const keep = nc < maxJets ? nc : maxJets;
  rejected.rank = nc - keep;
  for (let i = 0; i < keep; i++) {
    const k = candNode[i];
    const nConst = loadConstituents(recl, finder, k, tags ? tags.from : Infinity);
    const root = reclusterCA(recl);
    const jet = jetFromTree(root, nConst, Math.sqrt(finder.kt2[k]), finder.rap[k], finder.phi[k], signedMass(finder, k), s);
    if (tags) jet.flavour = jetFlavour(finder, k, tags);
    jets.push(jet);
  }
  return { jets, rejected };
}
