// The particle buffer a record is read into, and the fast acceptance of a particle: shared by the record readers
// (record.ts, record-scan.ts, hepmc3-reader.ts, the columnar layouts).

import { particleProblem } from '../physics/fourvector';

/** A growable scratch buffer of particles (px, py, pz, E), reused from record to record. */
export class ParticleScratch {
  buf = new Float64Array(4 * 1024);
  /** Room for `doubles` values; what the buffer holds is kept (a reader may grow it while it fills it). */
  ensure(doubles: number): Float64Array {
    if (this.buf.length < doubles) {
      const bigger = new Float64Array(Math.max(doubles, 2 * this.buf.length));
      bigger.set(this.buf);
      this.buf = bigger;
    }
    return this.buf;
  }
}

/** A record whose particles were written into a ParticleScratch (the first 4·n doubles). */
export interface ParsedRecord {
  line: number;
  id: string | number;
  weight: number;
  n: number;
  pid?: Int32Array;
  charge?: Float64Array;
  /** Tag particles (px, py, pz, E in GeV) and their pids (record-tags.ts). */
  tags?: Float64Array;
  tagPid?: Int32Array;
}

// Fast acceptance of a particle: finite, E > |pz| and E² ≥ p²·(1 − 1e-6) (a margin inside particleProblem's
// E ≥ |p|·(1 − 1e-6), so that anything near the edge gets particleProblem's exact verdict and message).
const FAST_OK = 1 - 1e-6;

/** Why a particle is not acceptable input (particleProblem's message), or null; fast for the usual good particle. */
export function quickParticleProblem(px: number, py: number, pz: number, E: number): string | null {
  // (x − x === 0 is false for NaN and ±Infinity.)
  const fine = px - px === 0 && py - py === 0 && pz - pz === 0 && E - E === 0 && E > (pz < 0 ? -pz : pz) && E * E >= (px * px + py * py + pz * pz) * FAST_OK;
  return fine ? null : particleProblem(px, py, pz, E);
}
