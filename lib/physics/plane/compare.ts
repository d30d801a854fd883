// Bin-by-bin comparison of per-jet densities of two samples on the same bins (PHYSICS.md "Telling samples apart"):
// ratio B/A, difference B − A, pull (B − A)/σ, with bins masked where either sample has fewer raw entries than a
// threshold; χ²/ndf over the unmasked bins; the mean ratio inside a box. The two samples are independent, so
// their variances add.
import type { DensityGrid } from './binned-plane';

export type ContrastMode = 'ratio' | 'difference' | 'pull';

/** b / a, NaN unless a > 0. */
export function ratio(a: number, b: number): number {
  return a > 0 ? b / a : Number.NaN;
}

/** Var(b/a) = Var b / a² + b² Var a / a⁴ (first order, independent a and b); NaN unless a > 0. */
export function ratioVariance(a: number, varA: number, b: number, varB: number): number {
  return a > 0 ? varB / (a * a) + (b * b * varA) / (a * a * a * a) : Number.NaN;
}

export interface ContrastGrid {
  mode: ContrastMode;
  /** Per bin; NaN where masked or undefined (ratio over an empty reference bin, pull with no error). */
  value: Float64Array;
  /** Variance of the ratio or the difference; for the pull, 1 where defined (it is in units of σ). */
  variance: Float64Array;
  /** 1 where a bin is masked for too few entries. */
  masked: Uint8Array;
}

function sameBins(a: DensityGrid, b: DensityGrid): void {
  const same = (p: Float64Array, q: Float64Array) => p.length === q.length && p.every((v, i) => v === q[i]);
  if (!same(a.xEdges, b.xEdges) || !same(a.yEdges, b.yEdges)) throw new RangeError('contrast: both maps need the same bins');
}

/**
 * Masked where either sample has fewer than `minEntries` raw (unweighted) splittings; when a raw count is not
 * known, the weighted sum stands in for it.
 */
export function entriesMask(a: DensityGrid, b: DensityGrid, minEntries: number): Uint8Array {
  sameBins(a, b);
  const masked = new Uint8Array(a.density.length);
  const area = (a.xEdges[1] - a.xEdges[0]) * (a.yEdges[1] - a.yEdges[0]);
  const entries = (m: DensityGrid, i: number) => (m.count ? m.count[i] : m.density[i] * m.jetWeight * area);
  for (let i = 0; i < masked.length; i++) masked[i] = entries(a, i) < minEntries || entries(b, i) < minEntries ? 1 : 0;
  return masked;
}

export function contrastGrid(a: DensityGrid, b: DensityGrid, mode: ContrastMode, minEntries: number): ContrastGrid {
  const masked = entriesMask(a, b, minEntries);
  const n = a.density.length;
  const value = new Float64Array(n);
  const variance = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ra = a.density[i];
    const rb = b.density[i];
    const va = a.variance[i];
    const vb = b.variance[i];
    if (masked[i]) {
      value[i] = Number.NaN;
      variance[i] = Number.NaN;
    } else if (mode === 'ratio') {
      value[i] = ratio(ra, rb);
      variance[i] = ratioVariance(ra, va, rb, vb);
    } else if (mode === 'difference') {
      value[i] = rb - ra;
      variance[i] = va + vb;
    } else {
      const sigma = Math.sqrt(va + vb);
      value[i] = sigma > 0 ? (rb - ra) / sigma : Number.NaN;
      variance[i] = sigma > 0 ? 1 : Number.NaN;
    }
  }
  return { mode, value, variance, masked };
}

/** χ² = Σ (ρ_B − ρ_A)² / (σ_A² + σ_B²) over unmasked bins with σ > 0; ndf = the number of such bins. */
export function chiSquare(a: DensityGrid, b: DensityGrid, masked: Uint8Array): { chi2: number; ndf: number } {
  sameBins(a, b);
  let chi2 = 0;
  let ndf = 0;
  for (let i = 0; i < a.density.length; i++) {
    const v = a.variance[i] + b.variance[i];
    if (masked[i] || !(v > 0)) continue;
    chi2 += (b.density[i] - a.density[i]) ** 2 / v;
    ndf++;
  }
  return { chi2, ndf };
}

/** A rectangle in plane coordinates. */
export interface Box {
  x1: number;
  x2: number;
  y1: number;
  y2: number;
}

export interface BoxIntegral {
  /** Splittings per jet inside the box (Σ ρ · area over the bins whose centres lie inside), and its variance. */
  value: number;
  variance: number;
  /** The bins summed. */
  bins: number;
}

/** ∫ρ over the bins whose centres lie in the box. */
export function boxIntegral(map: DensityGrid, box: Box): BoxIntegral {
  const [x1, x2] = box.x1 <= box.x2 ? [box.x1, box.x2] : [box.x2, box.x1];
  const [y1, y2] = box.y1 <= box.y2 ? [box.y1, box.y2] : [box.y2, box.y1];
  const nx = map.xEdges.length - 1;
  const ny = map.yEdges.length - 1;
  let value = 0;
  let variance = 0;
  let bins = 0;
  for (let iy = 0; iy < ny; iy++) {
    const yc = (map.yEdges[iy] + map.yEdges[iy + 1]) / 2;
    if (yc < y1 || yc > y2) continue;
    const dy = map.yEdges[iy + 1] - map.yEdges[iy];
    for (let ix = 0; ix < nx; ix++) {
      const xc = (map.xEdges[ix] + map.xEdges[ix + 1]) / 2;
      if (xc < x1 || xc > x2) continue;
      const area = dy * (map.xEdges[ix + 1] - map.xEdges[ix]);
      value += map.density[iy * nx + ix] * area;
      variance += map.variance[iy * nx + ix] * area * area;
      bins++;
    }
  }
  return { value, variance, bins };
}

/** Mean ratio B/A in a box: the ratio of the two integrals, with its error. */
export function boxRatio(a: DensityGrid, b: DensityGrid, box: Box): { a: BoxIntegral; b: BoxIntegral; ratio: number; error: number } {
  sameBins(a, b);
  const ia = boxIntegral(a, box);
  const ib = boxIntegral(b, box);
  return { a: ia, b: ib, ratio: ratio(ia.value, ib.value), error: Math.sqrt(ratioVariance(ia.value, ia.variance, ib.value, ib.variance)) };
}
