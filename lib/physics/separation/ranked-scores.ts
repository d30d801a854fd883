// Scores of one sample in ascending order with their weights: what the ROC sweep, the working points and the score
// distributions read. Typed arrays throughout, sorted by a radix sort (a million jets in tens of milliseconds).

export interface RankedScores {
  /** Ascending; NaN scores are left out. */
  score: Float64Array;
  /** Weight of each score above, in the same order. */
  weight: Float64Array;
  /** Σw, and Σw² (for effective counts and binomial errors). */
  total: number;
  total2: number;
}

const RADIX_BITS = 11;
const RADIX = 1 << RADIX_BITS;

/**
 * The order that sorts `values` ascending. The IEEE-754 bits are made order-preserving (sign bit flipped for
 * positive numbers, every bit for negative ones); an LSD radix sort orders the high 32 bits in three passes of
 * 11 bits (a pass over bits no value changes is skipped), the keys moving with the order so that every pass reads
 * in sequence; then each run of equal high words is put in order of the low words by insertion (such runs are
 * exact ties or values within a relative 1e-6 of each other: short, or already in order). Typed-array sort takes
 * hundreds of ms for 10^6 values on a loaded machine; this is linear. Values must not be NaN; −0 sorts before +0.
 * Equal values keep their input order.
 */
export function ascendingOrder(values: Float64Array): Uint32Array {
  const n = values.length;
  const bits = new Uint32Array(values.buffer, values.byteOffset, n * 2);
  let lo = new Uint32Array(n);
  let hi = new Uint32Array(n);
  let order = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    const h = bits[2 * i + 1];
    const negative = h >>> 31;
    lo[i] = negative ? ~bits[2 * i] >>> 0 : bits[2 * i];
    hi[i] = negative ? ~h >>> 0 : (h | 0x80000000) >>> 0;
    order[i] = i;
  }
  let lo2 = new Uint32Array(n);
  let hi2 = new Uint32Array(n);
  let order2 = new Uint32Array(n);
  const counts = new Uint32Array(RADIX);
  const digits = new Uint16Array(n);
  const mask = RADIX - 1;
  for (let shift = 0; shift < 32; shift += RADIX_BITS) {
    for (let i = 0; i < n; i++) digits[i] = (hi[i] >>> shift) & mask;
    counts.fill(0);
    for (let i = 0; i < n; i++) counts[digits[i]]++;
    if (n === 0 || counts[digits[0]] === n) continue; // every value has this digit
    let sum = 0;
    for (let d = 0; d < RADIX; d++) {
      const c = counts[d];
      counts[d] = sum;
      sum += c;
    }
    for (let i = 0; i < n; i++) {
      const to = counts[digits[i]]++;
      lo2[to] = lo[i];
      hi2[to] = hi[i];
      order2[to] = order[i];
    }
    [lo, lo2, hi, hi2, order, order2] = [lo2, lo, hi2, hi, order2, order];
  }
  // Insertion by the low word inside each run of equal high words (stable: only strictly larger ones move).
  for (let i = 1; i < n; i++) {
    if (hi[i] !== hi[i - 1] || lo[i] >= lo[i - 1]) continue;
    const l = lo[i];
    const o = order[i];
    let k = i;
    while (k > 0 && hi[k - 1] === hi[i] && lo[k - 1] > l) {
      lo[k] = lo[k - 1];
      order[k] = order[k - 1];
      k--;
    }
    lo[k] = l;
    order[k] = o;
  }
  return order;
}

/** Ranks scores with their weights (null: every weight is 1). */
export function rankScores(scores: Float64Array, weights: ArrayLike<number> | null): RankedScores {
  const n = scores.length;
  let finite = 0;
  for (let i = 0; i < n; i++) if (!Number.isNaN(scores[i])) finite++;
  // The common case, one weight for every jet, needs no weights carried through the sort.
  let uniform: number | null = weights === null ? 1 : n > 0 ? weights[0] : 1;
  if (weights !== null) for (let i = 1; i < n && uniform !== null; i++) if (weights[i] !== uniform) uniform = null;
  const kept = finite === n ? scores : new Float64Array(finite);
  const keptWeight = uniform === null ? new Float64Array(finite) : null;
  for (let i = 0, k = 0; i < n; i++) {
    if (Number.isNaN(scores[i])) continue;
    if (kept !== scores) kept[k] = scores[i];
    if (keptWeight) keptWeight[k] = weights![i];
    k++;
  }
  const order = ascendingOrder(kept);
  const score = new Float64Array(finite);
  const weight = new Float64Array(finite);
  for (let i = 0; i < finite; i++) score[i] = kept[order[i]];
  if (keptWeight) for (let i = 0; i < finite; i++) weight[i] = keptWeight[order[i]];
  else weight.fill(uniform!);
  let total = 0;
  let total2 = 0;
  for (let i = 0; i < finite; i++) {
    total += weight[i];
    total2 += weight[i] * weight[i];
  }
  return { score, weight, total, total2 };
}

/** Kish's effective number of entries (Σw)²/Σw²: the count that binomial and AUC errors use for weighted jets. */
export function effectiveCount(ranked: RankedScores): number {
  return ranked.total2 > 0 ? (ranked.total * ranked.total) / ranked.total2 : 0;
}

/** The score below which a fraction q of the weight lies (q in [0, 1]); NaN for an empty sample. */
export function quantile(ranked: RankedScores, q: number): number {
  const n = ranked.score.length;
  if (n === 0) return Number.NaN;
  let running = 0;
  for (let i = 0; i < n; i++) {
    running += ranked.weight[i];
    if (running >= q * ranked.total) return ranked.score[i];
  }
  return ranked.score[n - 1];
}
