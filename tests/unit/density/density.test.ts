// Primary-plane histogram: normalisation ρ = Σw / (N_jet · area) and variance Σw² / (N_jet² · area²) as defined in
// PHYSICS.md (after arXiv:1807.04758), checked on hand-filled histograms with the arithmetic written out.
import { describe, expect, it } from 'vitest';
import { defaultGrid, type PlaneGrid, PlaneHistogram } from '@/lib/physics/density';
import { S_LN_INV_DELTA, S_LN_KT, SPLIT_STRIDE } from '@/lib/physics/types';

/** Splittings with only the plane coordinates set (the histogram reads nothing else). */
function splittings(points: Array<[number, number]>): Float64Array {
  const out = new Float64Array(points.length * SPLIT_STRIDE);
  points.forEach(([lnInvDelta, lnKt], k) => {
    out[k * SPLIT_STRIDE + S_LN_INV_DELTA] = lnInvDelta;
    out[k * SPLIT_STRIDE + S_LN_KT] = lnKt;
  });
  return out;
}

// Small grid: x = ln(1/Δ) in [0, 2] with 4 bins of 0.5, y = ln kt in [0, 3] with 3 bins of 1.
const SMALL: PlaneGrid = { horizontal: 'lnInvDelta', R: null, x: { min: 0, max: 2, bins: 4 }, y: { min: 0, max: 3, bins: 3 } };

// Jet A (w = 2): (0.2, 0.5) → bin (0,0); (0.7, 1.5) → (1,1); (0.3, 0.1) → (0,0)
// Jet B (w = 1): (0.2, 0.5) → (0,0); (1.9, 2.9) → (3,2); (5, 0.5) → outside the grid
// Jet C (w = 1): no emissions
// N_jet = 4, Σ w_jet² = 4 + 1 + 1 = 6, 3 jets.
// Σw:  (0,0) = 2 + 2 + 1 = 5, (1,1) = 2, (3,2) = 1.   Σw²: (0,0) = 4 + 4 + 1 = 9, (1,1) = 4, (3,2) = 1.
function handFilled(): PlaneHistogram {
  const h = new PlaneHistogram(SMALL);
  h.fillJet(splittings([[0.2, 0.5], [0.7, 1.5], [0.3, 0.1]]), 2);
  h.fillJet(splittings([[0.2, 0.5], [1.9, 2.9], [5, 0.5]]), 1);
  h.fillJet(new Float64Array(0), 1);
  return h;
}

function expectArrayClose(actual: Float64Array, expected: number[]): void {
  expect(actual.length).toBe(expected.length);
  expected.forEach((v, i) => expect(actual[i]).toBeCloseTo(v, 12));
}

describe('filling', () => {
  it('keeps Σw, Σw² per bin and N_jet = Σ w_jet with Σ w_jet²', () => {
    const h = handFilled();
    expect(h.jetCount).toBe(3);
    expect(h.jetWeight).toBe(4);
    expect(h.jetWeight2).toBe(6);
    expect(h.outsideWeight).toBe(1);
    // index iy * 4 + ix
    expect(h.sumW[0]).toBe(5);
    expect(h.sumW2[0]).toBe(9);
    expect(h.sumW[1 * 4 + 1]).toBe(2);
    expect(h.sumW2[1 * 4 + 1]).toBe(4);
    expect(h.sumW[2 * 4 + 3]).toBe(1);
    expect(h.sumW2[2 * 4 + 3]).toBe(1);
    expect(h.sumW.reduce((a, b) => a + b, 0)).toBe(8);
  });

  it('uses ln(R/Δ) = ln(1/Δ) + ln R when asked', () => {
    // ln(1/Δ) = 1.0 with R = 0.4: ln(R/Δ) = 1 − 0.9163 = 0.0837 → first x bin; on the ln(1/Δ) grid → x bin 2
    const byR = new PlaneHistogram({ ...SMALL, horizontal: 'lnRoverDelta', R: 0.4 });
    const byInv = new PlaneHistogram(SMALL);
    byR.fillJet(splittings([[1.0, 0.5]]), 1);
    byInv.fillJet(splittings([[1.0, 0.5]]), 1);
    expect(byR.sumW[0]).toBe(1);
    expect(byInv.sumW[2]).toBe(1);
  });

  it('rejects malformed input with clear messages', () => {
    const h = new PlaneHistogram(SMALL);
    expect(() => h.fillJet(new Float64Array(SPLIT_STRIDE + 1), 1)).toThrow(/not a multiple of 9/);
    expect(() => h.fillJet(new Float64Array(0), Number.NaN)).toThrow(/jet weight must be a finite number/);
    expect(() => h.fillEmission(0.1, 0.1, Number.POSITIVE_INFINITY)).toThrow(/emission weight/);
    expect(() => new PlaneHistogram({ ...SMALL, horizontal: 'lnRoverDelta', R: null })).toThrow(/positive jet radius/);
    expect(() => new PlaneHistogram({ ...SMALL, R: 0.4 })).toThrow(/only meaningful for the ln\(R\/Δ\)/);
    expect(() => new PlaneHistogram({ ...SMALL, x: { min: 1, max: 1, bins: 4 } })).toThrow(/x axis needs finite min < max/);
    expect(() => new PlaneHistogram({ ...SMALL, y: { min: 0, max: 1, bins: 2.5 } })).toThrow(/y axis needs an integer/);
  });
});

