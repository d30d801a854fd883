// Fine-binned primary emission plane of a sample (PHYSICS.md "Declustering and the emission plane"):
// per-bin Σw and Σw², the jet normalisation N_jet = Σ w_jet, rebinning to the user's bins, per-jet densities with
// their variances, 1-D projections, merging, and a compact binary form for the SQLite cache.
import { S_LN_INV_DELTA, S_LN_KT, SPLIT_STRIDE } from './types';

/** Horizontal coordinate of the plane: ln(1/Δ), or ln(R/Δ) for a jet radius R. */
export type HorizontalCoordinate = 'lnInvDelta' | 'lnRoverDelta';

/** A fine axis: `bins` equal bins from `min` to `max`. */
export interface FineAxis {
  min: number;
  max: number;
  bins: number;
}

export interface PlaneGrid {
  horizontal: HorizontalCoordinate;
  /** Jet radius R when horizontal is ln(R/Δ), else null. */
  R: number | null;
  /** Horizontal axis (ln(1/Δ) or ln(R/Δ)). */
  x: FineAxis;
  /** Vertical axis, ln(kt/GeV). */
  y: FineAxis;
}

/**
 * Default fine axes, 0.05 wide bins, wide enough to hold every splitting a real sample makes, so that maps of any
 * range can be rebinned from them. Horizontal [-3, 16]: Δ from e³ ≈ 20 (more than the ΔR of any two particles within
 * |y| < 9) down to 1e-7. Vertical [-20, 10]: kt from 2 keV to
 * 22 TeV. What falls outside still (Δ = 0 among it) is counted in outsideWeight and shown as such.
 */
export const DEFAULT_X_AXIS: FineAxis = { min: -3, max: 16, bins: 380 };
export const DEFAULT_Y_AXIS: FineAxis = { min: -20, max: 10, bins: 600 };

/** The default fine grid for a horizontal coordinate (R is required for ln(R/Δ)). */
export function defaultGrid(horizontal: HorizontalCoordinate = 'lnInvDelta', R: number | null = null): PlaneGrid {
  return checkedGrid({ horizontal, R, x: { ...DEFAULT_X_AXIS }, y: { ...DEFAULT_Y_AXIS } });
}

/** A coarse axis chosen by the user: from `min` to `max` (both fine edges), `merge` fine bins per coarse bin. */
export interface CoarseAxis {
  min: number;
  max: number;
  merge: number;
}

/** A rebinned density: value at (ix, iy) is at index iy * nx + ix. */
export interface DensityMap {
  xEdges: Float64Array;
  yEdges: Float64Array;
  /** ρ = Σw / (N_jet · area) per unit horizontal coordinate and ln kt. */
  density: Float64Array;
  /** Σw² / (N_jet² · area²). */
  variance: Float64Array;
  /** N_jet = Σ w_jet. */
  jetWeight: number;
}

/** A 1-D projection: density per unit of the projected coordinate, integrated over the other within a range. */
export interface DensityProjection {
  edges: Float64Array;
  density: Float64Array;
  variance: Float64Array;
  jetWeight: number;
}

export type PlaneAxisName = 'x' | 'y';

const EDGE_TOLERANCE = 1e-6;
/** Bounds memory (2 doubles a bin) and the size of a cached histogram. */
const MAX_FINE_BINS = 4_000_000;

function axisProblem(axis: FineAxis): string | null {
  if (!Number.isFinite(axis.min) || !Number.isFinite(axis.max) || !(axis.max > axis.min)) {
    return `needs finite min < max (got ${axis.min}, ${axis.max})`;
  }
  if (!Number.isInteger(axis.bins) || axis.bins < 1 || axis.bins > 100_000) {
    return `needs an integer number of bins in 1..100000 (got ${axis.bins})`;
  }
  return null;
}

