// Contour lines cut to where a field is given: a field rising linearly with x has vertical lines at the levels'
// positions, none along the grid's border, and none where `keep` refuses.
import { describe, expect, it } from 'vitest';
import { contourLines } from '@/components/plane/contour-lines';

describe('contour lines', () => {
  const nx = 50;
  const ny = 40;
  // value = u on x ∈ [0, 10], sampled at cell centres
  const values = Float64Array.from({ length: nx * ny }, (_, i) => ((i % nx) + 0.5) * (10 / nx));

  it('are drawn at the levels, away from the border', () => {
    const lines = contourLines(values, nx, ny, [0, 10], [0, 4], [3, 7], () => true);
    expect(new Set(lines.map((l) => l.level))).toEqual(new Set([3, 7]));
    for (const line of lines) {
      for (const [u, v] of line.points) {
        expect(Math.abs(u - line.level)).toBeLessThan(0.2 + 1e-9); // within one cell of the level
        expect(v).toBeGreaterThan(0.04);
        expect(v).toBeLessThan(3.96);
      }
    }
  });

  it('are cut where the field is not given', () => {
    const lines = contourLines(values, nx, ny, [0, 10], [0, 4], [3, 7], (_u, v) => v < 2);
    expect(lines.length).toBeGreaterThan(0);
    for (const line of lines) for (const [, v] of line.points) expect(v).toBeLessThan(2);
  });
});
