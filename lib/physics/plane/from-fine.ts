// Maps of the default jet selection come from the fine primary-plane histogram cached when a sample was processed
// (density.ts): its bins merged into the shown ones, and every fine bin outside them counted as outside.
import type { PlaneHistogram } from '../density';
import { type AxisBins, type Extent, extentOfHistogram } from './bins';
import { type BinnedPlane, emptyPlane, type PlaneBins } from './binned-plane';

const ALIGN_TOLERANCE = 1e-6;

/** Fine bins per shown bin and the first fine bin, or null when the shown bins are not made of whole fine ones. */
function alignment(fine: { min: number; max: number; bins: number }, bins: AxisBins): { first: number; merge: number } | null {
  const width = (fine.max - fine.min) / fine.bins;
  const merge = bins.step / width;
  const first = (bins.min - fine.min) / width;
  const whole = (v: number) => Math.abs(v - Math.round(v)) < ALIGN_TOLERANCE;
  if (!whole(merge) || !whole(first) || Math.round(merge) < 1) return null;
  return { first: Math.round(first), merge: Math.round(merge) };
}

/** Whether `bins` can be filled from the fine histogram (both axes made of whole fine bins). */
export function alignsWithFine(h: PlaneHistogram, bins: PlaneBins): boolean {
  return alignment(h.grid.x, bins.x) !== null && alignment(h.grid.y, bins.y) !== null && h.count !== null;
}

/**
 * The shown bins filled from the fine histogram. Fine bins beyond the shown range go to the outside weights by
 * side (left/right first, as fillPlane does); what the fine grid itself could not hold (Δ = 0 among it) goes to
 * `undefined`, as its side is not recorded.
 */
export function binnedFromFine(h: PlaneHistogram, bins: PlaneBins): BinnedPlane {
  const ax = alignment(h.grid.x, bins.x);
  const ay = alignment(h.grid.y, bins.y);
  if (!ax || !ay || !h.count) throw new RangeError('these bins are not made of whole bins of the stored fine grid');
  const plane = emptyPlane(bins);
  const count = plane.count!;
  const fineNx = h.grid.x.bins;
  const fineNy = h.grid.y.bins;
  const nx = bins.x.count;
  const ny = bins.y.count;
  let outsideCount = h.outsideCount;
  for (let iy = 0; iy < fineNy; iy++) {
    const ky = Math.floor((iy - ay.first) / ay.merge);
    for (let ix = 0; ix < fineNx; ix++) {
      const at = iy * fineNx + ix;
      const w = h.sumW[at];
      if (w === 0 && h.sumW2[at] === 0) continue;
      const kx = Math.floor((ix - ax.first) / ax.merge);
      if (kx >= 0 && kx < nx && ky >= 0 && ky < ny) {
        const k = ky * nx + kx;
        plane.sumW[k] += w;
        plane.sumW2[k] += h.sumW2[at];
        count[k] += h.count[at];
        continue;
      }
      if (kx < 0) plane.outside.left += w;
      else if (kx >= nx) plane.outside.right += w;
      else if (ky < 0) plane.outside.below += w;
      else plane.outside.above += w;
      outsideCount += h.count[at];
    }
  }
  // Splittings beyond the fine grid itself: Δ = 0 (ln(1/Δ) = +∞) and anything past its wide edges.
  plane.outside.undefined += h.outsideWeight;
  plane.outsideCount = outsideCount;
  plane.jetWeight = h.jetWeight;
  plane.jetCount = h.jetCount;
  return plane;
}

/** Quantile extents of the fine histogram's two marginals (at fine-bin resolution). */
export function fineExtents(h: PlaneHistogram, tail?: number): { x: Extent | null; y: Extent | null } {
  const nx = h.grid.x.bins;
  const ny = h.grid.y.bins;
  const mx = new Float64Array(nx);
  const my = new Float64Array(ny);
  let total = 0;
  for (let iy = 0; iy < ny; iy++) {
    for (let ix = 0; ix < nx; ix++) {
      const w = Math.abs(h.sumW[iy * nx + ix]);
      mx[ix] += w;
      my[iy] += w;
      total += w;
    }
  }
  return {
    x: extentOfHistogram(mx, h.grid.x.min, h.grid.x.max, total, tail),
    y: extentOfHistogram(my, h.grid.y.min, h.grid.y.max, total, tail),
  };
}