function checkedGrid(grid: PlaneGrid): PlaneGrid {
  for (const name of ['x', 'y'] as const) {
    const problem = axisProblem(grid[name]);
    if (problem) throw new RangeError(`plane grid: ${name} axis ${problem}`);
  }
  if (grid.x.bins * grid.y.bins > MAX_FINE_BINS) {
    throw new RangeError(`plane grid: ${grid.x.bins} × ${grid.y.bins} bins exceed the limit of ${MAX_FINE_BINS}`);
  }
  if (grid.horizontal === 'lnRoverDelta') {
    if (grid.R === null || !(grid.R > 0) || !Number.isFinite(grid.R)) {
      throw new RangeError(`plane grid: ln(R/Δ) needs a positive jet radius R (got ${grid.R})`);
    }
  } else if (grid.horizontal === 'lnInvDelta') {
    if (grid.R !== null) throw new RangeError('plane grid: R is only meaningful for the ln(R/Δ) coordinate');
  } else {
    throw new RangeError(`plane grid: unknown horizontal coordinate "${String(grid.horizontal)}"`);
  }
  return grid;
}

function sameGrid(a: PlaneGrid, b: PlaneGrid): boolean {
  const sameAxis = (p: FineAxis, q: FineAxis) => p.min === q.min && p.max === q.max && p.bins === q.bins;
  return a.horizontal === b.horizontal && a.R === b.R && sameAxis(a.x, b.x) && sameAxis(a.y, b.y);
}

/** Fine bin of v, or -1 outside [min, max). */
function fineIndex(axis: FineAxis, v: number): number {
  const i = Math.floor(((v - axis.min) * axis.bins) / (axis.max - axis.min));
  return i >= 0 && i < axis.bins ? i : -1;
}

function fineEdge(axis: FineAxis, i: number): number {
  return axis.min + (i * (axis.max - axis.min)) / axis.bins;
}

/** Fine index range [first, end) of [min, max], both of which must be fine edges inside the axis. */
function fineRange(axis: FineAxis, name: PlaneAxisName, min: number, max: number): [number, number] {
  const toIndex = (v: number, what: string) => {
    const exact = ((v - axis.min) * axis.bins) / (axis.max - axis.min);
    const i = Math.round(exact);
    if (!Number.isFinite(v) || Math.abs(exact - i) > EDGE_TOLERANCE || i < 0 || i > axis.bins) {
      const width = (axis.max - axis.min) / axis.bins;
      throw new RangeError(
        `${name} range ${what} = ${v} must be an edge of the fine grid (${axis.min} to ${axis.max} in steps of ${width})`,
      );
    }
    return i;
  };
  const first = toIndex(min, 'min');
  const end = toIndex(max, 'max');
  if (end <= first) throw new RangeError(`${name} range is empty: min ${min} must be below max ${max}`);
  return [first, end];
}

interface CoarseLayout {
  first: number;
  merge: number;
  bins: number;
  edges: Float64Array;
}

function coarseLayout(axis: FineAxis, name: PlaneAxisName, coarse: CoarseAxis): CoarseLayout {
  if (!Number.isInteger(coarse.merge) || coarse.merge < 1) {
    throw new RangeError(`${name} merge factor must be a positive integer (got ${coarse.merge})`);
  }
  const [first, end] = fineRange(axis, name, coarse.min, coarse.max);
  if ((end - first) % coarse.merge !== 0) {
    throw new RangeError(
      `${name} range ${coarse.min}..${coarse.max} holds ${end - first} fine bins, not a multiple of merge ${coarse.merge}`,
    );
  }
  const bins = (end - first) / coarse.merge;
  const edges = new Float64Array(bins + 1);
  for (let k = 0; k <= bins; k++) edges[k] = fineEdge(axis, first + k * coarse.merge);
  return { first, merge: coarse.merge, bins, edges };
}

function checkedWeight(weight: number, what: string): number {
  if (!Number.isFinite(weight)) throw new RangeError(`${what} weight must be a finite number (got ${weight})`);
  return weight;
}

export class PlaneHistogram {
  readonly grid: PlaneGrid;
  /** Σw per fine bin, index iy * x.bins + ix. */
  readonly sumW: Float64Array;
  /** Σw² per fine bin. */
  readonly sumW2: Float64Array;
  /** Unweighted number of emissions per fine bin; null for a histogram read from the first binary version with
   * weights other than 1 (that version did not store it). */
  count: Float64Array | null;
  /** Number of jets filled (unweighted). */
  jetCount = 0;
  /** N_jet = Σ w_jet. */
  jetWeight = 0;
  /** Σ w_jet². */
  jetWeight2 = 0;
  /** Σw of emissions that fell outside the fine grid. */
  outsideWeight = 0;
  /** Unweighted number of emissions outside the fine grid (NaN when not known, see count). */
  outsideCount = 0;
  /** Added to ln(1/Δ) to get the horizontal coordinate: ln R for ln(R/Δ), else 0. */
  private readonly xShift: number;

