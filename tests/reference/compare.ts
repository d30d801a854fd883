// Comparison of processParticles results with fastjet-ref output (Reference: FastJet 3.4.0 (Debian libfastjet-dev)).
// Tolerance: 1e-9 relative, with absolute floors for values that can be near 0 (PHYSICS.md conventions).
// What is left after identical clustering sequences is last-bit differences between V8's and glibc's log/atan2,
// amplified where rapidities are subtracted (ψ, Δ of very collinear pairs): hence ψ's floor grows like 1/Δ.

import { processRecord } from '../../lib/physics/process-record';
import type { ProcessSettings, RecordExtras, RecordResult } from '../../lib/physics/types';
import { SPLIT_FIELDS, SPLIT_STRIDE, S_DELTA } from '../../lib/physics/types';
import { runFastjetRef, settingsFor, type RefInput, type RefOptions, type RefOutput } from './fastjet';

export const REL_TOL = 1e-9;

const FLOORS: Record<string, number> = {
  pt: 1e-9, y: 1e-9, phi: 1e-9, m: 1e-9, E: 1e-9, theta: 1e-12,
  lnInvDelta: 1e-9, lnKt: 1e-9, z: 1e-12, delta: 1e-12, kt: 1e-9, psi: 1e-9, kappa: 1e-12, generation: 0,
  mg: 1e-9, zg: 1e-12, Rg: 1e-12,
};

export interface CompareOptions {
  /** Absolute floor for masses (GeV); inputs converted from (pt, y, φ, m) differ in the last bits. */
  massFloor?: number;
}

/** Wrapped difference for angles (φ in [0, 2π) and ψ in (−π, π] may land on either side of the cut). */
function angleDiff(a: number, b: number): number {
  const d = Math.abs(a - b) % (2 * Math.PI);
  return Math.min(d, 2 * Math.PI - d);
}

export function close(field: string, a: number, b: number, o: CompareOptions = {}, delta = 1): boolean {
  if (Number.isNaN(a) && Number.isNaN(b)) return true;
  if (a === b) return true;
  // The export (and fastjet-ref) writes NaN and ±∞ as null, read back as NaN: e.g. ln(1/Δ) of a Δ = 0 splitting.
  if ((Number.isNaN(b) && !Number.isFinite(a)) || (Number.isNaN(a) && !Number.isFinite(b))) return true;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
  const diff = field === 'phi' || field === 'psi' ? angleDiff(a, b) : Math.abs(a - b);
  let floor = FLOORS[field] ?? 1e-9;
  if ((field === 'm' || field === 'mg') && o.massFloor) floor = Math.max(floor, o.massFloor);
  if (field === 'psi') floor += 1e-13 / delta;
  return diff <= REL_TOL * Math.max(Math.abs(a), Math.abs(b)) + floor;
}

export interface Comparison {
  records: number;
  jets: number;
  splittings: number;
  mismatches: string[];
}

