// A sample's splittings counted on the bins of a plane, with everything that fell outside them counted too
// (PHYSICS.md "nothing is dropped silently"), and the per-jet density with its variance:
// ρ = Σw / (N_jet · area), Var ρ = Σw² / (N_jet² · area²), N_jet = Σ w_jet over the selected jets.
import { ABOVE, type AxisBins, BELOW, binEdges, binOf, type Extent, extentOfHistogram, FIT_TAIL } from './bins';

export interface PlaneBins {
  x: AxisBins;
  y: AxisBins;
}

/** Σw of splittings that no bin holds, by where they are (a splitting off both axes counts once, under x). */
export interface OutsideWeights {
  /** Left of the horizontal range, right of it, below the vertical range, above it. */
  left: number;
  right: number;
  below: number;
  above: number;
  /** No coordinate at all (NaN), or, for maps rebinned from the cached fine grid, beyond that grid (Δ = 0 among
   * them). Computed from the columns, Δ = 0 gives ln(1/Δ) = +∞ and counts as "right". */
  undefined: number;
}

export interface BinnedPlane {
  bins: PlaneBins;
  /** Per bin, index iy · nx + ix. */
  sumW: Float64Array;
  sumW2: Float64Array;
  /** Unweighted number of splittings per bin; null when the source does not know it. */
  count: Float64Array | null;
  /** N_jet = Σ w over the selected jets, and how many jets that is. */
  jetWeight: number;
  jetCount: number;
  outside: OutsideWeights;
  /** Unweighted number of splittings outside the bins; null when unknown. */
  outsideCount: number | null;
}

export function emptyOutside(): OutsideWeights {
  return { left: 0, right: 0, below: 0, above: 0, undefined: 0 };
}

export function outsideTotal(o: OutsideWeights): number {
  return o.left + o.right + o.below + o.above + o.undefined;
}

export function emptyPlane(bins: PlaneBins, withCount = true): BinnedPlane {
  const n = bins.x.count * bins.y.count;
  return {
    bins,
    sumW: new Float64Array(n),
    sumW2: new Float64Array(n),
    count: withCount ? new Float64Array(n) : null,
    jetWeight: 0,
    jetCount: 0,
    outside: emptyOutside(),
    outsideCount: withCount ? 0 : null,
  };
}

/** Where a splitting at bin indices (ix, iy) goes when it is not in a bin; null when it is in one. */
function outsideKey(ix: number, iy: number): keyof OutsideWeights | null {
  if (ix === BELOW) return 'left';
  if (ix === ABOVE) return 'right';
  if (ix < 0) return 'undefined';
  if (iy === BELOW) return 'below';
  if (iy === ABOVE) return 'above';
  if (iy < 0) return 'undefined';
  return null;
}

/** What fillPlane reads: one coordinate pair per splitting, the splitting's jet, and per-jet weights. */
export interface PlaneSource {
  xs: ArrayLike<number>;
  ys: ArrayLike<number>;
  jetRow: ArrayLike<number>;
  /** Per splitting: 1 when it belongs to the plane (its generation fits), else 0; null = all belong. */
  member: Uint8Array | null;
  /** Per jet. */
  jetWeight: ArrayLike<number>;
  /** Per jet: 1 when selected. */
  selected: Uint8Array;
}

/** Counts the selected jets' member splittings into the bins (the hot loop of a recomputed map). */
export function fillPlane(bins: PlaneBins, source: PlaneSource): BinnedPlane {
  const plane = emptyPlane(bins);
  const { xs, ys, jetRow, member, jetWeight, selected } = source;
  const nx = bins.x.count;
  const sumW = plane.sumW;
  const sumW2 = plane.sumW2;
  const count = plane.count!;
  const outside = plane.outside;
  let outsideCount = 0;
  for (let j = 0; j < selected.length; j++) {
    if (selected[j]) {
      plane.jetWeight += jetWeight[j];
      plane.jetCount++;
    }
  }
  const n = xs.length;
  const { min: xMin, step: xStep } = bins.x;
  const { min: yMin, step: yStep, count: ny } = bins.y;
  for (let i = 0; i < n; i++) {
    const j = jetRow[i];
    if (!selected[j] || (member !== null && !member[i])) continue;
    const w = jetWeight[j];
    // The common case inline (NaN fails both comparisons); edges, infinities and the outside go through binOf.
    let ix = Math.floor((xs[i] - xMin) / xStep);
    let iy = Math.floor((ys[i] - yMin) / yStep);
    if (!(ix >= 0 && ix < nx && iy >= 0 && iy < ny)) {
      ix = binOf(bins.x, xs[i]);
      iy = ix >= 0 ? binOf(bins.y, ys[i]) : 0;
    }
    if (ix >= 0 && iy >= 0) {
      const at = iy * nx + ix;
      sumW[at] += w;
      sumW2[at] += w * w;
      count[at] += 1;
    } else {
      outside[outsideKey(ix, iy)!] += w;
      outsideCount++;
    }
  }
  plane.outsideCount = outsideCount;
  return plane;
}

