// ROC curve, AUC and background rejection at fixed signal efficiency for a score where larger means more
// signal-like (PHYSICS.md "Telling samples apart"). A jet passes a threshold t when its score is ≥ t; signal
// efficiency ε_S and background efficiency ε_B are weighted fractions, the rejection is 1/ε_B.
//
// AUC = P(score_S > score_B) + ½ P(score_S = score_B) (the Mann–Whitney form, exact with ties), from one merged
// sweep of the two ranked samples. Its standard error is Hanley and McNeil's, "The meaning and use of the area under
// a receiver operating characteristic (ROC) curve", Radiology 143 (1982) 29, eq. (2), with Kish effective counts for
// weighted jets. Rejection errors: binomial errors of ε_B, and of ε_S carried through the curve's local slope, added
// in quadrature (a first-order propagation; no single source).
import { effectiveCount, type RankedScores } from './ranked-scores';

export const WORKING_POINTS = [0.3, 0.5, 0.7] as const;
/** Points kept of a curve for drawing: one per this step of ε_S (plus both ends). */
const CURVE_STEP = 0.0025;

export interface RocPoint {
  /** Threshold: jets with score ≥ threshold pass. */
  threshold: number;
  signalEfficiency: number;
  backgroundEfficiency: number;
}

export interface WorkingPoint {
  signalEfficiency: number;
  /** Score threshold giving this signal efficiency (interpolated between the neighbouring thresholds). */
  threshold: number;
  backgroundEfficiency: number;
  backgroundEfficiencyError: number;
  /** 1/ε_B and its error; null when no background jet passes (then it is above `rejectionLowerLimit`). */
  rejection: number | null;
  rejectionError: number | null;
  rejectionLowerLimit: number | null;
}

export interface Roc {
  auc: number;
  aucError: number;
  /** The curve for drawing, ε_S rising (thinned to steps of CURVE_STEP in ε_S). */
  curve: RocPoint[];
  workingPoints: WorkingPoint[];
  signalJets: number;
  backgroundJets: number;
}

/** Hanley–McNeil (1982) eq. (2): SE of an AUC A from n_S signal ("abnormal") and n_B background ("normal") cases. */
export function hanleyMcNeilError(auc: number, nSignal: number, nBackground: number): number {
  if (!(nSignal > 0 && nBackground > 0)) return Number.NaN;
  const q1 = auc / (2 - auc);
  const q2 = (2 * auc * auc) / (1 + auc);
  const variance = (auc * (1 - auc) + (nSignal - 1) * (q1 - auc * auc) + (nBackground - 1) * (q2 - auc * auc)) / (nSignal * nBackground);
  return Math.sqrt(Math.max(0, variance));
}

/** Every distinct threshold's efficiencies, highest threshold first, and the AUC, from one merged sweep. */
function sweep(signal: RankedScores, background: RankedScores) {
  const s = signal.score;
  const b = background.score;
  const size = s.length + b.length;
  const thresholds = new Float64Array(size);
  const effS = new Float64Array(size);
  const effB = new Float64Array(size);
  let points = 0;
  // Walk both ascending lists from the top down: above(t) sums are what passes t.
  let i = s.length - 1;
  let k = b.length - 1;
  let passS = 0;
  let passB = 0;
  let aucSum = 0; // Σ over tied groups of w_S(v) · (W_B(> v) + ½ w_B(v)), i.e. signal ranked below background
  while (i >= 0 || k >= 0) {
    const v = i < 0 ? b[k] : k < 0 ? s[i] : Math.max(s[i], b[k]);
    let groupS = 0;
    let groupB = 0;
    while (i >= 0 && s[i] === v) groupS += signal.weight[i--];
    while (k >= 0 && b[k] === v) groupB += background.weight[k--];
    aucSum += groupS * (passB + 0.5 * groupB);
    passS += groupS;
    passB += groupB;
    thresholds[points] = v;
    effS[points] = passS / signal.total;
    effB[points] = passB / background.total;
    points++;
  }
  const auc = 1 - aucSum / (signal.total * background.total);
  return { thresholds: thresholds.subarray(0, points), effS: effS.subarray(0, points), effB: effB.subarray(0, points), auc };
}

