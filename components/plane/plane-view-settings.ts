// What part of the primary plane the first look shows, and how coarsely.

import type { PlaneView } from '@/lib/samples/shapes';

export type HorizontalCoordinate = PlaneView['horizontal'];

export const HORIZONTAL_LABELS: Record<HorizontalCoordinate, string> = {
  lnInvDelta: 'ln(1/Δ)',
  lnRoverDelta: 'ln(R/Δ)',
};

// Unicode subscript: the axis label is SVG text, where markup does not go.
export const VERTICAL_LABEL = 'ln(kₜ / GeV)';

/** Axis labels by collision type: e+e- samples are declustered in the angle θ and kₜ = E sin θ (PHYSICS.md). */
export const AXIS_LABELS: Record<'hadron' | 'ee', { horizontal: Record<HorizontalCoordinate, string>; vertical: string }> = {
  hadron: { horizontal: HORIZONTAL_LABELS, vertical: VERTICAL_LABEL },
  ee: { horizontal: { lnInvDelta: 'ln(1/θ)', lnRoverDelta: 'ln(R/θ)' }, vertical: 'ln(kₜ / GeV),  kₜ = E sin θ' },
};
export const DENSITY_LABEL = 'emissions per jet per unit area';

/** Width of the server's fine bins in both coordinates (lib/physics/density.ts); coarse bins merge whole fine ones. */
const FINE_BIN = 0.05;

/** Square bin sizes offered; each divides the ranges below into whole bins. */
export const BIN_SIZES = [0.1, 0.2, 0.25, 0.5] as const;
export const DEFAULT_BIN_SIZE = 0.25;

// Ranges on fine-bin edges, 6 wide horizontally and 10 vertically (kt from 18 MeV to 400 GeV): they hold the
// splittings of jets with R up to about 1 and pt up to a few TeV, soft ones included. ln(R/Δ) starts a little
// below 0 because C/A splittings can open slightly wider than R.
const RANGES: Record<HorizontalCoordinate, { x: [number, number]; y: [number, number] }> = {
  lnInvDelta: { x: [0, 6], y: [-4, 6] },
  lnRoverDelta: { x: [-0.5, 5.5], y: [-4, 6] },
};

export interface PlaneChoice {
  horizontal: HorizontalCoordinate;
  binSize: number;
}

/** The plane request of the sample API for this view. */
export function planeUrl(sampleId: number, choice: PlaneChoice): string {
  const { x, y } = RANGES[choice.horizontal];
  const merge = String(Math.round(choice.binSize / FINE_BIN));
  const query = new URLSearchParams({
    horizontal: choice.horizontal,
    xmin: String(x[0]),
    xmax: String(x[1]),
    xmerge: merge,
    ymin: String(y[0]),
    ymax: String(y[1]),
    ymerge: merge,
  });
  return `/api/samples/${sampleId}/plane?${query}`;
}
