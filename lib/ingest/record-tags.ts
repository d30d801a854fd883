// The optional tag particles of a splitfield-particles record (format version 1, compatible extension): the
// heavy-flavour hadrons that flavour tags are ghost-associated from (PHYSICS.md "Flavour tags").
//   "tagParticles": [[px,py,pz,E], ...]   in the header's momentum convention and energy unit
//   "tagPid":       [511, ...]            one code of the particle numbering scheme per tag particle
// Both or neither; files without them stay valid, and other readers ignore unknown record fields.

import { fromPtYPhiM, particleProblem, toGeV } from '../physics/fourvector';
import { IngestError } from './errors';
import type { RecordContext } from './types';

function fail(msg: string, line: number, ctx: RecordContext, field: string, particle?: number): IngestError {
  return new IngestError(msg, { line, where: ctx.where, field, particle, particleLabel: 'tag particle', recordLevel: true, code: 'record' });
}

/** The record's tag particles (px, py, pz, E in GeV) and pids, or undefined when it has none. */
export function parseRecordTags(o: Record<string, unknown>, line: number, ctx: RecordContext): { tags: Float64Array; tagPid: Int32Array } | undefined {
  const list = o.tagParticles;
  const pids = o.tagPid;
  if (list === undefined && pids === undefined) return undefined;
  if (!Array.isArray(list)) throw fail('"tagParticles" must be an array of particles [[..4 numbers..], ...] (with "tagPid")', line, ctx, 'tagParticles');
  if (!Array.isArray(pids) || pids.length !== list.length) {
    throw fail(`"tagPid" must be an array of ${list.length} integers, one per tag particle`, line, ctx, 'tagPid');
  }
  const n = list.length;
  const tags = new Float64Array(4 * n);
  const tagPid = new Int32Array(n);
  const k = toGeV(ctx.energyUnit);
  for (let i = 0; i < n; i++) {
    const p = list[i];
    if (!Array.isArray(p) || p.length !== 4 || p.some((v) => typeof v !== 'number' || !Number.isFinite(v))) {
      throw fail('a tag particle must be an array of 4 finite numbers', line, ctx, 'tagParticles', i);
    }
    if (ctx.momentum === 'pt,y,phi,m') fromPtYPhiM(p[0] * k, p[1], p[2], p[3] * k, tags, 4 * i);
    else for (let c = 0; c < 4; c++) tags[4 * i + c] = p[c] * k;
    const why = particleProblem(tags[4 * i], tags[4 * i + 1], tags[4 * i + 2], tags[4 * i + 3]);
    if (why) throw fail(why, line, ctx, 'tagParticles', i);
    const pid = pids[i];
    if (typeof pid !== 'number' || !Number.isInteger(pid) || Math.abs(pid) > 2147483647) throw fail(`tagPid must be an integer, found ${String(pid)}`, line, ctx, 'tagPid', i);
    tagPid[i] = pid;
  }
  return { tags, tagPid };
}
