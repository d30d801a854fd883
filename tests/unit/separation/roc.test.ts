// ROC, AUC and working points against textbook cases (PHYSICS.md "Telling samples apart"):
// - the binormal model: two normal score distributions of equal width separated by d widths have AUC = Φ(d/√2),
//   and at the signal median the background efficiency is 1 − Φ(d);
// - the AUC's standard error of Hanley and McNeil, Radiology 143 (1982) 29, eq. (2), against the spread of the AUC
//   over independent repetitions (their formula assumes exponential-like score distributions, so agreement within
//   15 % is what is expected for the binormal case; the tolerance is ours);
// - the Mann–Whitney form of the AUC with ties, counted pair by pair on small samples.
// Φ is computed with Abramowitz and Stegun, Handbook of Mathematical Functions (1964), 7.1.26 (|error| < 1.5e-7).
import { describe, expect, it } from 'vitest';
import { Rng } from '@/lib/physics/random';
import { rankScores } from '@/lib/physics/separation/ranked-scores';
import { efficiencyAt, hanleyMcNeilError, rocOf } from '@/lib/physics/separation/roc';

function erf(x: number): number {
  const t = 1 / (1 + 0.3275911 * Math.abs(x));
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x);
  return x >= 0 ? y : -y;
}
const phi = (x: number) => 0.5 * (1 + erf(x / Math.SQRT2));

function normals(rng: Rng, n: number, mean: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = mean + rng.normal();
  return out;
}

describe('ROC of the binormal model', () => {
  for (const d of [0.5, 1, 2]) {
    it(`AUC = Φ(d/√2) for d = ${d}, and ε_B at ε_S = 50 % is 1 − Φ(d)`, () => {
      const rng = new Rng(7 + d * 10);
      const n = 100_000;
      const roc = rocOf(rankScores(normals(rng, n, d), null), rankScores(normals(rng, n, 0), null));
      const expected = phi(d / Math.SQRT2);
      expect(Math.abs(roc.auc - expected)).toBeLessThan(4 * roc.aucError);
      expect(roc.aucError).toBeCloseTo(hanleyMcNeilError(roc.auc, n, n), 12);
      const half = roc.workingPoints.find((w) => w.signalEfficiency === 0.5)!;
      expect(Math.abs(half.backgroundEfficiency - (1 - phi(d)))).toBeLessThan(4 * half.backgroundEfficiencyError);
      expect(half.threshold).toBeCloseTo(d, 1);
      expect(half.rejection).toBeCloseTo(1 / half.backgroundEfficiency, 10);
      expect(half.rejectionError!).toBeCloseTo(half.backgroundEfficiencyError / half.backgroundEfficiency ** 2, 10);
    });
  }

  it('the Hanley–McNeil error matches the spread of the AUC over independent repetitions', () => {
    const rng = new Rng(11);
    const n = 400;
    const aucs: number[] = [];
    let predicted = 0;
    for (let r = 0; r < 400; r++) {
      const roc = rocOf(rankScores(normals(rng, n, 1), null), rankScores(normals(rng, n, 0), null));
      aucs.push(roc.auc);
      predicted += roc.aucError / 400;
    }
    const mean = aucs.reduce((a, b) => a + b, 0) / aucs.length;
    const spread = Math.sqrt(aucs.reduce((a, b) => a + (b - mean) ** 2, 0) / (aucs.length - 1));
    expect(Math.abs(predicted / spread - 1)).toBeLessThan(0.15);
  });

  it('the curve rises from (0, 0) to (1, 1) and passes the working points', () => {
    const rng = new Rng(3);
    const roc = rocOf(rankScores(normals(rng, 5000, 1), null), rankScores(normals(rng, 5000, 0), null));
    expect(roc.curve[0]).toMatchObject({ signalEfficiency: 0, backgroundEfficiency: 0 });
    expect(roc.curve.at(-1)).toMatchObject({ signalEfficiency: 1, backgroundEfficiency: 1 });
    for (let i = 1; i < roc.curve.length; i++) {
      expect(roc.curve[i].signalEfficiency).toBeGreaterThanOrEqual(roc.curve[i - 1].signalEfficiency);
      expect(roc.curve[i].backgroundEfficiency).toBeGreaterThanOrEqual(roc.curve[i - 1].backgroundEfficiency);
    }
    expect(roc.curve.length).toBeLessThan(420);
    expect(roc.workingPoints.map((w) => w.signalEfficiency)).toEqual([0.3, 0.5, 0.7]);
  });
});