describe('densities', () => {
  it('fine bins: ρ = Σw/(N_jet·area), variance Σw²/(N_jet²·area²)', () => {
    const map = handFilled().rebin({ min: 0, max: 2, merge: 1 }, { min: 0, max: 3, merge: 1 });
    // area 0.5 · 1 = 0.5, N_jet = 4: (0,0) 5/2 = 2.5, var 9/(16 · 0.25) = 2.25; (1,1) 2/2 = 1, var 4/4 = 1;
    // (3,2) 1/2 = 0.5, var 1/4 = 0.25
    const d = new Array(12).fill(0);
    const v = new Array(12).fill(0);
    d[0] = 2.5;
    v[0] = 2.25;
    d[5] = 1;
    v[5] = 1;
    d[11] = 0.5;
    v[11] = 0.25;
    expectArrayClose(map.density, d);
    expectArrayClose(map.variance, v);
    expectArrayClose(map.xEdges, [0, 0.5, 1, 1.5, 2]);
    expectArrayClose(map.yEdges, [0, 1, 2, 3]);
    expect(map.jetWeight).toBe(4);
  });

  it('merges fine bins by integer factors', () => {
    const map = handFilled().rebin({ min: 0, max: 2, merge: 2 }, { min: 0, max: 3, merge: 3 });
    // two coarse bins of area 1 · 3 = 3: left Σw = 5 + 2 = 7 → 7/12, Σw² = 13 → 13/(16 · 9); right Σw = 1 → 1/12, 1/144
    expectArrayClose(map.density, [7 / 12, 1 / 12]);
    expectArrayClose(map.variance, [13 / 144, 1 / 144]);
    expectArrayClose(map.xEdges, [0, 1, 2]);
    expectArrayClose(map.yEdges, [0, 3]);
  });

  it('rebins an arbitrary sub-range of the fine grid', () => {
    const map = handFilled().rebin({ min: 0.5, max: 2, merge: 1 }, { min: 1, max: 3, merge: 2 });
    // area 0.5 · 2 = 1: x bin [0.5,1) Σw = 2 → 2/4 = 0.5, var 4/16; [1,1.5) empty; [1.5,2) Σw = 1 → 0.25, var 1/16
    expectArrayClose(map.density, [0.5, 0, 0.25]);
    expectArrayClose(map.variance, [0.25, 0, 1 / 16]);
  });

  it('projects onto either axis, integrating the other over a range', () => {
    const h = handFilled();
    const onX = h.project('x', { min: 0, max: 2, merge: 1 }, { min: 0, max: 3 });
    // dN/dx = Σw / (N_jet · 0.5): 5/2, 2/2, 0, 1/2; variance Σw² / (16 · 0.25): 9/4, 4/4, 0, 1/4
    expectArrayClose(onX.density, [2.5, 1, 0, 0.5]);
    expectArrayClose(onX.variance, [2.25, 1, 0, 0.25]);
    expectArrayClose(onX.edges, [0, 0.5, 1, 1.5, 2]);
    const onY = h.project('y', { min: 0, max: 3, merge: 1 }, { min: 0, max: 1 });
    // x in [0,1): dN/dln kt = Σw / (4 · 1): 5/4, 2/4, 0; variance 9/16, 4/16, 0 (the (3,2) emission is outside x < 1)
    expectArrayClose(onY.density, [1.25, 0.5, 0]);
    expectArrayClose(onY.variance, [0.5625, 0.25, 0]);
    expect(onY.jetWeight).toBe(4);
  });

  it('integrates to the number of emissions per jet on the grid', () => {
    const map = handFilled().rebin({ min: 0, max: 2, merge: 1 }, { min: 0, max: 3, merge: 1 });
    const perJet = map.density.reduce((sum, rho) => sum + rho * 0.5 * 1, 0);
    // Σw on the grid = 8 (5 + 2 + 1), N_jet = 4 → 2 emissions per jet
    expect(perJet).toBeCloseTo(2, 12);
  });

  it('works on the default 0.05 fine grid with user bins of 0.25', () => {
    const grid = defaultGrid();
    expect((grid.x.max - grid.x.min) / grid.x.bins).toBeCloseTo(0.05, 15);
    expect((grid.y.max - grid.y.min) / grid.y.bins).toBeCloseTo(0.05, 15);
    const h = new PlaneHistogram(grid);
    h.fillJet(splittings([[1.1, 2.3]]), 1);
    h.fillJet(new Float64Array(0), 1);
    const map = h.rebin({ min: 0, max: 6, merge: 5 }, { min: -1, max: 4, merge: 5 });
    expect(map.xEdges.length).toBe(25);
    expect(map.yEdges.length).toBe(21);
    // (1.1, 2.3) lies in x bin [1.0, 1.25) = 4, y bin [2.25, 2.5) = 13: ρ = 1 / (2 · 0.0625) = 8
    expect(map.density[13 * 24 + 4]).toBeCloseTo(8, 10);
    expect(map.density.reduce((a, b) => a + b, 0)).toBeCloseTo(8, 10);
  });

  it('refuses bins that are not made of whole fine bins, and empty normalisations', () => {
    const h = handFilled();
    expect(() => h.rebin({ min: 0.25, max: 2, merge: 1 }, { min: 0, max: 3, merge: 1 })).toThrow(
      /x range min = 0.25 must be an edge of the fine grid/,
    );
    expect(() => h.rebin({ min: 0, max: 2, merge: 3 }, { min: 0, max: 3, merge: 1 })).toThrow(/4 fine bins, not a multiple of merge 3/);
    expect(() => h.rebin({ min: 0, max: 2, merge: 0 }, { min: 0, max: 3, merge: 1 })).toThrow(/positive integer/);
    expect(() => h.rebin({ min: 0, max: 2, merge: 1 }, { min: 0, max: 4, merge: 1 })).toThrow(/y range max = 4/);
    expect(() => h.project('x', { min: 0, max: 2, merge: 1 }, { min: 2, max: 2 })).toThrow(/y range is empty/);
    expect(() => new PlaneHistogram(SMALL).rebin({ min: 0, max: 2, merge: 1 }, { min: 0, max: 3, merge: 1 })).toThrow(
      /no jets to normalise by/,
    );
  });
});

