// A region of a plane: a rectangle or a polygon in the coordinates of the plane's two variables (axes.ts), and what
// a per-jet density holds inside it. The integral weights each bin by the fraction of its area inside the region,
// so it does not depend on where bin edges fall: a rectangle on bin edges sums exactly the bins it covers, and a
// polygon's integral converges to the exact one as the bins shrink. Within a bin the density is taken as uniform
// (the histogram's own assumption), so a partly covered bin adds f·ρ·A with variance f²·σ²·A².
import type { DensityGrid } from './binned-plane';
import type { HorizontalVariable, VerticalVariable } from './axes';
import { ratio, ratioVariance } from './compare';
import { areaInRectangle, signedArea, type Point } from './polygon';

export type RegionShape =
  | { type: 'rectangle'; x1: number; x2: number; y1: number; y2: number }
  | { type: 'polygon'; points: Array<[number, number]> };

/**
 * Which plane the coordinates belong to: the variables of the two axes, and for Δ, z and kt whether the coordinate
 * is their natural logarithm (log binning; absent means linear).
 */
export interface RegionAxes {
  x: HorizontalVariable;
  y: VerticalVariable;
  xLog?: boolean;
  yLog?: boolean;
}

export interface RegionGeometry {
  axes: RegionAxes;
  shape: RegionShape;
}

/** The shape's outline as polygon points (a rectangle's corners counter-clockwise). */
export function outline(shape: RegionShape): Point[] {
  if (shape.type === 'polygon') return shape.points;
  const [x1, x2] = [Math.min(shape.x1, shape.x2), Math.max(shape.x1, shape.x2)];
  const [y1, y2] = [Math.min(shape.y1, shape.y2), Math.max(shape.y1, shape.y2)];
  return [
    [x1, y1],
    [x2, y1],
    [x2, y2],
    [x1, y2],
  ];
}

export function shapeArea(shape: RegionShape): number {
  return Math.abs(signedArea(outline(shape)));
}

export interface RegionIntegral {
  /** Splittings per jet inside the region (∫ρ over it) and the variance of that number. */
  value: number;
  variance: number;
  /** The fraction of the region's area that the grid's bins cover (below 1: part of it lies outside the shown range). */
  covered: number;
}

/** ∫ρ over the region, each bin weighted by the fraction of its area inside. */
export function regionIntegral(grid: Pick<DensityGrid, 'xEdges' | 'yEdges' | 'density' | 'variance'>, shape: RegionShape): RegionIntegral {
  const points = outline(shape);
  const xs = points.map((p) => p[0]);
  const ys = points.map((p) => p[1]);
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const nx = grid.xEdges.length - 1;
  const ny = grid.yEdges.length - 1;
  let value = 0;
  let variance = 0;
  let coveredArea = 0;
  for (let iy = 0; iy < ny; iy++) {
    const [y1, y2] = [grid.yEdges[iy], grid.yEdges[iy + 1]];
    if (y2 <= minY || y1 >= maxY) continue;
    for (let ix = 0; ix < nx; ix++) {
      const [x1, x2] = [grid.xEdges[ix], grid.xEdges[ix + 1]];
      if (x2 <= minX || x1 >= maxX) continue;
      const inside = areaInRectangle(points, x1, x2, y1, y2);
      if (inside === 0) continue;
      const i = iy * nx + ix;
      coveredArea += inside;
      value += grid.density[i] * inside;
      variance += grid.variance[i] * inside * inside;
    }
  }
  const area = shapeArea(shape);
  return { value, variance, covered: area > 0 ? coveredArea / area : 0 };
}

/** B/A of the two samples' integrals in the region, with its first-order error (independent samples). */
export function regionRatio(a: RegionIntegral, b: RegionIntegral): { value: number; error: number } {
  return { value: ratio(a.value, b.value), error: Math.sqrt(ratioVariance(a.value, a.variance, b.value, b.variance)) };
}