describe('AUC with ties and weights (Mann–Whitney, counted pair by pair)', () => {
  const pairwise = (s: number[], ws: number[], b: number[], wb: number[]) => {
    let sum = 0;
    for (let i = 0; i < s.length; i++) for (let k = 0; k < b.length; k++) sum += ws[i] * wb[k] * (s[i] > b[k] ? 1 : s[i] === b[k] ? 0.5 : 0);
    return sum / (ws.reduce((a, c) => a + c, 0) * wb.reduce((a, c) => a + c, 0));
  };

  it('integer scores with many ties, unit weights', () => {
    const rng = new Rng(5);
    const s = Array.from({ length: 300 }, () => rng.int(0, 8));
    const b = Array.from({ length: 250 }, () => rng.int(0, 6));
    const ones = (n: number) => Array.from({ length: n }, () => 1);
    const roc = rocOf(rankScores(Float64Array.from(s), null), rankScores(Float64Array.from(b), null));
    expect(roc.auc).toBeCloseTo(pairwise(s, ones(300), b, ones(250)), 12);
  });

  it('weighted jets', () => {
    const rng = new Rng(6);
    const s = Array.from({ length: 200 }, () => rng.int(0, 5));
    const b = Array.from({ length: 200 }, () => rng.int(0, 4));
    const ws = s.map(() => rng.uniform(0.2, 2));
    const wb = b.map(() => rng.uniform(0.2, 2));
    const roc = rocOf(rankScores(Float64Array.from(s), ws), rankScores(Float64Array.from(b), wb));
    expect(roc.auc).toBeCloseTo(pairwise(s, ws, b, wb), 12);
  });

  it('NaN scores are left out; a sample without weight is refused', () => {
    const ranked = rankScores(Float64Array.from([1, Number.NaN, 2]), null);
    expect(Array.from(ranked.score)).toEqual([1, 2]);
    expect(() => rocOf(rankScores(new Float64Array(0), null), ranked)).toThrow(/positive total weight/);
  });

  it('efficiency at a fixed threshold counts scores ≥ the threshold', () => {
    const ranked = rankScores(Float64Array.from([0, 1, 1, 2, 3]), null);
    expect(efficiencyAt(ranked, 1).efficiency).toBeCloseTo(0.8, 12);
    expect(efficiencyAt(ranked, 1.5).efficiency).toBeCloseTo(0.4, 12);
    expect(efficiencyAt(ranked, 1.5).error).toBeCloseTo(Math.sqrt((0.4 * 0.6) / 5), 12);
  });
});

describe('ranking scores', () => {
  it('sorts like a comparison sort: negatives, zeros, infinities, ties, with weights following their scores', () => {
    const rng = new Rng(9);
    const values = [-Infinity, Infinity, 0, -0, 1e-300, -1e-300, 5, 5, -5, 3.25, 1e12, -1e12];
    for (let i = 0; i < 2000; i++) values.push(rng.normal() * 10 ** rng.int(-5, 5), rng.int(-3, 3));
    const weights = values.map((_, i) => i + 1);
    const ranked = rankScores(Float64Array.from(values), weights);
    for (let i = 1; i < values.length; i++) {
      expect(ranked.score[i]).toBeGreaterThanOrEqual(ranked.score[i - 1]);
      // Equal scores keep their input order (−0 sorts before +0: the sort reads the bits).
      if (Object.is(ranked.score[i], ranked.score[i - 1])) expect(ranked.weight[i]).toBeGreaterThan(ranked.weight[i - 1]);
    }
    // Each weight sits beside its own score, and nothing is lost.
    for (let i = 0; i < values.length; i++) expect(Object.is(values[ranked.weight[i] - 1], ranked.score[i])).toBe(true);
    expect(ranked.total).toBe(weights.reduce((a, b) => a + b, 0));
  });
});
