// Binned planes worked by hand (PHYSICS.md "Declustering and the emission plane": ρ = Σw / (N_jet · area),
// Var = Σw² / (N_jet² · area²), N_jet = Σ w_jet; nothing dropped silently), their rebinning from the cached fine grid,
// projections, contrasts and the leading-order expectation on other coordinates.
import { describe, expect, it } from 'vitest';
import { defaultGrid, PlaneHistogram } from '@/lib/physics/density';
import { coordinate, type PlaneAxes } from '@/lib/physics/plane/axes';
import { axisBins, fittedBins } from '@/lib/physics/plane/bins';
import { densityOf, fillPlane, outsideTotal, planeExtents, type PlaneSource } from '@/lib/physics/plane/binned-plane';
import { boxRatio, chiSquare, contrastGrid } from '@/lib/physics/plane/compare';
import { edgeLines } from '@/lib/physics/plane/edges';
import { expectedDensity, expectedProjection } from '@/lib/physics/plane/expectation';
import { alignsWithFine, binnedFromFine } from '@/lib/physics/plane/from-fine';
import { project } from '@/lib/physics/plane/projection';
import { softCollinearDensity } from '@/lib/physics/lo-density';
import { SPLIT_STRIDE } from '@/lib/physics/types';

/**
 * Three jets, weights 1, 2 and 0.5, with splittings at (x, y):
 *   jet 0 (w 1):   (0.1, 0.1), (0.1, 0.3), (1.5, 0.5)
 *   jet 1 (w 2):   (0.1, 0.1), (5, 0.1) [right of the range], (+∞, 0.2) [Δ = 0: ln(1/Δ) = +∞]
 *   jet 2 (w 0.5): none
 * Bins x [0, 2) in steps of 1, y [0, 1) in steps of 0.5: area 0.5, N_jet = 3.5.
 */
function handMade(): PlaneSource {
  return {
    xs: [0.1, 0.1, 1.5, 0.1, 5, Infinity],
    ys: [0.1, 0.3, 0.5, 0.1, 0.1, 0.2],
    jetRow: [0, 0, 0, 1, 1, 1],
    member: null,
    jetWeight: [1, 2, 0.5],
    selected: new Uint8Array([1, 1, 1]),
  };
}
const BINS = { x: axisBins(0, 2, 1), y: axisBins(0, 1, 0.5) };

describe('normalisation on a hand-made sample', () => {
  it('gives the exact bin values, errors and raw counts', () => {
    const map = densityOf(fillPlane(BINS, handMade()));
    // bin (x0, y0): Σw = 1 + 1 + 2 = 4, Σw² = 1 + 1 + 4 = 6 → ρ = 4 / (3.5 · 0.5) = 16/7, Var = 6 / 1.75² = 96/49
    // bin (x1, y1): Σw = 1 (the (1.5, 0.5) splitting), Σw² = 1 → ρ = 1/1.75 = 4/7, Var = 16/49
    expect(Array.from(map.density)).toEqual([4 / 1.75, 0, 0, 1 / 1.75]);
    expect(Array.from(map.variance)).toEqual([6 / 1.75 ** 2, 0, 0, 1 / 1.75 ** 2]);
    expect(Array.from(map.count!)).toEqual([3, 0, 0, 1]);
    expect(map.jetWeight).toBe(3.5);
    expect(map.jetCount).toBe(3);
  });

  it('counts what falls outside, Δ = 0 included, so that ∫ρ + outside = mean splittings per jet exactly', () => {
    const plane = fillPlane(BINS, handMade());
    expect(plane.outside).toEqual({ left: 0, right: 4, below: 0, above: 0, undefined: 0 }); // (5, 0.1) and (+∞, 0.2), w 2 each
    expect(plane.outsideCount).toBe(2);
    const map = densityOf(plane);
    let integral = 0;
    for (const v of map.density) integral += v * 0.5;
    // Σw of all splittings = 1 + 1 + 1 + 2 + 2 + 2 = 9 → 9 / 3.5 per jet; outside 4 / 3.5
    // equal up to the rounding of the last bit (ρ · area undoes the division by area)
    expect(Math.abs(integral + map.outsidePerJet - 9 / 3.5)).toBeLessThan(1e-15);
    expect(map.splittingsPerJet).toBe(9 / 3.5);
    expect(map.outsidePerJet).toBe(4 / 3.5);
  });

  it('leaves out jets that are not selected, from the splittings and from N_jet', () => {
    const source = { ...handMade(), selected: new Uint8Array([1, 0, 1]) };
    const map = densityOf(fillPlane(BINS, source));
    // N_jet = 1.5; bin (x0, y0) Σw = 2 → 2 / 0.75
    expect(map.density[0]).toBe(2 / 0.75);
    expect(map.splittingsPerJet).toBe(3 / 1.5);
  });

  it('handles the edge cases: no jet, one jet without splittings, everything outside', () => {
    const none = fillPlane(BINS, { ...handMade(), selected: new Uint8Array(3) });
    expect(none.jetWeight).toBe(0);
    expect(() => densityOf(none)).toThrow(/no selected jets to normalise by/);
    const lonely = densityOf(fillPlane(BINS, { xs: [], ys: [], jetRow: [], member: null, jetWeight: [1], selected: new Uint8Array([1]) }));
    expect(Array.from(lonely.density)).toEqual([0, 0, 0, 0]);
    expect(lonely.splittingsPerJet).toBe(0);
    const far = fillPlane(BINS, { xs: [-1, 3, 0.5, Number.NaN], ys: [0.5, 0.5, 7, 0.5], jetRow: [0, 0, 0, 0], member: null, jetWeight: [1], selected: new Uint8Array([1]) });
    expect(far.outside).toEqual({ left: 1, right: 1, below: 0, above: 1, undefined: 1 });
    expect(Array.from(far.sumW)).toEqual([0, 0, 0, 0]);
    expect(densityOf(far).outsidePerJet).toBe(4);
  });

  it('keeps only the member splittings of the chosen tree', () => {
    const source = { ...handMade(), member: new Uint8Array([1, 0, 0, 1, 0, 0]) };
    expect(Array.from(fillPlane(BINS, source).sumW)).toEqual([3, 0, 0, 0]);
  });
});