/** The first index where the nondecreasing `values` reach `target` (its length − 1 when they never do). */
function firstReaching(values: Float64Array, target: number): number {
  let lo = 0;
  let hi = values.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (values[mid] >= target) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** Where ε_S first reaches `target` (interpolated), with the curve's slope dε_B/dε_S there. */
function workingPoint(target: number, curve: ReturnType<typeof sweep>, signal: RankedScores, background: RankedScores): WorkingPoint {
  const { thresholds, effS, effB } = curve;
  const at = firstReaching(effS, target);
  const e0 = at > 0 ? effS[at - 1] : 0;
  const b0 = at > 0 ? effB[at - 1] : 0;
  const t0 = at > 0 ? thresholds[at - 1] : thresholds[at];
  const f = effS[at] > e0 ? (target - e0) / (effS[at] - e0) : 1;
  const eB = b0 + f * (effB[at] - b0);
  const threshold = t0 + f * (thresholds[at] - t0);
  // Local slope over ±0.02 in ε_S, for carrying the signal efficiency's error into ε_B.
  const lo = firstReaching(effS, Math.max(0, target - 0.02));
  const hi = firstReaching(effS, Math.min(1, target + 0.02));
  const slope = effS[hi] > effS[lo] ? (effB[hi] - effB[lo]) / (effS[hi] - effS[lo]) : 0;
  const nB = effectiveCount(background);
  const nS = effectiveCount(signal);
  const varB = nB > 0 ? (eB * (1 - eB)) / nB : Number.NaN;
  const varS = nS > 0 ? (target * (1 - target)) / nS : Number.NaN;
  const errorB = Math.sqrt(Math.max(0, varB + slope * slope * varS));
  const passes = eB > 0;
  return {
    signalEfficiency: target,
    threshold,
    backgroundEfficiency: eB,
    backgroundEfficiencyError: errorB,
    rejection: passes ? 1 / eB : null,
    rejectionError: passes ? errorB / (eB * eB) : null,
    rejectionLowerLimit: passes ? null : background.total,
  };
}

/** The ROC of a signal and a background sample's ranked scores; a RangeError when either has no weight. */
export function rocOf(signal: RankedScores, background: RankedScores, targets: readonly number[] = WORKING_POINTS): Roc {
  if (!(signal.total > 0) || !(background.total > 0)) {
    throw new RangeError(`ROC: both samples need jets with positive total weight (signal ${signal.total}, background ${background.total})`);
  }
  const full = sweep(signal, background);
  const curve: RocPoint[] = [{ threshold: Infinity, signalEfficiency: 0, backgroundEfficiency: 0 }];
  let next = CURVE_STEP;
  const last = full.thresholds.length - 1;
  for (let p = 0; p <= last; p++) {
    if (full.effS[p] >= next || p === last) {
      curve.push({ threshold: full.thresholds[p], signalEfficiency: full.effS[p], backgroundEfficiency: full.effB[p] });
      while (next <= full.effS[p]) next += CURVE_STEP;
    }
  }
  return {
    auc: full.auc,
    aucError: hanleyMcNeilError(full.auc, effectiveCount(signal), effectiveCount(background)),
    curve,
    workingPoints: targets.map((t) => workingPoint(t, full, signal, background)),
    signalJets: signal.score.length,
    backgroundJets: background.score.length,
  };
}

/** ε_S, ε_B of a fixed threshold (jets with score ≥ threshold pass), each with its binomial error. */
export function efficiencyAt(ranked: RankedScores, threshold: number): { efficiency: number; error: number } {
  let pass = 0;
  // Ascending: find the first score ≥ threshold by bisection.
  let lo = 0;
  let hi = ranked.score.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (ranked.score[mid] >= threshold) hi = mid;
    else lo = mid + 1;
  }
  for (let i = lo; i < ranked.score.length; i++) pass += ranked.weight[i];
  const efficiency = ranked.total > 0 ? pass / ranked.total : Number.NaN;
  const n = effectiveCount(ranked);
  return { efficiency, error: n > 0 ? Math.sqrt((efficiency * (1 - efficiency)) / n) : Number.NaN };
}