const EXTENT_CELLS = 4096;

/**
 * Where the selected jets' member splittings are: the quantile extent of each coordinate (|w| weighted; finite
 * values only), for fitted ranges. Two passes over the splittings, both coordinates at once: exact minimum and
 * maximum, then a histogram of 4096 cells between them, cut at the `tail` quantiles (rounded outwards to cells).
 */
export function planeExtents(source: PlaneSource, tail = FIT_TAIL): { x: Extent | null; y: Extent | null } {
  const { xs, ys, jetRow, member, jetWeight, selected } = source;
  const n = xs.length;
  let xMin = Infinity;
  let xMax = -Infinity;
  let yMin = Infinity;
  let yMax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (!selected[jetRow[i]] || (member !== null && !member[i])) continue;
    const x = xs[i];
    const y = ys[i];
    if (x - x === 0) {
      if (x < xMin) xMin = x;
      if (x > xMax) xMax = x;
    }
    if (y - y === 0) {
      if (y < yMin) yMin = y;
      if (y > yMax) yMax = y;
    }
  }
  const hx = new Float64Array(EXTENT_CELLS);
  const hy = new Float64Array(EXTENT_CELLS);
  const sx = xMax > xMin ? EXTENT_CELLS / (xMax - xMin) : 0;
  const sy = yMax > yMin ? EXTENT_CELLS / (yMax - yMin) : 0;
  let tx = 0;
  let ty = 0;
  for (let i = 0; i < n; i++) {
    const j = jetRow[i];
    if (!selected[j] || (member !== null && !member[i])) continue;
    const w = Math.abs(jetWeight[j]);
    const x = xs[i];
    const y = ys[i];
    // x − x is 0 exactly for finite x (NaN and ±∞ give NaN)
    if (x - x === 0) {
      hx[Math.min(EXTENT_CELLS - 1, Math.floor((x - xMin) * sx))] += w;
      tx += w;
    }
    if (y - y === 0) {
      hy[Math.min(EXTENT_CELLS - 1, Math.floor((y - yMin) * sy))] += w;
      ty += w;
    }
  }
  const extent = (h: Float64Array, lo: number, hi: number, total: number): Extent | null => {
    if (!(lo <= hi)) return null;
    if (lo === hi) return { lo, hi };
    return extentOfHistogram(h, lo, hi, total, tail);
  };
  return { x: extent(hx, xMin, xMax, tx), y: extent(hy, yMin, yMax, ty) };
}

/** The per-jet density of a binned plane. */
export interface DensityGrid {
  xEdges: Float64Array;
  yEdges: Float64Array;
  density: Float64Array;
  variance: Float64Array;
  count: Float64Array | null;
  jetWeight: number;
  jetCount: number;
  /** Σw outside the bins over N_jet: splittings per jet not shown. */
  outsidePerJet: number;
  /** Σw of all member splittings over N_jet: ∫ρ over the bins plus outsidePerJet. */
  splittingsPerJet: number;
}

export function densityOf(plane: BinnedPlane): DensityGrid {
  const { bins, sumW, sumW2, jetWeight } = plane;
  if (!(jetWeight > 0)) throw new RangeError(`no selected jets to normalise by (N_jet = ${jetWeight}): the density is undefined`);
  const area = bins.x.step * bins.y.step;
  const scale = jetWeight * area;
  const density = new Float64Array(sumW.length);
  const variance = new Float64Array(sumW.length);
  let inside = 0;
  for (let i = 0; i < sumW.length; i++) {
    density[i] = sumW[i] / scale;
    variance[i] = sumW2[i] / (scale * scale);
    inside += sumW[i];
  }
  const outside = outsideTotal(plane.outside);
  return {
    xEdges: binEdges(bins.x),
    yEdges: binEdges(bins.y),
    density,
    variance,
    count: plane.count,
    jetWeight,
    jetCount: plane.jetCount,
    outsidePerJet: outside / jetWeight,
    splittingsPerJet: (inside + outside) / jetWeight,
  };
}
