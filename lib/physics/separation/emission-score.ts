// The per-jet score of the Poisson emission model (PHYSICS.md "Telling samples apart"): if a jet's emissions in the
// plane are a Poisson process of density ρ_S (signal) or ρ_B (background), the log-likelihood ratio of a jet with
// emissions e_1 … e_n is Σ_k ln(ρ_S/ρ_B)(e_k) − ∫(ρ_S − ρ_B). Only unmasked bins take part: an emission in a masked
// bin or outside the bins adds nothing, and the integral runs over the unmasked bins (the model restricted to them).
// Scores are computed over typed columns in one pass over the splittings; larger means more signal-like.
import { type PlaneBins } from '../plane/binned-plane';

/** What scoring reads: the binned coordinates of each splitting, its jet, and whether it is in the plane's tree. */
export interface ScoreSource {
  xs: ArrayLike<number>;
  ys: ArrayLike<number>;
  jetRow: ArrayLike<number>;
  /** Per splitting: 1 when it belongs to the plane; null = all do. */
  member: Uint8Array | null;
  /** Per jet: 1 when the jet is to be scored. */
  jets: Uint8Array;
}

/** A table to score with: ln(ρ_S/ρ_B) per bin, 0 where masked, and the constant −∫(ρ_S − ρ_B). */
export interface ScoreTable {
  bins: PlaneBins;
  /** Per bin (iy · nx + ix): the term an emission there adds; 0 in masked bins. */
  term: Float64Array;
  /** Added to every jet's score: −∫(ρ_S − ρ_B) over the unmasked bins. */
  offset: number;
}

export function scoreTable(bins: PlaneBins, value: Float64Array, masked: Uint8Array, excessPerJet: number): ScoreTable {
  const term = new Float64Array(value.length);
  for (let i = 0; i < term.length; i++) term[i] = masked[i] ? 0 : value[i];
  return { bins, term, offset: -excessPerJet };
}

/**
 * The scores of the jets marked in `source.jets`, packed in jet order (the k-th marked jet's score at k). Jets not
 * marked are skipped; a marked jet without emissions in the bins scores the offset.
 */
export function scoreJets(table: ScoreTable, source: ScoreSource): Float64Array {
  const { xs, ys, jetRow, member, jets } = source;
  const slot = new Int32Array(jets.length).fill(-1);
  let count = 0;
  for (let j = 0; j < jets.length; j++) if (jets[j]) slot[j] = count++;
  const scores = new Float64Array(count).fill(table.offset);
  const { x, y } = table.bins;
  const nx = x.count;
  const ny = y.count;
  const term = table.term;
  for (let i = 0; i < xs.length; i++) {
    const k = slot[jetRow[i]];
    if (k < 0 || (member !== null && !member[i])) continue;
    const ix = Math.floor((xs[i] - x.min) / x.step);
    const iy = Math.floor((ys[i] - y.min) / y.step);
    // NaN fails both comparisons; a value exactly on the upper edge belongs to the last bin, as in binOf.
    if (ix >= 0 && ix < nx && iy >= 0 && iy < ny) scores[k] += term[iy * nx + ix];
    else if ((ix === nx && xs[i] === x.max && iy >= 0 && iy <= ny) || (iy === ny && ys[i] === y.max && ix >= 0 && ix <= nx)) {
      scores[k] += term[Math.min(iy, ny - 1) * nx + Math.min(ix, nx - 1)];
    }
  }
  return scores;
}

/** The jets' weights packed like scoreJets packs their scores. */
export function packed(values: ArrayLike<number>, jets: Uint8Array): Float64Array {
  let count = 0;
  for (let j = 0; j < jets.length; j++) count += jets[j];
  const out = new Float64Array(count);
  let k = 0;
  for (let j = 0; j < jets.length; j++) if (jets[j]) out[k++] = values[j];
  return out;
}
