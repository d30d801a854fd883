// Region numbers (lib/physics/plane/region.ts) on hand-made samples: ρ = Σw / (N_jet · area) per bin as PHYSICS.md
// defines it, integrated over a region with each bin weighted by the fraction of its area inside.
import { describe, expect, it } from 'vitest';
import { axisBins } from '@/lib/physics/plane/bins';
import { densityOf, fillPlane, type DensityGrid, type PlaneSource } from '@/lib/physics/plane/binned-plane';
import { signedArea } from '@/lib/physics/plane/polygon';
import { regionIntegral, regionRatio, type RegionShape } from '@/lib/physics/plane/region';

/**
 * Two jets, weights 1 and 3, splittings at (x, y):
 *   jet 0 (w 1): (0.5, 0.5), (1.5, 0.5), (2.5, 1.5)
 *   jet 1 (w 3): (0.5, 0.5), (0.5, 1.5)
 * Bins x [0, 3) and y [0, 2) in steps of 1 (area 1), N_jet = 4.
 * ρ (row y0): [1 + 3, 1, 0] / 4 = [1, 0.25, 0];  (row y1): [3, 0, 1] / 4 = [0.75, 0, 0.25]
 * Var (row y0): [1 + 9, 1, 0] / 16;               (row y1): [9, 0, 1] / 16
 */
function handMade(): DensityGrid {
  const source: PlaneSource = {
    xs: [0.5, 1.5, 2.5, 0.5, 0.5],
    ys: [0.5, 0.5, 1.5, 0.5, 1.5],
    jetRow: [0, 0, 0, 1, 1],
    member: null,
    jetWeight: [1, 3],
    selected: new Uint8Array([1, 1]),
  };
  return densityOf(fillPlane({ x: axisBins(0, 3, 1), y: axisBins(0, 2, 1) }, source));
}

describe('a rectangle on a hand-made sample', () => {
  it('sums exactly the bins it covers, with their variances', () => {
    const grid = handMade();
    // Bins (x0, y0), (x1, y0), (x0, y1), (x1, y1): 1 + 0.25 + 0.75 + 0 = 2 splittings per jet.
    const inside = regionIntegral(grid, { type: 'rectangle', x1: 0, x2: 2, y1: 0, y2: 2 });
    expect(inside.value).toBe(2);
    expect(inside.variance).toBe((10 + 1 + 9) / 16);
    expect(inside.covered).toBe(1);
    // The bottom row only: 1 + 0.25 + 0.
    expect(regionIntegral(grid, { type: 'rectangle', x1: 0, x2: 3, y1: 0, y2: 1 }).value).toBe(1.25);
  });

  it('takes the covered fraction of a bin it cuts, and says how much of it lies beyond the bins', () => {
    const grid = handMade();
    // Half of bin (x0, y0): 0.5 · 1; its variance (0.5)² · 10/16.
    const half = regionIntegral(grid, { type: 'rectangle', x1: 0, x2: 0.5, y1: 0, y2: 1 });
    expect(half.value).toBe(0.5);
    expect(half.variance).toBe(0.25 * (10 / 16));
    // x from 2 to 4: only [2, 3] is binned, half of the region's area.
    const beyond = regionIntegral(grid, { type: 'rectangle', x1: 2, x2: 4, y1: 0, y2: 2 });
    expect(beyond.value).toBe(0.25);
    expect(beyond.covered).toBe(0.5);
  });

  it('gives B/A of two samples with the first-order error of independent samples', () => {
    const a = regionIntegral(handMade(), { type: 'rectangle', x1: 0, x2: 1, y1: 0, y2: 1 }); // 1 ± √(10/16)
    const b = regionIntegral(handMade(), { type: 'rectangle', x1: 0, x2: 2, y1: 0, y2: 2 }); // 2 ± √(20/16)
    const r = regionRatio(a, b);
    expect(r.value).toBe(2);
    // Var(b/a) = Var b / a² + b² Var a / a⁴ = 20/16 + 4 · 10/16 = 60/16
    expect(r.error).toBeCloseTo(Math.sqrt(60 / 16), 14);
  });
});

/** A grid of bins of size h on [0, 4]², each holding the bin average of ρ(x, y) = 2 + 0.5 x − 0.25 y (exact for a linear ρ: its value at the bin centre). */
function linearGrid(h: number, rho: (x: number, y: number) => number): DensityGrid {
  const n = Math.round(4 / h);
  const edges = Float64Array.from({ length: n + 1 }, (_, i) => i * h);
  const density = new Float64Array(n * n);
  for (let iy = 0; iy < n; iy++) for (let ix = 0; ix < n; ix++) density[iy * n + ix] = rho((ix + 0.5) * h, (iy + 0.5) * h);
  return { xEdges: edges, yEdges: edges, density, variance: new Float64Array(n * n), count: null, jetWeight: 1, jetCount: 1, outsidePerJet: 0, splittingsPerJet: 0 };
}

/**
 * ∫ over a polygon of a + b x + c y = A (a + b x̄ + c ȳ), with the area A and centroid (x̄, ȳ) of the polygon from
 * the shoelace formulas (x̄ = Σ (x_i + x_{i+1})(x_i y_{i+1} − x_{i+1} y_i) / 6A, the same for ȳ) — textbook geometry.
 */
function exactLinearIntegral(points: Array<[number, number]>, a: number, b: number, c: number): number {
  const area = signedArea(points);
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < points.length; i++) {
    const [x1, y1] = points[i];
    const [x2, y2] = points[(i + 1) % points.length];
    const cross = x1 * y2 - x2 * y1;
    cx += (x1 + x2) * cross;
    cy += (y1 + y2) * cross;
  }
  cx /= 6 * area;
  cy /= 6 * area;
  return Math.abs(area) * (a + b * cx + c * cy);
}

describe('a polygon on finer and finer grids', () => {
  // A concave arrow whose corners fall on no bin edge of any of the grids.
  const arrow: Array<[number, number]> = [
    [0.37, 0.41],
    [3.13, 0.77],
    [2.21, 1.93],
    [3.41, 3.29],
    [1.07, 2.63],
    [1.61, 1.69],
  ];
  const shape: RegionShape = { type: 'polygon', points: arrow };

  it('holds exactly ρ · area of a uniform density on any grid (the area weights are exact)', () => {
    for (const h of [1, 0.5, 0.1]) {
      const got = regionIntegral(linearGrid(h, () => 1.5), shape).value;
      expect(got).toBeCloseTo(1.5 * Math.abs(signedArea(arrow)), 12);
    }
  });

  it('converges to the exact integral of a linear density as the bins shrink', () => {
    const exact = exactLinearIntegral(arrow, 2, 0.5, -0.25);
    const errors = [0.5, 0.1, 0.02].map((h) => Math.abs(regionIntegral(linearGrid(h, (x, y) => 2 + 0.5 * x - 0.25 * y), shape).value - exact));
    expect(errors[1]).toBeLessThan(errors[0]);
    expect(errors[2]).toBeLessThan(errors[1]);
    // Only the bins the outline cuts are off (ρ taken as uniform inside them): O(h²) in total.
    expect(errors[2] / exact).toBeLessThan(1e-4);
  });
});