describe('merging and serialisation', () => {
  it('merging two histograms equals filling one with both', () => {
    const a = new PlaneHistogram(SMALL);
    a.fillJet(splittings([[0.2, 0.5], [0.7, 1.5], [0.3, 0.1]]), 2);
    const b = new PlaneHistogram(SMALL);
    b.fillJet(splittings([[0.2, 0.5], [1.9, 2.9], [5, 0.5]]), 1);
    b.fillJet(new Float64Array(0), 1);
    const merged = a.merge(b);
    const whole = handFilled();
    expect(Array.from(merged.sumW)).toEqual(Array.from(whole.sumW));
    expect(Array.from(merged.sumW2)).toEqual(Array.from(whole.sumW2));
    expect([merged.jetCount, merged.jetWeight, merged.jetWeight2, merged.outsideWeight]).toEqual([3, 4, 6, 1]);
    expect(a.jetCount).toBe(1); // inputs untouched
    expect(() => a.merge(new PlaneHistogram(defaultGrid()))).toThrow(/different grids/);
  });

  it('round-trips a sparse histogram through bytes and base64', () => {
    const h = handFilled();
    const bytes = h.toBytes();
    // version 2: header 102 bytes (4 magic + 4 version + 2 codes + 8 R + 2 · 20 axes + 5 · 8 totals + 4 count)
    // + 3 filled bins · (4 index + 8 Σw + 8 Σw² + 8 count) = 84 → 186, smaller than dense 102 + 12 · 24 = 390
    expect(bytes.length).toBe(186);
    for (const copy of [PlaneHistogram.fromBytes(bytes), PlaneHistogram.fromBase64(h.toBase64())]) {
      expect(copy.grid).toEqual(SMALL);
      expect(Array.from(copy.sumW)).toEqual(Array.from(h.sumW));
      expect(Array.from(copy.sumW2)).toEqual(Array.from(h.sumW2));
      expect(Array.from(copy.count!)).toEqual(Array.from(h.count!));
      expect([copy.jetCount, copy.jetWeight, copy.jetWeight2, copy.outsideWeight, copy.outsideCount]).toEqual([3, 4, 6, 1, 1]);
    }
  });

  it('reads version 1 bytes (without raw counts): counts are Σw when every weight is 1, unknown otherwise', () => {
    // A version-1 histogram written by hand: dense, 1 × 1 grid, one jet of weight 1 with 3 emissions in the bin.
    const v1 = (jetWeight: number, jetWeight2: number) => {
      const bytes = new Uint8Array(94 + 16);
      const view = new DataView(bytes.buffer);
      bytes.set([0x53, 0x46, 0x50, 0x48]); // "SFPH"
      view.setUint32(4, 1, true);
      view.setFloat64(10, Number.NaN, true);
      [0, 1].forEach((axis) => {
        view.setFloat64(18 + 20 * axis, 0, true);
        view.setFloat64(26 + 20 * axis, 1, true);
        view.setUint32(34 + 20 * axis, 1, true);
      });
      [1, jetWeight, jetWeight2, 0].forEach((v, k) => view.setFloat64(58 + 8 * k, v, true));
      view.setUint32(90, 1, true);
      view.setFloat64(94, 3 * jetWeight, true);
      view.setFloat64(102, 3 * jetWeight2, true);
      return bytes;
    };
    const unit = PlaneHistogram.fromBytes(v1(1, 1));
    expect(Array.from(unit.count!)).toEqual([3]);
    expect(unit.outsideCount).toBe(0);
    const weighted = PlaneHistogram.fromBytes(v1(2, 4));
    expect(weighted.count).toBeNull();
    expect(Number.isNaN(weighted.outsideCount)).toBe(true);
  });

  it('stores a well-filled histogram densely, keeping ln(R/Δ) and R', () => {
    const grid: PlaneGrid = { ...SMALL, horizontal: 'lnRoverDelta', R: 0.8 };
    const h = new PlaneHistogram(grid);
    const points: Array<[number, number]> = [];
    for (let ix = 0; ix < 4; ix++) for (let iy = 0; iy < 3; iy++) points.push([0.25 + 0.5 * ix - Math.log(0.8), 0.5 + iy]);
    h.fillJet(splittings(points), 0.5);
    expect(Array.from(h.sumW)).toEqual(new Array(12).fill(0.5));
    const bytes = h.toBytes();
    expect(bytes.length).toBe(102 + 12 * 24); // 12 filled bins: sparse would need 12 · 28 = 336 > 288 bytes
    const copy = PlaneHistogram.fromBytes(bytes);
    expect(copy.grid).toEqual(grid);
    expect(Array.from(copy.sumW2)).toEqual(new Array(12).fill(0.25));
  });

  it('refuses damaged bytes', () => {
    const bytes = handFilled().toBytes();
    expect(() => PlaneHistogram.fromBytes(bytes.subarray(0, 50))).toThrow(/too short/);
    expect(() => PlaneHistogram.fromBytes(bytes.subarray(0, 150))).toThrow(/length 150 does not match the 186/);
    const wrongMagic = bytes.slice();
    wrongMagic[0] = 0x58;
    expect(() => PlaneHistogram.fromBytes(wrongMagic)).toThrow(/not a plane histogram/);
    const wrongVersion = bytes.slice();
    wrongVersion[4] = 7;
    expect(() => PlaneHistogram.fromBytes(wrongVersion)).toThrow(/unsupported version 7/);
    const badIndex = bytes.slice();
    new DataView(badIndex.buffer).setUint32(102, 99, true);
    expect(() => PlaneHistogram.fromBytes(badIndex)).toThrow(/bin index 99 out of order or range/);
    expect(() => PlaneHistogram.fromBase64('not base64 ***')).toThrow(/not valid base64/);
  });
});
