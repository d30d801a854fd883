// Constituent selection: which particles of a record take part in jet finding (or, for records that are single
// jets, in the re-clustering). Rules, each counted separately (a removed particle is counted under the first rule
// it fails, in this order): neutrinos (common practice for particle-level jets: they leave no trace), pid exclude
// list, pid include list, charged particles only (from the record's "charge", else from its pid through the
// "Monte Carlo particle numbering scheme" of the Review of Particle Physics), pt > ptMin, |y| or |η| < limit.

import { threeCharge, isNeutrino } from './particle-id';
import type { ConstituentSelection, RecordExtras, RemovedParticles } from './types';

/** The selection that keeps every particle. */
export const NO_SELECTION: ConstituentSelection = {
  dropNeutrinos: false,
  pidExclude: [],
  pidInclude: [],
  chargedOnly: false,
  ptMin: 0,
  rapidityMax: null,
  rapidityKind: 'y',
};

/** True when the selection removes nothing whatever the particles. */
export function selectsAll(s: ConstituentSelection | undefined): boolean {
  return (
    !s ||
    (!s.dropNeutrinos && s.pidExclude.length === 0 && s.pidInclude.length === 0 && !s.chargedOnly && !(s.ptMin > 0) && s.rapidityMax === null)
  );
}

export function noneRemoved(): RemovedParticles {
  return { neutrino: 0, pidExcluded: 0, pidNotIncluded: 0, neutral: 0, pt: 0, rapidity: 0 };
}

/** Whether a rule needs per-particle pids (charged-only takes "charge" instead when the record has it). */
function needsPid(s: ConstituentSelection, extras: RecordExtras): string | null {
  if (s.dropNeutrinos) return 'dropping neutrinos';
  if (s.pidExclude.length) return 'the pid exclude list';
  if (s.pidInclude.length) return 'the pid include list';
  if (s.chargedOnly && !extras.charge) return 'charged-only';
  return null;
}

/**
 * Writes the kept particles of `p` (px, py, pz, E interleaved) into `out` (grown when needed) and adds the removed
 * ones to `removed`. Returns the kept particles (a view of the returned buffer). Throws an Error naming the rule
 * when the record lacks the pid or charge it needs.
 */
export function selectConstituents(
  p: Float64Array,
  extras: RecordExtras,
  s: ConstituentSelection,
  out: Float64Array,
  removed: RemovedParticles,
): Float64Array {
  const n = p.length >> 2;
  const rule = needsPid(s, extras);
  const pid = extras.pid;
  if (rule && !pid) {
    const what = rule === 'charged-only' ? 'per-particle "charge" or "pid"' : 'per-particle "pid"';
    throw new Error(`the constituent selection (${rule}) needs ${what}, and this record has neither`);
  }
  if (out.length < p.length) throw new RangeError('selectConstituents: the output buffer is too small');
  const exclude = s.pidExclude.length ? new Set(s.pidExclude.map(Math.abs)) : null;
  const include = s.pidInclude.length ? new Set(s.pidInclude.map(Math.abs)) : null;
  const charge = extras.charge;
  const ptMin2 = s.ptMin > 0 ? s.ptMin * s.ptMin : -1;
  const rmax = s.rapidityMax;
  const eta = s.rapidityKind === 'eta';
  let kept = 0;
  for (let i = 0, at = 0; i < n; i++, at += 4) {
    const px = p[at], py = p[at + 1], pz = p[at + 2], E = p[at + 3];
    if (pid) {
      const code = pid[i];
      if (s.dropNeutrinos && isNeutrino(code)) {
        removed.neutrino++;
        continue;
      }
      if (exclude && exclude.has(Math.abs(code))) {
        removed.pidExcluded++;
        continue;
      }
      if (include && !include.has(Math.abs(code))) {
        removed.pidNotIncluded++;
        continue;
      }
    }
    if (s.chargedOnly) {
      let q: number;
      if (charge) q = charge[i];
      else {
        q = threeCharge(pid![i]);
        if (Number.isNaN(q)) throw new Error(`particle ${i}: pid ${pid![i]} has no charge in the particle numbering scheme (give "charge" instead)`);
      }
      if (q === 0) {
        removed.neutral++;
        continue;
      }
    }
    const pt2 = px * px + py * py;
    if (!(pt2 > ptMin2)) {
      removed.pt++;
      continue;
    }
    if (rmax !== null) {
      const r = eta ? Math.asinh(pz / Math.sqrt(pt2)) : 0.5 * Math.log((E + pz) / (E - pz));
      if (!(Math.abs(r) < rmax)) {
        removed.rapidity++;
        continue;
      }
    }
    const to = 4 * kept++;
    out[to] = px;
    out[to + 1] = py;
    out[to + 2] = pz;
    out[to + 3] = E;
  }
  return out.subarray(0, 4 * kept);
}