describe('bins and fitted ranges', () => {
  it('refuses ranges that are not whole bins, and too many bins, naming the smallest bin size that fits', () => {
    expect(() => axisBins(0, 1, 0.3, 'bins.x')).toThrow(/bins.x: the range 0 to 1 is not a whole number of bins of 0.3/);
    expect(() => axisBins(0, 100, 0.1, 'bins.y')).toThrow(/1000 bins of 0.1 from 0 to 100 are more than 400; choose bins of at least 0.25/);
    expect(() => axisBins(1, 1, 0.1)).toThrow(/finite min < max/);
  });

  it('fits whole bins anchored at 0 around an extent, and one bin for an empty sample', () => {
    expect(fittedBins(-0.33, 2.01, 0.2)).toEqual({ min: -0.4, max: 2.2, step: 0.2, count: 13 });
    expect(fittedBins(Number.NaN, Number.NaN, 0.5)).toEqual({ min: 0, max: 0.5, step: 0.5, count: 1 });
  });

  it('takes the quantile extents of finite values of the selected jets’ member splittings only', () => {
    const source: PlaneSource = {
      xs: [Number.NEGATIVE_INFINITY, 0, 1, 2, 3, Number.NaN, Infinity, 50],
      ys: [1, 1, 1, 1, 1, 1, 1, 1],
      jetRow: [0, 0, 0, 0, 0, 0, 0, 1],
      member: null,
      jetWeight: [1, 1],
      selected: new Uint8Array([1, 0]),
    };
    expect(planeExtents(source, 0)).toEqual({ x: { lo: 0, hi: 3 }, y: { lo: 1, hi: 1 } });
    // 1000 values 0..999 of weight 1: a 0.5 % tail at each end leaves out the 5 outermost values on each side
    // (the extent is rounded outwards to cells of 999/4096)
    const many: PlaneSource = { xs: Array.from({ length: 1000 }, (_, i) => i), ys: new Array(1000).fill(0), jetRow: new Array(1000).fill(0), member: null, jetWeight: [1], selected: new Uint8Array([1]) };
    const { x } = planeExtents(many, 0.005);
    expect(x!.lo).toBeGreaterThan(4);
    expect(x!.lo).toBeLessThanOrEqual(5);
    expect(x!.hi).toBeGreaterThanOrEqual(994);
    expect(x!.hi).toBeLessThan(995);
    expect(planeExtents({ ...source, xs: new Array(8).fill(Number.NaN) }).x).toBeNull();
  });
});