/** Compares our results with the reference, record by record; returns counts and mismatch descriptions. */
export function compareWithRef(ours: RecordResult[], ref: RefOutput, fullTree: boolean, o: CompareOptions = {}): Comparison {
  const mismatches: string[] = [];
  const bad = (msg: string) => {
    if (mismatches.length < 30) mismatches.push(msg);
  };
  let jets = 0, splittings = 0;
  if (ours.length !== ref.records.length) bad(`record count ${ours.length} vs reference ${ref.records.length}`);
  const nr = Math.min(ours.length, ref.records.length);
  for (let r = 0; r < nr; r++) {
    const a = ours[r], b = ref.records[r];
    const where = `record ${r} (${b.rec})`;
    if (a.rejected.pt !== b.rejected.pt || a.rejected.y !== b.rejected.y || a.rejected.rank !== b.rejected.rank) {
      bad(`${where}: rejected ${JSON.stringify(a.rejected)} vs ${JSON.stringify(b.rejected)}`);
    }
    if (b.removed && a.removed) {
      for (const [rule, count] of Object.entries(b.removed)) {
        if ((a.removed as unknown as Record<string, number>)[rule] !== count) bad(`${where}: removed ${rule} ${(a.removed as unknown as Record<string, number>)[rule]} vs ${count}`);
      }
    }
    if (a.jets.length !== b.jets.length) {
      bad(`${where}: ${a.jets.length} jets vs ${b.jets.length}`);
      continue;
    }
    for (let j = 0; j < a.jets.length; j++) {
      const x = a.jets[j], f = b.jets[j];
      const w = `${where} jet ${j}`;
      jets++;
      const kin = f.E !== undefined ? (['E', 'theta', 'phi', 'm'] as const) : (['pt', 'y', 'phi', 'm'] as const);
      for (const k of kin) {
        const v = x[k] ?? NaN;
        if (!close(k, v, f[k] ?? NaN, o)) bad(`${w}: ${k} ${v} vs ${f[k]}`);
      }
      if (x.n !== f.n) bad(`${w}: n ${x.n} vs ${f.n}`);
      if (x.multiplicity !== f.mult) bad(`${w}: multiplicity ${x.multiplicity} vs ${f.mult}`);
      const sd = [x.softDrop.mg, x.softDrop.zg, x.softDrop.Rg];
      (['mg', 'zg', 'Rg'] as const).forEach((k, q) => {
        if (!close(k, sd[q], f.sd[q], o)) bad(`${w}: SoftDrop ${k} ${sd[q]} vs ${f.sd[q]}`);
      });
      const lists: [string, Float64Array | null, number[][] | undefined][] = [['primary', x.primary, f.primaryFull]];
      if (fullTree) lists.push(['all', x.all, f.allFull]);
      for (const [name, mine, theirs] of lists) {
        if (!mine || !theirs) {
          bad(`${w}: ${name} missing (ours ${!!mine}, reference ${!!theirs})`);
          continue;
        }
        if (mine.length !== theirs.length * SPLIT_STRIDE) {
          bad(`${w}: ${name} has ${mine.length / SPLIT_STRIDE} splittings vs ${theirs.length}`);
          continue;
        }
        for (let s = 0; s < theirs.length; s++) {
          splittings++;
          const delta = theirs[s][S_DELTA];
          for (let q = 0; q < SPLIT_STRIDE; q++) {
            const v = mine[s * SPLIT_STRIDE + q];
            if (!close(SPLIT_FIELDS[q], v, theirs[s][q], o, delta)) {
              bad(`${w}: ${name}[${s}].${SPLIT_FIELDS[q]} ${v} vs ${theirs[s][q]}`);
            }
          }
        }
      }
      // The export columns of the reference agree with its full rows (self-consistency of fastjet-ref).
      f.primary.forEach((row, s) => {
        const full = f.primaryFull[s];
        if (row.some((v, q) => !(v === full[q] || (Number.isNaN(v) && Number.isNaN(full[q]))))) bad(`${w}: reference primary[${s}] columns`);
      });
    }
  }
  return { records: nr, jets, splittings, mismatches };
}

/** Runs both engines on the same records and compares them. Records are px,py,pz,E in GeV. */
export function crossCheck(
  content: 'events' | 'jets',
  records: Float64Array[],
  opts: RefOptions,
  o: CompareOptions = {},
  extras: RecordExtras[] = [],
): Comparison & { ref: RefOutput; ours: RecordResult[]; settings: ProcessSettings } {
  const input: RefInput = { content, records: records.map((p, i) => ({ id: `r${i}`, particles: p, pid: extras[i]?.pid, charge: extras[i]?.charge })) };
  const ref = runFastjetRef(input, opts);
  const settings = settingsFor(content, opts);
  const ours = records.map((p, i) => processRecord(p, extras[i], settings));
  return { ...compareWithRef(ours, ref, opts.all ?? false, o), ref, ours, settings };
}