  constructor(grid: PlaneGrid = defaultGrid()) {
    this.grid = checkedGrid(grid);
    this.xShift = grid.R === null ? 0 : Math.log(grid.R);
    const n = grid.x.bins * grid.y.bins;
    this.sumW = new Float64Array(n);
    this.sumW2 = new Float64Array(n);
    this.count = new Float64Array(n);
  }

  /** Counts one selected jet in the normalisation, whatever its emissions. */
  addJet(weight: number): void {
    checkedWeight(weight, 'jet');
    this.jetCount += 1;
    this.jetWeight += weight;
    this.jetWeight2 += weight * weight;
  }

  /** Adds one emission at (ln(1/Δ), ln kt) with its jet's weight; the jet itself is counted by addJet. */
  fillEmission(lnInvDelta: number, lnKt: number, weight: number): void {
    checkedWeight(weight, 'emission');
    const ix = fineIndex(this.grid.x, lnInvDelta + this.xShift);
    const iy = fineIndex(this.grid.y, lnKt);
    if (ix < 0 || iy < 0) {
      this.outsideWeight += weight;
      this.outsideCount += 1;
      return;
    }
    const at = iy * this.grid.x.bins + ix;
    this.sumW[at] += weight;
    this.sumW2[at] += weight * weight;
    if (this.count) this.count[at] += 1;
  }

  /** Fills one jet: its weight into N_jet and each splitting (SPLIT_STRIDE doubles, e.g. JetResult.primary). */
  fillJet(splittings: Float64Array, weight: number): void {
    if (splittings.length % SPLIT_STRIDE !== 0) {
      throw new RangeError(`splittings length ${splittings.length} is not a multiple of ${SPLIT_STRIDE}`);
    }
    this.addJet(weight);
    for (let at = 0; at < splittings.length; at += SPLIT_STRIDE) {
      this.fillEmission(splittings[at + S_LN_INV_DELTA], splittings[at + S_LN_KT], weight);
    }
  }

  /** A new histogram holding the sum of this one and `other` (same grid required). */
  merge(other: PlaneHistogram): PlaneHistogram {
    if (!sameGrid(this.grid, other.grid)) throw new RangeError('cannot merge plane histograms with different grids');
    const sum = new PlaneHistogram(this.grid);
    for (let i = 0; i < sum.sumW.length; i++) {
      sum.sumW[i] = this.sumW[i] + other.sumW[i];
      sum.sumW2[i] = this.sumW2[i] + other.sumW2[i];
    }
    if (this.count && other.count) {
      for (let i = 0; i < sum.count!.length; i++) sum.count![i] = this.count[i] + other.count[i];
    } else {
      sum.count = null;
    }
    sum.jetCount = this.jetCount + other.jetCount;
    sum.jetWeight = this.jetWeight + other.jetWeight;
    sum.jetWeight2 = this.jetWeight2 + other.jetWeight2;
    sum.outsideWeight = this.outsideWeight + other.outsideWeight;
    sum.outsideCount = this.outsideCount + other.outsideCount;
    return sum;
  }

  /** Density and variance on coarse bins made of whole fine bins. */
  rebin(x: CoarseAxis, y: CoarseAxis): DensityMap {
    if (!(this.jetWeight > 0)) {
      throw new RangeError(`no jets to normalise by (N_jet = ${this.jetWeight}): the density is undefined`);
    }
    const cx = coarseLayout(this.grid.x, 'x', x);
    const cy = coarseLayout(this.grid.y, 'y', y);
    const density = new Float64Array(cx.bins * cy.bins);
    const variance = new Float64Array(cx.bins * cy.bins);
    const fineNx = this.grid.x.bins;
    for (let ky = 0; ky < cy.bins; ky++) {
      for (let kx = 0; kx < cx.bins; kx++) {
        let w = 0;
        let w2 = 0;
        for (let iy = cy.first + ky * cy.merge; iy < cy.first + (ky + 1) * cy.merge; iy++) {
          for (let ix = cx.first + kx * cx.merge; ix < cx.first + (kx + 1) * cx.merge; ix++) {
            w += this.sumW[iy * fineNx + ix];
            w2 += this.sumW2[iy * fineNx + ix];
          }
        }
        const scale = this.jetWeight * (cx.edges[kx + 1] - cx.edges[kx]) * (cy.edges[ky + 1] - cy.edges[ky]);
        density[ky * cx.bins + kx] = w / scale;
        variance[ky * cx.bins + kx] = w2 / (scale * scale);
      }
    }
    return { xEdges: cx.edges, yEdges: cy.edges, density, variance, jetWeight: this.jetWeight };
  }