describe('maps from the cached fine grid', () => {
  it('equal the maps filled from the splittings on the same bins, outside counts included', () => {
    const h = new PlaneHistogram(defaultGrid());
    const xs: number[] = [];
    const ys: number[] = [];
    const jetRow: number[] = [];
    const weights = [1, 0.5, 2, 1];
    let state = 7;
    const next = () => ((state = (state * 48271) % 2147483647) / 2147483647);
    weights.forEach((w, j) => {
      const s = new Float64Array(40 * SPLIT_STRIDE);
      for (let k = 0; k < 40; k++) {
        s[k * SPLIT_STRIDE] = -1 + 8 * next();
        s[k * SPLIT_STRIDE + 1] = -6 + 12 * next();
        xs.push(s[k * SPLIT_STRIDE]);
        ys.push(s[k * SPLIT_STRIDE + 1]);
        jetRow.push(j);
      }
      h.fillJet(s, w);
    });
    const bins = { x: axisBins(0, 6, 0.2), y: axisBins(-3, 5, 0.25) };
    expect(alignsWithFine(h, bins)).toBe(true);
    const fromFine = binnedFromFine(h, bins);
    const fromColumns = fillPlane(bins, { xs, ys, jetRow, member: null, jetWeight: weights, selected: new Uint8Array(4).fill(1) });
    expect(Array.from(fromFine.count!)).toEqual(Array.from(fromColumns.count!));
    fromFine.sumW.forEach((v, i) => expect(v).toBeCloseTo(fromColumns.sumW[i], 12));
    expect(outsideTotal(fromFine.outside)).toBeCloseTo(outsideTotal(fromColumns.outside), 12);
    expect(fromFine.outside.left).toBeCloseTo(fromColumns.outside.left, 12);
    expect(fromFine.outsideCount).toBe(fromColumns.outsideCount);
    expect(alignsWithFine(h, { x: axisBins(0, 6, 0.12), y: bins.y })).toBe(false);
  });
});

describe('projections', () => {
  it('integrate the map over the slice: ∑ projected ρ · width = ∫ρ over the slice', () => {
    const map = densityOf(fillPlane(BINS, handMade()));
    const p = project(map, 'y', 0, 2);
    // onto y, summed over x ∈ [0, 2): y bin 0: 16/7 · 1 = 16/7; y bin 1: 4/7
    expect(Array.from(p.density)).toEqual([16 / 7, 4 / 7]);
    expect(Array.from(p.variance)).toEqual([96 / 49, 16 / 49]);
    expect(p.slice).toEqual({ from: 0, to: 2 });
    const onlyFirst = project(map, 'x', 0, 0.5);
    expect(Array.from(onlyFirst.density)).toEqual([(16 / 7) * 0.5, 0]);
    expect(() => project(map, 'x', 0.1, 0.2)).toThrow(/holds no whole bin/);
  });
});

describe('contrasts', () => {
  const a = densityOf(fillPlane(BINS, handMade()));
  const b = densityOf(fillPlane(BINS, { ...handMade(), jetWeight: [1, 1, 1] }));
  // b: N_jet = 3, bin 0 Σw = 3 (Σw² = 3) → ρ = 2, Var = 3 / 2.25 = 4/3; bin 3 Σw = 1 → ρ = 2/3, Var = 1/2.25

  it('ratio B/A with first-order errors, difference, pull, and masking by raw entries', () => {
    const ratio = contrastGrid(a, b, 'ratio', 0);
    expect(ratio.value[0]).toBeCloseTo(2 / (16 / 7), 14);
    // Var(b/a) = Var b / a² + b² Var a / a⁴
    expect(ratio.variance[0]).toBeCloseTo(4 / 3 / (16 / 7) ** 2 + (4 * (96 / 49)) / (16 / 7) ** 4, 14);
    expect(Number.isNaN(ratio.value[1])).toBe(true); // 0/0
    const diff = contrastGrid(a, b, 'difference', 0);
    expect(diff.value[3]).toBeCloseTo(2 / 3 - 4 / 7, 14);
    expect(diff.variance[3]).toBeCloseTo(1 / 2.25 + 16 / 49, 14);
    const pull = contrastGrid(a, b, 'pull', 0);
    expect(pull.value[3]).toBeCloseTo((2 / 3 - 4 / 7) / Math.sqrt(1 / 2.25 + 16 / 49), 14);
    // bin 3 holds 1 raw splitting in each: a threshold of 2 masks it, and the empty bins
    expect(Array.from(contrastGrid(a, b, 'ratio', 2).masked)).toEqual([0, 1, 1, 1]);
  });

  it('χ²/ndf over unmasked bins with an error', () => {
    const { chi2, ndf } = chiSquare(a, b, new Uint8Array(4));
    const expected = (2 - 16 / 7) ** 2 / (96 / 49 + 4 / 3) + (2 / 3 - 4 / 7) ** 2 / (16 / 49 + 1 / 2.25);
    expect(chi2).toBeCloseTo(expected, 14);
    expect(ndf).toBe(2);
  });

  it('the mean ratio in a box is the ratio of the integrals, with its error', () => {
    const box = boxRatio(a, b, { x1: 0, x2: 2, y1: 0, y2: 1 });
    const ia = (16 / 7 + 4 / 7) * 0.5;
    const ib = (2 + 2 / 3) * 0.5;
    expect(box.ratio).toBeCloseTo(ib / ia, 14);
    const va = (96 / 49 + 16 / 49) * 0.25;
    const vb = (4 / 3 + 1 / 2.25) * 0.25;
    expect(box.error).toBeCloseTo(Math.sqrt(vb / ia ** 2 + (ib ** 2 * va) / ia ** 4), 14);
    expect(box.a.bins).toBe(4);
  });
});

