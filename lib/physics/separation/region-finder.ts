// Regions of the plane where two samples differ most. Bins are ranked by their contribution to the symmetric χ²
// distance between the two per-jet emission densities, c = (ρ_S − ρ_B)² / (ρ_S + ρ_B) · area (PHYSICS.md "Telling
// samples apart" names it as a bin-level separation measure). From the best bin not yet in a region, a rectangle
// of bins is grown one row or column at a time, taking the step that raises the significance of the difference
// of emissions per jet inside it, Z = (S − B)/√(σ_S² + σ_B²) (signed as the seed's difference), until no step
// raises it. Regions do not overlap and hold no masked bin. At most `maxRegions` are proposed, best seed first.
import type { DensityGrid } from '../plane/binned-plane';
import { ratio, ratioVariance } from '../plane/compare';

export interface RegionProposal {
  rank: number;
  /** Bin index ranges, inclusive. */
  cells: { ix0: number; ix1: number; iy0: number; iy1: number };
  /** The rectangle in the plane's own coordinates. */
  rectangle: { x1: number; x2: number; y1: number; y2: number };
  /** Emissions per jet inside, with errors. */
  signalPerJet: number;
  signalError: number;
  backgroundPerJet: number;
  backgroundError: number;
  /** Mean densities inside (per jet per unit area). */
  signalDensity: number;
  backgroundDensity: number;
  /** S/B of the emissions per jet, and its error. */
  ratio: number;
  ratioError: number;
  /** (S − B)/√(σ_S² + σ_B²). */
  significance: number;
  /** Σ of the bins' symmetric χ² contributions inside. */
  chi2Contribution: number;
}

/** Per bin: (ρ_S − ρ_B)² / (ρ_S + ρ_B) · area; 0 where masked or both empty. */
export function symmetricChi2Contributions(signal: DensityGrid, background: DensityGrid, masked: Uint8Array): Float64Array {
  const area = (signal.xEdges[1] - signal.xEdges[0]) * (signal.yEdges[1] - signal.yEdges[0]);
  const out = new Float64Array(masked.length);
  for (let i = 0; i < out.length; i++) {
    const s = signal.density[i];
    const b = background.density[i];
    out[i] = !masked[i] && s + b > 0 ? (((s - b) * (s - b)) / (s + b)) * area : 0;
  }
  return out;
}

interface Rect {
  ix0: number;
  ix1: number;
  iy0: number;
  iy1: number;
}

export function findRegions(signal: DensityGrid, background: DensityGrid, masked: Uint8Array, maxRegions = 5): RegionProposal[] {
  const nx = signal.xEdges.length - 1;
  const ny = signal.yEdges.length - 1;
  const area = (signal.xEdges[1] - signal.xEdges[0]) * (signal.yEdges[1] - signal.yEdges[0]);
  const contribution = symmetricChi2Contributions(signal, background, masked);
  const used = new Uint8Array(nx * ny);
  const order = Array.from(contribution.keys()).filter((i) => contribution[i] > 0).sort((a, b) => contribution[b] - contribution[a]);

  const sums = (r: Rect) => {
    let s = 0, b = 0, vs = 0, vb = 0, c = 0;
    for (let iy = r.iy0; iy <= r.iy1; iy++) {
      for (let ix = r.ix0; ix <= r.ix1; ix++) {
        const i = iy * nx + ix;
        s += signal.density[i];
        b += background.density[i];
        vs += signal.variance[i];
        vb += background.variance[i];
        c += contribution[i];
      }
    }
    return { s: s * area, b: b * area, vs: vs * area * area, vb: vb * area * area, c };
  };
  const free = (r: Rect) => {
    if (r.ix0 < 0 || r.iy0 < 0 || r.ix1 >= nx || r.iy1 >= ny) return false;
    for (let iy = r.iy0; iy <= r.iy1; iy++) for (let ix = r.ix0; ix <= r.ix1; ix++) if (used[iy * nx + ix] || masked[iy * nx + ix]) return false;
    return true;
  };

  const regions: RegionProposal[] = [];
  for (const seed of order) {
    if (regions.length >= maxRegions) break;
    if (used[seed]) continue;
    const sign = signal.density[seed] >= background.density[seed] ? 1 : -1;
    const z = (r: Rect) => {
      const t = sums(r);
      const v = t.vs + t.vb;
      return v > 0 ? (sign * (t.s - t.b)) / Math.sqrt(v) : 0;
    };
    let rect: Rect = { ix0: seed % nx, ix1: seed % nx, iy0: Math.floor(seed / nx), iy1: Math.floor(seed / nx) };
    let best = z(rect);
    for (;;) {
      // Each step adds one row or column; only its new bins need to be free, the rest already are.
      const steps: Array<[Rect, Rect]> = [
        [{ ...rect, ix0: rect.ix0 - 1 }, { ...rect, ix0: rect.ix0 - 1, ix1: rect.ix0 - 1 }],
        [{ ...rect, ix1: rect.ix1 + 1 }, { ...rect, ix0: rect.ix1 + 1, ix1: rect.ix1 + 1 }],
        [{ ...rect, iy0: rect.iy0 - 1 }, { ...rect, iy0: rect.iy0 - 1, iy1: rect.iy0 - 1 }],
        [{ ...rect, iy1: rect.iy1 + 1 }, { ...rect, iy0: rect.iy1 + 1, iy1: rect.iy1 + 1 }],
      ];
      let chosen: Rect | null = null;
      for (const [grown, added] of steps) {
        if (!free(added)) continue;
        const value = z(grown);
        if (value > best) {
          best = value;
          chosen = grown;
        }
      }
      if (!chosen) break;
      rect = chosen;
    }
    for (let iy = rect.iy0; iy <= rect.iy1; iy++) for (let ix = rect.ix0; ix <= rect.ix1; ix++) used[iy * nx + ix] = 1;
    const t = sums(rect);
    const rectArea = area * (rect.ix1 - rect.ix0 + 1) * (rect.iy1 - rect.iy0 + 1);
    regions.push({
      rank: regions.length + 1,
      cells: rect,
      rectangle: { x1: signal.xEdges[rect.ix0], x2: signal.xEdges[rect.ix1 + 1], y1: signal.yEdges[rect.iy0], y2: signal.yEdges[rect.iy1 + 1] },
      signalPerJet: t.s,
      signalError: Math.sqrt(t.vs),
      backgroundPerJet: t.b,
      backgroundError: Math.sqrt(t.vb),
      signalDensity: t.s / rectArea,
      backgroundDensity: t.b / rectArea,
      ratio: ratio(t.b, t.s),
      ratioError: Math.sqrt(ratioVariance(t.b, t.vb, t.s, t.vs)),
      significance: best * sign,
      chi2Contribution: t.c,
    });
  }
  return regions;
}