  /**
   * Density per unit of the `onto` coordinate on coarse bins, integrated over the other coordinate from
   * `over.min` to `over.max` (fine edges): the 2-D density of one wide bin times its width.
   */
  project(onto: PlaneAxisName, bins: CoarseAxis, over: { min: number; max: number }): DensityProjection {
    const other: PlaneAxisName = onto === 'x' ? 'y' : 'x';
    const [first, end] = fineRange(this.grid[other], other, over.min, over.max);
    const whole: CoarseAxis = { min: over.min, max: over.max, merge: end - first };
    const map = onto === 'x' ? this.rebin(bins, whole) : this.rebin(whole, bins);
    const otherEdges = onto === 'x' ? map.yEdges : map.xEdges;
    const width = otherEdges[1] - otherEdges[0];
    return {
      edges: onto === 'x' ? map.xEdges : map.yEdges,
      density: map.density.map((v) => v * width),
      variance: map.variance.map((v) => v * width * width),
      jetWeight: map.jetWeight,
    };
  }

  /** Compact little-endian binary form: dense or sparse, whichever is smaller. */
  toBytes(): Uint8Array {
    return encodePlaneHistogram(this);
  }

  static fromBytes(bytes: Uint8Array): PlaneHistogram {
    return decodePlaneHistogram(bytes);
  }

  toBase64(): string {
    const bytes = this.toBytes();
    const parts: string[] = [];
    for (let at = 0; at < bytes.length; at += 0x8000) {
      parts.push(String.fromCharCode(...bytes.subarray(at, at + 0x8000)));
    }
    return btoa(parts.join(''));
  }

  static fromBase64(text: string): PlaneHistogram {
    let binary: string;
    try {
      binary = atob(text);
    } catch {
      throw new RangeError('plane histogram: the cached text is not valid base64');
    }
    const bytes = new Uint8Array(binary.length);
    for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i);
    return decodePlaneHistogram(bytes);
  }
}

// Binary form, version 2, little-endian:
// "SFPH" | u32 version | u8 horizontal (0 ln(1/Δ), 1 ln(R/Δ)) | u8 storage (0 dense, 1 sparse) | f64 R (NaN if none)
// | x: f64 min, f64 max, u32 bins | y: same | f64 jetCount, jetWeight, jetWeight2, outsideWeight, outsideCount
// | u32 stored bins | dense: f64 sumW[n], f64 sumW2[n], f64 count[n]
// | sparse: u32 index[k] (increasing), f64 sumW[k], f64 sumW2[k], f64 count[k].
// Version 1 (still read) had neither outsideCount nor count.
const MAGIC = 'SFPH';
const FORMAT_VERSION = 2;
const HEADER_BYTES_V1 = 4 + 4 + 1 + 1 + 8 + 2 * (8 + 8 + 4) + 4 * 8 + 4;
const HEADER_BYTES = HEADER_BYTES_V1 + 8;

function encodePlaneHistogram(h: PlaneHistogram): Uint8Array {
  const n = h.sumW.length;
  const filled: number[] = [];
  for (let i = 0; i < n; i++) if (h.sumW[i] !== 0 || h.sumW2[i] !== 0) filled.push(i);
  const sparse = filled.length * 28 < n * 24;
  const stored = sparse ? filled.length : n;
  const bytes = new Uint8Array(HEADER_BYTES + stored * (sparse ? 28 : 24));
  const view = new DataView(bytes.buffer);
  let at = 0;
  const u8 = (v: number) => view.setUint8(at++, v);
  const u32 = (v: number) => (view.setUint32(at, v, true), (at += 4));
  const f64 = (v: number) => (view.setFloat64(at, v, true), (at += 8));
  for (let i = 0; i < 4; i++) u8(MAGIC.charCodeAt(i));
  u32(FORMAT_VERSION);
  u8(h.grid.horizontal === 'lnRoverDelta' ? 1 : 0);
  u8(sparse ? 1 : 0);
  f64(h.grid.R ?? Number.NaN);
  for (const axis of [h.grid.x, h.grid.y]) {
    f64(axis.min);
    f64(axis.max);
    u32(axis.bins);
  }
  f64(h.jetCount);
  f64(h.jetWeight);
  f64(h.jetWeight2);
  f64(h.outsideWeight);
  f64(h.count ? h.outsideCount : Number.NaN);
  u32(stored);
  const count = h.count ?? new Float64Array(n).fill(Number.NaN);
  const indices = sparse ? filled : Array.from({ length: n }, (_, i) => i);
  if (sparse) for (const i of indices) u32(i);
  for (const i of indices) f64(h.sumW[i]);
  for (const i of indices) f64(h.sumW2[i]);
  for (const i of indices) f64(count[i]);
  return bytes;
}