describe('the leading-order expectation on other coordinates (PHYSICS.md; Jacobians of axes.ts)', () => {
  const s = { parton: 'gluon' as const, terms: 'softCollinear' as const, pt: 500, R: 0.8 };
  const lund: PlaneAxes = { x: { variable: 'lnInvDelta', log: false }, y: { variable: 'lnKt', log: false } };

  it('is 2 α_s(kt) C_A / π per unit ln(1/Δ) and ln kt', () => {
    expect(expectedDensity(lund, 1, 2, s)).toBe(softCollinearDensity('gluon', Math.exp(2)));
    // outside Δ < R, z ≤ 1/2, kt ≥ 1 GeV: not given
    expect(Number.isNaN(expectedDensity(lund, 1, -0.5, s))).toBe(true);
    expect(Number.isNaN(expectedDensity(lund, -1, 2, s))).toBe(true);
  });

  it('integrates to the same number of emissions on the linear (Δ, z) plane as on the logarithmic one', () => {
    // region: Δ ∈ [0.1, 0.3], z ∈ [0.05, 0.2] (kt from 2.5 to 30 GeV at 500 GeV: perturbative throughout)
    const dz: PlaneAxes = { x: { variable: 'delta', log: false }, y: { variable: 'z', log: false } };
    const n = 400;
    let linear = 0;
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < n; k++) {
        const delta = 0.1 + ((i + 0.5) * 0.2) / n;
        const z = 0.05 + ((k + 0.5) * 0.15) / n;
        linear += expectedDensity(dz, delta, z, s) * (0.2 / n) * (0.15 / n);
      }
    }
    // the same region in (ln 1/Δ, ln 1/z), where the density per unit area is that of (ln 1/Δ, ln kt)
    const lnz: PlaneAxes = { x: { variable: 'lnInvDelta', log: false }, y: { variable: 'lnInvZ', log: false } };
    let logarithmic = 0;
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < n; k++) {
        const u = Math.log(1 / 0.3) + ((i + 0.5) * Math.log(3)) / n;
        const v = Math.log(1 / 0.2) + ((k + 0.5) * Math.log(4)) / n;
        logarithmic += expectedDensity(lnz, u, v, s) * (Math.log(3) / n) * (Math.log(4) / n);
      }
    }
    expect(linear / logarithmic).toBeCloseTo(1, 3);
  });

  it('projects as the measured projections do (integral over the slice, per unit of the other axis)', () => {
    // slice ln(1/Δ) ∈ [0.5, 1.5]: inside Δ < R and z ≤ 1/2 for ln kt ∈ [2, 2.5] at 500 GeV
    const values = expectedProjection(lund, 'y', [2, 2.5], [0.5, 1, 1.5], 0.5, 1.5, s);
    // soft-collinear density is flat in ln(1/Δ): 1 unit of slice times the mean of 2 α_s C_A / π over ln kt ∈ [2, 2.5]
    let mean = 0;
    for (let k = 0; k < 1000; k++) mean += softCollinearDensity('gluon', Math.exp(2 + (k + 0.5) * 0.0005)) / 1000;
    expect(values[0]).toBeCloseTo(mean, 5); // midpoint rule of 16 points a bin: error ~1e-6
  });
});

describe('kinematic edges', () => {
  it('draw z = 1/2 at ln kt = ln(pt Δ / 2) and Δ = R at ln(1/Δ) = ln(1/R)', () => {
    const axes: PlaneAxes = { x: { variable: 'lnInvDelta', log: false }, y: { variable: 'lnKt', log: false } };
    const lines = edgeLines(axes, { R: 0.4, pt: 300, zValues: [0.1] });
    const byKind = Object.fromEntries(lines.map((line) => [line.label, line.points]));
    for (const [u, v] of byKind['z = 1/2']) expect(v).toBeCloseTo(Math.log((300 * Math.exp(-u)) / 2), 12);
    for (const [u, v] of byKind['z = 0.1']) expect(v).toBeCloseTo(Math.log(0.1 * 300 * Math.exp(-u)), 12);
    for (const [u] of byKind['Delta = R = 0.4']) expect(u).toBeCloseTo(Math.log(1 / 0.4), 12);
    for (const [, v] of byKind['kt = 1 GeV']) expect(v).toBeCloseTo(0, 12);
    expect(coordinate({ variable: 'lnKappa', log: false }, 0.2, 0.1, 6, 0.4)).toBeCloseTo(Math.log(0.02), 14);
  });
});
