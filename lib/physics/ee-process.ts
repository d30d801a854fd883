// One e+e- record (PHYSICS.md "Lepton-collider (e+e-) events"): jets found in energy and angle with Durham
// (exclusive n jets or y_cut), e+e- Cambridge (y_cut) or the generalised e+e- kt algorithm with a radius
// (inclusive); kept by energy (E > eMin, then at most maxJets leading jets; rejections are counted as the
// energy cut ("pt" slot of the counts) and rank); sorted by energy, descending; each jet re-clustered with the
// e+e- Cambridge algorithm into one angular-ordered tree and declustered in θ, kt = E_b sin θ, z = E_b/(E_a+E_b).
// Sources: Durham, Phys. Lett. B269 (1991) 432; Cambridge, arXiv:hep-ph/9707323; ee_genkt, FastJet manual
// arXiv:1111.6097.

import { ClusterWorkspace, loadConstituents, loadParticles } from './clustering';
import { clusterEeCambridge } from './clustering/ee-cambridge';
import { clusterExclusive } from './clustering/exclusive';
import { clusterStepwise, StepHistory } from './clustering/stepwise';
import { writeSplittingEe } from './ee-decluster';
import { hasRealConstituent, jetFlavour, type GhostTags } from './flavour';
import { jetFromTree, signedMass } from './process';
import type { JetResult, ProcessSettings, RecordResult } from './types';

const finder = new ClusterWorkspace();
const tree = new ClusterWorkspace();
const history = new StepHistory();
let candNode = new Int32Array(64);
let candE = new Float64Array(64);

/** Finds the event's jets into finder.jets (taken last to first by the selection, as FastJet's lists). */
function findEeJets(s: ProcessSettings): void {
  const ee = s.ee!;
  const ex = s.jet.exclusive;
  if (ee.algorithm === 'durham') {
    if (!ex || 'dcut' in ex) throw new Error('Durham jets need exclusive {"n"} or {"ycut"}');
    clusterExclusive(finder, { kind: 'durham' }, ex);
  } else if (ee.algorithm === 'cambridge') {
    if (!ex || !('ycut' in ex)) throw new Error('e+e- Cambridge jets need exclusive {"ycut"}');
    clusterEeCambridge(finder, ex.ycut);
  } else {
    clusterStepwise(finder, { kind: 'ee-genkt', p: ee.p, R: s.jet.R }, history);
  }
}

/** Re-clusters the particles loaded in `tree` into one e+e- Cambridge tree and declusters it. */
function declustered(nConst: number, src: ClusterWorkspace, k: number, s: ProcessSettings): JetResult {
  clusterEeCambridge(tree, Infinity);
  const root = tree.jets[0];
  const jet = jetFromTree(root, nConst, Math.sqrt(src.kt2[k]), src.rap[k], src.phi[k], signedMass(src, k), s, tree, writeSplittingEe);
  jet.E = src.E[k];
  jet.theta = Math.atan2(Math.sqrt(src.kt2[k]), src.pz[k]);
  return jet;
}

export function processEeParticles(p: Float64Array, s: ProcessSettings, tags?: GhostTags): RecordResult {
  const n = p.length >> 2;
  const jets: JetResult[] = [];
  const rejected = { pt: 0, y: 0, rank: 0 };
  if (n === 0) return { jets, rejected };
  const eMin = s.ee!.eMin;
  const maxJets = s.jet.maxJets == null ? Infinity : s.jet.maxJets;

  if (s.content === 'jets') {
    loadParticles(tree, p, n);
    clusterEeCambridge(tree, Infinity);
    const root = tree.jets[0];
    if (!(tree.E[root] > eMin)) rejected.pt++;
    else if (maxJets < 1) rejected.rank++;
    else {
      const jet = jetFromTree(root, n, Math.sqrt(tree.kt2[root]), tree.rap[root], tree.phi[root], signedMass(tree, root), s, tree, writeSplittingEe);
      jet.E = tree.E[root];
      jet.theta = Math.atan2(Math.sqrt(tree.kt2[root]), tree.pz[root]);
      jets.push(jet);
    }
    return { jets, rejected };
  }

  loadParticles(finder, p, n);
  findEeJets(s);
  const nj = finder.nJets;
  if (candNode.length < nj) {
    candNode = new Int32Array(Math.max(nj, 2 * candNode.length));
    candE = new Float64Array(candNode.length);
  }
  // Energy cut, then a stable insertion by energy, descending (jets taken last to first, as FastJet lists them).
  let nc = 0;
  for (let j = nj - 1; j >= 0; j--) {
    const k = finder.jets[j];
    if (tags && !hasRealConstituent(finder, k, tags)) continue;
    const e = finder.E[k];
    if (!(e > eMin)) {
      rejected.pt++;
      continue;
    }
    let i = nc++;
    while (i > 0 && candE[i - 1] < e) {
      candE[i] = candE[i - 1];
      candNode[i] = candNode[i - 1];
      i--;
    }
    candE[i] = e;
    candNode[i] = k;
  }
  const keep = nc < maxJets ? nc : maxJets;
  rejected.rank = nc - keep;
  for (let i = 0; i < keep; i++) {
    const k = candNode[i];
    const nConst = loadConstituents(tree, finder, k, tags ? tags.from : Infinity);
    const jet = declustered(nConst, finder, k, s);
    if (tags) jet.flavour = jetFlavour(finder, k, tags);
    jets.push(jet);
  }
  return { jets, rejected };
}
