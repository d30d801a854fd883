// Score distributions of the two samples on common bins, each normalised to unit weight, for drawing. The range
// is the 0.1 % to 99.9 % quantiles of both together (a display choice, common practice); what lies beyond it is
// counted per side so that nothing is dropped silently.
import { quantile, type RankedScores } from './ranked-scores';

export interface ScoreDistribution {
  edges: number[];
  /** Per sample: fraction of its weight in each bin, and the fractions below and above the range. */
  fractions: number[][];
  below: number[];
  above: number[];
}

const TAIL = 0.001;

export function scoreDistribution(samples: RankedScores[], binCount = 40): ScoreDistribution {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of samples) {
    if (s.score.length === 0) continue;
    lo = Math.min(lo, quantile(s, TAIL));
    hi = Math.max(hi, quantile(s, 1 - TAIL));
  }
  if (!(hi > lo)) {
    const centre = Number.isFinite(lo) ? lo : 0;
    lo = centre - 0.5;
    hi = centre + 0.5;
  }
  const step = (hi - lo) / binCount;
  const edges = Array.from({ length: binCount + 1 }, (_, k) => (k === binCount ? hi : lo + k * step));
  const fractions: number[][] = [];
  const below: number[] = [];
  const above: number[] = [];
  for (const s of samples) {
    const h = new Float64Array(binCount);
    let under = 0;
    let over = 0;
    for (let i = 0; i < s.score.length; i++) {
      const v = s.score[i];
      if (v < lo) under += s.weight[i];
      else if (v > hi) over += s.weight[i];
      else h[Math.min(binCount - 1, Math.floor((v - lo) / step))] += s.weight[i];
    }
    const norm = s.total > 0 ? s.total : 1;
    fractions.push(Array.from(h, (w) => w / norm));
    below.push(under / norm);
    above.push(over / norm);
  }
  return { edges, fractions, below, above };
}
