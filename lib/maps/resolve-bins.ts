// The bins a view shows: the user's ranges and bin sizes where given, otherwise fitted to where the splittings
// are (quantile extents of bins.ts), with a default bin size per kind of coordinate.
import { type AxisChoice, isLogBinned } from '@/lib/physics/plane/axes';
import { type AxisBins, axisBins, type Extent, fittedBins } from '@/lib/physics/plane/bins';
import type { PlaneBins } from '@/lib/physics/plane/binned-plane';
import { ApiError, badRequest } from '@/lib/api/errors';
import type { PlaneView } from './view-settings';

/** Default bin size of logarithmic coordinates: 0.2, four bins of the cached fine grid (0.05). */
export const DEFAULT_LOG_STEP = 0.2;
/** Bins a linear axis is cut into by default. */
const DEFAULT_LINEAR_BINS = 40;

function niceStep(width: number): number {
  if (!(width > 0)) return 1;
  const raw = width / DEFAULT_LINEAR_BINS;
  const power = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * power >= raw) return Number((m * power).toPrecision(6));
  return 10 * power;
}

function isLogarithmic(axis: AxisChoice): boolean {
  return axis.variable.startsWith('ln') || isLogBinned(axis);
}

function resolveAxis(name: 'x' | 'y', axis: AxisChoice, range: PlaneView['bins']['x'], extent: Extent | null): AxisBins {
  const lo = range.min ?? extent?.lo ?? 0;
  const hi = range.max ?? extent?.hi ?? lo + 1;
  const step = range.step ?? (isLogarithmic(axis) ? DEFAULT_LOG_STEP : niceStep(hi - lo));
  const label = `bins.${name}`;
  try {
    if (range.min !== null && range.max !== null) return axisBins(range.min, range.max, step, label);
    const fitted = fittedBins(lo, Math.max(lo, hi), step, label);
    // A bound the user gave stays exactly where it is; the other end is fitted in whole bins from it.
    if (range.min !== null) return axisBins(range.min, range.min + Math.max(1, Math.ceil((fitted.max - range.min) / step - 1e-9)) * step, step, label);
    if (range.max !== null) return axisBins(range.max - Math.max(1, Math.ceil((range.max - fitted.min) / step - 1e-9)) * step, range.max, step, label);
    return fitted;
  } catch (error) {
    if (error instanceof RangeError) throw badRequest(`Invalid bins: ${error.message}.`, [{ path: label, message: error.message }]);
    throw error;
  }
}

export function resolveBins(view: PlaneView, extents: { x: Extent | null; y: Extent | null }): PlaneBins {
  return {
    x: resolveAxis('x', view.x as AxisChoice, view.bins.x, extents.x),
    y: resolveAxis('y', view.y as AxisChoice, view.bins.y, extents.y),
  };
}

/** 409 when no jet is left to normalise by. */
export function requireJets(jetWeight: number, what: string): void {
  if (!(jetWeight > 0)) {
    throw new ApiError(409, 'no_jets', `No jets are selected in ${what} (N_jet = ${jetWeight}): there is no density to show. Loosen the selection.`);
  }
}
