// The per-bin log-likelihood ratio of two samples' per-jet emission densities, ln(ρ_S/ρ_B), on the same bins
// (PHYSICS.md "Telling samples apart"), with bins masked where either sample has fewer raw splittings than a
// threshold. Its error is first order in the two independent densities: Var = Var ρ_S/ρ_S² + Var ρ_B/ρ_B².
import type { DensityGrid } from '../plane/binned-plane';
import { entriesMask } from '../plane/compare';

export interface LogRatioTable {
  /** ln(ρ_S/ρ_B) per bin (index iy · nx + ix); NaN where masked. */
  value: Float64Array;
  /** Its standard error; NaN where masked. */
  error: Float64Array;
  /** 1 where masked (too few entries in either sample, or an empty bin). */
  masked: Uint8Array;
  /** ∫(ρ_S − ρ_B) over the unmasked bins: the Poisson model's expected excess of signal emissions per jet. */
  excessPerJet: number;
}

export function logRatioTable(signal: DensityGrid, background: DensityGrid, minEntries: number): LogRatioTable {
  const masked = entriesMask(signal, background, minEntries);
  const n = masked.length;
  const value = new Float64Array(n);
  const error = new Float64Array(n);
  const area = (signal.xEdges[1] - signal.xEdges[0]) * (signal.yEdges[1] - signal.yEdges[0]);
  let excess = 0;
  for (let i = 0; i < n; i++) {
    const s = signal.density[i];
    const b = background.density[i];
    // A weighted sample can leave a bin with entries but no positive density: no logarithm there.
    if (!masked[i] && !(s > 0 && b > 0)) masked[i] = 1;
    if (masked[i]) {
      value[i] = Number.NaN;
      error[i] = Number.NaN;
      continue;
    }
    value[i] = Math.log(s / b);
    error[i] = Math.sqrt(signal.variance[i] / (s * s) + background.variance[i] / (b * b));
    excess += (s - b) * area;
  }
  return { value, error, masked, excessPerJet: excess };
}
