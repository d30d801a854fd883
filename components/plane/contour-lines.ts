// Contour lines of a field sampled on a grid, kept only where a condition holds: the leading-order expectation is
// given only inside Δ < R, z ≤ 1/2, kt ≥ 1 GeV, so its lines are cut where they leave that region (and along the
// grid's own border, which marching squares closes its polygons on) instead of being drawn along its edges.
import { contours } from 'd3-contour';

export interface ContourLine {
  /** Line number (for Plot's z channel) and its level. */
  id: number;
  level: number;
  points: Array<[number, number]>;
}

/**
 * `values[iy * nx + ix]` sampled at cell centres over x and y; `keep(u, v)` says where lines may be drawn.
 * Returns polylines in plane coordinates, one per continuous piece.
 */
export function contourLines(
  values: ArrayLike<number>,
  nx: number,
  ny: number,
  x: [number, number],
  y: [number, number],
  thresholds: number[],
  keep: (u: number, v: number) => boolean,
): ContourLine[] {
  const lines: ContourLine[] = [];
  const toPlane = ([gx, gy]: number[]): [number, number] => [x[0] + (gx * (x[1] - x[0])) / nx, y[0] + (gy * (y[1] - y[0])) / ny];
  const onBorder = ([gx, gy]: number[]) => gx <= 0.5 || gy <= 0.5 || gx >= nx - 0.5 || gy >= ny - 0.5;
  const generator = contours().size([nx, ny]).thresholds(thresholds);
  for (const geometry of generator(Array.from(values, (v) => (Number.isFinite(v) ? v : Number.NaN)))) {
    for (const polygon of geometry.coordinates) {
      for (const ring of polygon) {
        let run: Array<[number, number]> = [];
        const flush = () => {
          if (run.length > 1) lines.push({ id: lines.length, level: geometry.value, points: run });
          run = [];
        };
        for (const point of ring) {
          const plane = toPlane(point);
          if (onBorder(point) || !keep(plane[0], plane[1])) flush();
          else run.push(plane);
        }
        flush();
      }
    }
  }
  return lines;
}
