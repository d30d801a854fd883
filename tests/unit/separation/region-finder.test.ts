// The region finder on a constructed pair: two samples with the same flat emission density everywhere except one
// known rectangle of bins, where the signal has twice as many emissions. The first region found must be exactly
// that rectangle (a test of our own construction; the measure and growth rule are stated in region-finder.ts).
import { describe, expect, it } from 'vitest';
import { axisBins } from '@/lib/physics/plane/bins';
import { densityOf, fillPlane } from '@/lib/physics/plane/binned-plane';
import { Rng } from '@/lib/physics/random';
import { findRegions, symmetricChi2Contributions } from '@/lib/physics/separation/region-finder';

const bins = { x: axisBins(0, 5, 0.25), y: axisBins(-1, 3, 0.25) };
const box = { x1: 1.5, x2: 2.5, y1: 0.5, y2: 1.25 };

/** `jets` jets, each with emissions spread uniformly (about 8 a jet) plus, for the signal, extra ones in the box. */
function sample(rng: Rng, jets: number, extraInBox: number) {
  const xs: number[] = [];
  const ys: number[] = [];
  const jetRow: number[] = [];
  for (let j = 0; j < jets; j++) {
    for (let k = 0; k < 8; k++) {
      xs.push(rng.uniform(0, 5));
      ys.push(rng.uniform(-1, 3));
      jetRow.push(j);
    }
    const inBox = rng.next() < extraInBox ? 1 : 0;
    for (let k = 0; k < inBox; k++) {
      xs.push(rng.uniform(box.x1, box.x2));
      ys.push(rng.uniform(box.y1, box.y2));
      jetRow.push(j);
    }
  }
  const plane = fillPlane(bins, { xs, ys, jetRow, member: null, jetWeight: new Float64Array(jets).fill(1), selected: new Uint8Array(jets).fill(1) });
  return densityOf(plane);
}

describe('region finder', () => {
  it('finds the one rectangle where the samples differ, first', () => {
    const rng = new Rng(42);
    // Flat: 8 emissions a jet over an area of 5 × 4 → 0.4 per unit area, so 0.3 a jet in the box (area 0.75); the
    // signal has 0.6 a jet more there: S/B = 3.
    const signal = sample(rng, 40_000, 0.6);
    const background = sample(rng, 40_000, 0);
    const masked = new Uint8Array(signal.density.length);
    const regions = findRegions(signal, background, masked, 3);
    expect(regions[0].rank).toBe(1);
    expect(regions[0].rectangle).toEqual(box);
    expect(Math.abs(regions[0].ratio - 3)).toBeLessThan(4 * regions[0].ratioError);
    expect(regions[0].significance).toBeGreaterThan(20);
    expect(Math.abs(regions[0].signalPerJet - regions[0].backgroundPerJet - 0.6)).toBeLessThan(4 * Math.hypot(regions[0].signalError, regions[0].backgroundError));
    // Later regions are noise: far less significant, and none overlaps the first.
    for (const r of regions.slice(1)) {
      expect(Math.abs(r.significance)).toBeLessThan(6);
      const overlaps = r.rectangle.x1 < box.x2 && r.rectangle.x2 > box.x1 && r.rectangle.y1 < box.y2 && r.rectangle.y2 > box.y1;
      expect(overlaps).toBe(false);
    }
  });

  it('ranks bins by (ρ_S − ρ_B)²/(ρ_S + ρ_B) · area and leaves masked bins out', () => {
    const grid = (density: number[]) => ({
      xEdges: Float64Array.from([0, 0.5, 1]),
      yEdges: Float64Array.from([0, 2]),
      density: Float64Array.from(density),
      variance: Float64Array.from(density.map((d) => d / 100)),
      count: null,
      jetWeight: 100,
      jetCount: 100,
      outsidePerJet: 0,
      splittingsPerJet: 0,
    });
    const c = symmetricChi2Contributions(grid([3, 1]), grid([1, 1]), Uint8Array.from([0, 0]));
    expect(c[0]).toBeCloseTo((4 / 4) * 1, 12);
    expect(c[1]).toBe(0);
    expect(findRegions(grid([3, 1]), grid([1, 1]), Uint8Array.from([1, 0]))).toEqual([]);
  });
});
