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

interface SweepPoint {
  threshold: number;
  s: number;
  b: number;
}

/** The point before and the first point at or above an ε_S level, as the sweep met them. */
interface Crossing {
  before: SweepPoint;
  after: SweepPoint;
}

/**
 * One merged sweep of the two ranked samples from the highest score down, one point per distinct threshold, kept
 * only where needed (no arrays of every point): the AUC, the curve thinned to steps of CURVE_STEP in ε_S, and the
 * crossing of each of `levels` (ascending ε_S values).
 */
function sweep(signal: RankedScores, background: RankedScores, levels: number[]) {
  const s = signal.score;
  const b = background.score;
  const curve: RocPoint[] = [{ threshold: Infinity, signalEfficiency: 0, backgroundEfficiency: 0 }];
  const crossings: Array<Crossing | null> = levels.map(() => null);
  let level = 0;
  let next = CURVE_STEP;
  // The previous point as scalars (no object per threshold in this loop).
  let previousT = Number.NaN;
  let previousS = 0;
  let previousB = 0;
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
    const effS = passS / signal.total;
    const effB = passB / background.total;
    while (level < levels.length && effS >= levels[level]) {
      const before = Number.isNaN(previousT) ? { threshold: v, s: 0, b: 0 } : { threshold: previousT, s: previousS, b: previousB };
      crossings[level++] = { before, after: { threshold: v, s: effS, b: effB } };
    }
    if (effS >= next || (i < 0 && k < 0)) {
      curve.push({ threshold: v, signalEfficiency: effS, backgroundEfficiency: effB });
      while (next <= effS) next += CURVE_STEP;
    }
    previousT = v;
    previousS = effS;
    previousB = effB;
  }
  // Rounding can leave the last ε_S a hair below 1: levels never reached cross at the last point.
  const last: SweepPoint = { threshold: previousT, s: previousS, b: previousB };
  const reached = crossings.map((c) => c ?? { before: last, after: last });
  return { auc: 1 - aucSum / (signal.total * background.total), curve, crossings: reached };
}

/** The working point at `target` from its crossing (interpolated) and the crossings ±0.02 in ε_S (the local slope). */
function workingPoint(target: number, at: Crossing, lo: Crossing, hi: Crossing, signal: RankedScores, background: RankedScores): WorkingPoint {
  const { before, after } = at;
  const f = after.s > before.s ? (target - before.s) / (after.s - before.s) : 1;
  const eB = before.b + f * (after.b - before.b);
  const threshold = before.threshold + f * (after.threshold - before.threshold);
  const slope = hi.after.s > lo.after.s ? (hi.after.b - lo.after.b) / (hi.after.s - lo.after.s) : 0;
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
  // Each target with its neighbours ±0.02, sorted for the sweep.
  const wanted = targets.map((t) => [t, Math.max(0, t - 0.02), Math.min(1, t + 0.02)]);
  const levels = [...new Set(wanted.flat())].sort((x, y) => x - y);
  const { auc, curve, crossings } = sweep(signal, background, levels);
  const crossing = (level: number) => crossings[levels.indexOf(level)];
  return {
    auc,
    aucError: hanleyMcNeilError(auc, effectiveCount(signal), effectiveCount(background)),
    curve,
    workingPoints: wanted.map(([t, lo, hi]) => workingPoint(t, crossing(t), crossing(lo), crossing(hi), signal, background)),
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
