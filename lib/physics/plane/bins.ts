// Uniform bins of one plane coordinate, their ranges fitted to a sample, and where a value falls.

/** Bins of width `step` from `min` to `max` (max − min a whole number of steps). */
export interface AxisBins {
  min: number;
  max: number;
  step: number;
  count: number;
}

/** Bounds the size of a map (and of a hover-able figure): at most this many bins per axis. */
export const MAX_BINS_PER_AXIS = 400;
const EDGE_TOLERANCE = 1e-9;

/** Bins from min to max of width step; a RangeError names what is wrong. */
export function axisBins(min: number, max: number, step: number, name = 'axis'): AxisBins {
  if (!Number.isFinite(min) || !Number.isFinite(max) || !(max > min)) {
    throw new RangeError(`${name}: the range needs finite min < max (got ${min} to ${max})`);
  }
  if (!Number.isFinite(step) || !(step > 0)) throw new RangeError(`${name}: the bin size must be a positive number (got ${step})`);
  const exact = (max - min) / step;
  const count = Math.round(exact);
  if (Math.abs(exact - count) > EDGE_TOLERANCE * Math.max(1, exact)) {
    throw new RangeError(`${name}: the range ${min} to ${max} is not a whole number of bins of ${step}`);
  }
  if (count > MAX_BINS_PER_AXIS) {
    throw new RangeError(
      `${name}: ${count} bins of ${step} from ${min} to ${max} are more than ${MAX_BINS_PER_AXIS}; choose bins of at least ${
        Math.ceil(((max - min) / MAX_BINS_PER_AXIS) * 1000) / 1000
      } or a narrower range`,
    );
  }
  return { min, max, step, count };
}

/** Edges min + k · step, rounded to 12 significant digits so that 0.2-wide edges read 1, not 1.0000000000000002. */
export function binEdges(bins: AxisBins): Float64Array {
  const edges = new Float64Array(bins.count + 1);
  for (let k = 0; k <= bins.count; k++) edges[k] = Number((bins.min + k * bins.step).toPrecision(12));
  edges[bins.count] = bins.max;
  return edges;
}

/** Index of the bin holding v; BELOW, ABOVE, or UNDEFINED_VALUE (NaN, ±∞ count as undefined). */
export const BELOW = -1;
export const ABOVE = -2;
export const UNDEFINED_VALUE = -3;

export function binOf(bins: AxisBins, v: number): number {
  if (!Number.isFinite(v)) return v === -Infinity ? BELOW : v === Infinity ? ABOVE : UNDEFINED_VALUE;
  const i = Math.floor((v - bins.min) / bins.step);
  if (i < 0) return BELOW;
  if (i >= bins.count) return v === bins.max ? bins.count - 1 : ABOVE;
  return i;
}

/** Rounds a value to a multiple of step (removing floating-point dust such as 0.30000000000000004). */
function onGrid(k: number, step: number): number {
  return Number((k * step).toPrecision(12));
}

/**
 * The smallest range of whole bins of `step`, anchored at 0, that holds [lo, hi]; an empty extent (no values)
 * gives the one bin [0, step).
 */
export function fittedBins(lo: number, hi: number, step: number, name = 'axis'): AxisBins {
  if (!(Number.isFinite(lo) && Number.isFinite(hi) && hi >= lo)) return axisBins(0, step, step, name);
  let first = Math.floor(lo / step + EDGE_TOLERANCE);
  let last = Math.ceil(hi / step - EDGE_TOLERANCE);
  if (last <= first) last = first + 1;
  const count = last - first;
  if (count > MAX_BINS_PER_AXIS) {
    // Keep the bin size asked for and centre the allowed number of bins on the middle of the extent.
    const middle = Math.round((first + last) / 2);
    first = middle - Math.floor(MAX_BINS_PER_AXIS / 2);
    last = first + MAX_BINS_PER_AXIS;
  }
  return axisBins(onGrid(first, step), onGrid(last, step), step, name);
}

/** The central part of a weighted distribution: values between its `tail` and 1 − `tail` quantiles. */
export interface Extent {
  lo: number;
  hi: number;
}

/** Share of splittings left outside a fitted range at each end (common practice for display ranges). */
export const FIT_TAIL = 0.0005;

/** Quantile extent of a histogram of `cells` equal cells from min to max holding `total`. */
export function extentOfHistogram(histogram: ArrayLike<number>, min: number, max: number, total: number, tail = FIT_TAIL): Extent | null {
  if (!(total > 0)) return null;
  const cells = histogram.length;
  const width = (max - min) / cells;
  let sum = 0;
  let first = 0;
  while (first < cells - 1 && sum + histogram[first] <= tail * total) sum += histogram[first++];
  sum = 0;
  let last = cells - 1;
  while (last > first && sum + histogram[last] <= tail * total) sum += histogram[last--];
  return { lo: min + first * width, hi: min + (last + 1) * width };
}

/** The smallest extent holding both (either may be null). */
export function unionExtent(a: Extent | null, b: Extent | null): Extent | null {
  if (!a) return b;
  if (!b) return a;
  return { lo: Math.min(a.lo, b.lo), hi: Math.max(a.hi, b.hi) };
}