function decodePlaneHistogram(bytes: Uint8Array): PlaneHistogram {
  const fail = (why: string): never => {
    throw new RangeError(`plane histogram bytes: ${why}`);
  };
  if (bytes.length < HEADER_BYTES_V1) fail(`too short (${bytes.length} bytes, header needs ${HEADER_BYTES_V1})`);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let at = 0;
  const u8 = () => view.getUint8(at++);
  const u32 = () => ((at += 4), view.getUint32(at - 4, true));
  const f64 = () => ((at += 8), view.getFloat64(at - 8, true));
  const magic = String.fromCharCode(u8(), u8(), u8(), u8());
  if (magic !== MAGIC) fail(`not a plane histogram (magic "${magic}")`);
  const version = u32();
  if (version !== 1 && version !== FORMAT_VERSION) fail(`unsupported version ${version} (this code reads 1 and ${FORMAT_VERSION})`);
  const headerBytes = version === 1 ? HEADER_BYTES_V1 : HEADER_BYTES;
  if (bytes.length < headerBytes) fail(`too short (${bytes.length} bytes, header needs ${headerBytes})`);
  const horizontalCode = u8();
  if (horizontalCode > 1) fail(`unknown horizontal coordinate code ${horizontalCode}`);
  const storage = u8();
  if (storage > 1) fail(`unknown storage code ${storage}`);
  const R = f64();
  const readAxis = (): FineAxis => ({ min: f64(), max: f64(), bins: u32() });
  const x = readAxis();
  const y = readAxis();
  const h = new PlaneHistogram({
    horizontal: horizontalCode === 1 ? 'lnRoverDelta' : 'lnInvDelta',
    R: horizontalCode === 1 ? R : null,
    x,
    y,
  });
  h.jetCount = f64();
  h.jetWeight = f64();
  h.jetWeight2 = f64();
  h.outsideWeight = f64();
  h.outsideCount = version === 1 ? Number.NaN : f64();
  if (![h.jetCount, h.jetWeight, h.jetWeight2, h.outsideWeight].every(Number.isFinite)) fail('non-finite totals');
  const stored = u32();
  const n = h.sumW.length;
  const sparse = storage === 1;
  if (!sparse && stored !== n) fail(`dense storage of ${stored} bins for a grid of ${n}`);
  const perBin = (version === 1 ? 16 : 24) + (sparse ? 4 : 0);
  const expected = headerBytes + stored * perBin;
  if (bytes.length !== expected) fail(`length ${bytes.length} does not match the ${expected} its header announces`);
  const indices = new Uint32Array(stored);
  for (let k = 0; k < stored; k++) {
    indices[k] = sparse ? u32() : k;
    if (indices[k] >= n || (k > 0 && indices[k] <= indices[k - 1])) fail(`bin index ${indices[k]} out of order or range`);
  }
  for (const i of indices) h.sumW[i] = f64();
  for (const i of indices) h.sumW2[i] = f64();
  if (version === 1) {
    // Without stored counts, they are known only when every weight is 1 (then count = Σw, exactly).
    const unitWeights = h.jetWeight === h.jetCount && h.jetWeight2 === h.jetCount;
    h.count = unitWeights ? Float64Array.from(h.sumW) : null;
    h.outsideCount = unitWeights ? h.outsideWeight : Number.NaN;
  } else {
    for (const i of indices) h.count![i] = f64();
    if (Number.isNaN(h.outsideCount)) h.count = null;
  }
  return h;
}
