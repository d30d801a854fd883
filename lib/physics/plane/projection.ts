// A 1-D projection of a per-jet density map: the density per unit of one coordinate, integrated over a slice of
// the other (the 2-D density times the widths of the bins in the slice), with its variance.
import type { DensityGrid } from './binned-plane';
import { ratio, ratioVariance } from './compare';

export type ProjectionAxis = 'x' | 'y';

export interface Projection {
  onto: ProjectionAxis;
  edges: Float64Array;
  density: Float64Array;
  variance: Float64Array;
  /** The slice of the other coordinate actually summed: from the first to the last whole bin inside [from, to]. */
  slice: { from: number; to: number };
  jetWeight: number;
}

/** Bins [first, end) of `edges` that lie inside [from, to] (within a small tolerance). */
export function binsInside(edges: ArrayLike<number>, from: number, to: number): [number, number] {
  const tolerance = 1e-9 * Math.max(1, Math.abs(edges[edges.length - 1] - edges[0]));
  let first = 0;
  while (first < edges.length - 1 && edges[first] < from - tolerance) first++;
  let end = edges.length - 1;
  while (end > first && edges[end] > to + tolerance) end--;
  return [first, end];
}

export function project(map: DensityGrid, onto: ProjectionAxis, from: number, to: number): Projection {
  if (!(to > from)) throw new RangeError(`projection slice: "from" (${from}) must be below "to" (${to})`);
  const nx = map.xEdges.length - 1;
  const ny = map.yEdges.length - 1;
  const otherEdges = onto === 'x' ? map.yEdges : map.xEdges;
  const [first, end] = binsInside(otherEdges, from, to);
  if (end <= first) {
    throw new RangeError(`projection slice ${from} to ${to} holds no whole bin (bins run from ${otherEdges[0]} to ${otherEdges[otherEdges.length - 1]})`);
  }
  const n = onto === 'x' ? nx : ny;
  const density = new Float64Array(n);
  const variance = new Float64Array(n);
  for (let k = first; k < end; k++) {
    const width = otherEdges[k + 1] - otherEdges[k];
    for (let i = 0; i < n; i++) {
      const at = onto === 'x' ? k * nx + i : i * nx + k;
      density[i] += map.density[at] * width;
      variance[i] += map.variance[at] * width * width;
    }
  }
  return {
    onto,
    edges: Float64Array.from(onto === 'x' ? map.xEdges : map.yEdges),
    density,
    variance,
    slice: { from: otherEdges[first], to: otherEdges[end] },
    jetWeight: map.jetWeight,
  };
}

/** Ratio of two projections on the same bins, b / a, with its variance; NaN where a is not above 0. */
export function projectionRatio(a: Projection, b: Projection): { value: Float64Array; variance: Float64Array } {
  const value = new Float64Array(a.density.length);
  const variance = new Float64Array(a.density.length);
  for (let i = 0; i < value.length; i++) {
    value[i] = ratio(a.density[i], b.density[i]);
    variance[i] = ratioVariance(a.density[i], a.variance[i], b.density[i], b.variance[i]);
  }
  return { value, variance };
}
