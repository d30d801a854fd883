// One splitfield-particles record line: from bytes, the usual line is read by record-scan.ts in one pass; any
// other line, and lines given as strings, go through JSON.parse and the full checks here (plain loops check every
// number, particleProblem in fourvector.ts the physics), which name the problem with its line, particle and field.

import { fromPtYPhiM, toGeV } from '../physics/fourvector';
import { IngestError, type IngestWhere } from './errors';
import { ParticleScratch, quickParticleProblem, type ParsedRecord } from './particle-scratch';
import { scanRecordLine } from './record-scan';
import { parseRecordTags } from './record-tags';
import type { ParticleRecord, RecordContext } from './types';

const PX_NAMES = ['px', 'py', 'pz', 'E'];
const PT_NAMES = ['pt', 'y', 'phi', 'm'];

function show(v: unknown): string {
  if (v === undefined) return 'nothing';
  // JSON reads a number beyond the range of a double (1e400) as ±Infinity, which JSON.stringify would call null.
  if (typeof v === 'number' && !Number.isFinite(v)) return `${v} (a number beyond the range of a double, such as 1e400)`;
  let s: string;
  try {
    s = JSON.stringify(v) ?? String(v);
  } catch {
    // Nested too deeply to print (the printers recurse); say what it is instead.
    s = Array.isArray(v) ? 'an array nested too deeply to show' : 'a value nested too deeply to show';
  }
  return s.length > 60 ? s.slice(0, 57) + '...' : s;
}

function recErr(msg: string, line: number, where: IngestWhere, particle?: number, field?: string): IngestError {
  return new IngestError(msg, { line, particle, field, where, recordLevel: true, code: particle != null ? 'particle' : 'record' });
}

/**
 * Validates a parsed record object and writes its particles (px, py, pz, E in GeV) into `scratch`;
 * throws an IngestError naming the line and particle.
 */
export function parseRecordObjectInto(obj: unknown, line: number, ctx: RecordContext, scratch: ParticleScratch): ParsedRecord {
  const where = ctx.where;
  if (obj === null || typeof obj !== 'object' || Array.isArray(obj)) {
    throw recErr(`a record must be a JSON object {"id":..,"weight":..,"particles":[[px,py,pz,E],...]}, found ${show(obj)}`, line, where);
  }
  const o = obj as Record<string, unknown>;
  const ps = o.particles;
  if (ps === undefined) throw recErr('the record has no "particles" field', line, where, undefined, 'particles');
  if (!Array.isArray(ps)) throw recErr(`"particles" must be an array of particles, found ${show(ps)}`, line, where, undefined, 'particles');
  const n = ps.length;
  if (n === 0) throw recErr('the record has no particles ("particles" is empty)', line, where, undefined, 'particles');

  let id: string | number;
  const rid = o.id;
  if (rid === undefined || rid === null) id = line;
  else if (typeof rid === 'string' || (typeof rid === 'number' && Number.isFinite(rid))) id = rid;
  else throw recErr(`"id" must be a string or a number, found ${show(rid)}`, line, where, undefined, 'id');

  let weight = 1;
  const w = o.weight;
  if (w !== undefined) {
    if (typeof w !== 'number' || !Number.isFinite(w)) throw recErr(`"weight" must be a finite number, found ${show(w)}`, line, where, undefined, 'weight');
    weight = w;
  }

  const out = scratch.ensure(4 * n);
  const k = toGeV(ctx.energyUnit);
  const ptForm = ctx.momentum === 'pt,y,phi,m';
  const names = ptForm ? PT_NAMES : PX_NAMES;
  for (let i = 0; i < n; i++) {
    const p = ps[i];
    if (!Array.isArray(p) || p.length !== 4) {
      throw recErr(`a particle must be an array of 4 numbers [${names.join(',')}], found ${show(p)}`, line, where, i);
    }
    const a = p[0], b = p[1], c = p[2], d = p[3];
    if (typeof a !== 'number' || typeof b !== 'number' || typeof c !== 'number' || typeof d !== 'number') {
      const j = typeof a !== 'number' ? 0 : typeof b !== 'number' ? 1 : typeof c !== 'number' ? 2 : 3;
      const v = p[j];
      const what = v === 'NaN' || v === 'nan' ? 'NaN' : /^-?(Infinity|inf)$/i.test(String(v)) && typeof v === 'string' ? String(v) : show(v);
      throw recErr(`${names[j]} is not a number: ${what}`, line, where, i, names[j]);
    }
    const at = 4 * i;
    let px: number, py: number, pz: number, E: number;
    if (ptForm) {
      if (!(a >= 0) || !Number.isFinite(a)) throw recErr(`pt must be a finite number >= 0, found ${a}`, line, where, i, 'pt');
      if (!Number.isFinite(b) || !Number.isFinite(c) || !Number.isFinite(d)) {
        throw recErr('momentum components must be finite numbers (NaN or Infinity found)', line, where, i);
      }
      if (d < 0) throw recErr(`negative mass m = ${d}`, line, where, i, 'm');
      fromPtYPhiM(a * k, b, c, d * k, out, at);
      px = out[at];
      py = out[at + 1];
      pz = out[at + 2];
      E = out[at + 3];
    } else {
      px = out[at] = a * k;
      py = out[at + 1] = b * k;
      pz = out[at + 2] = c * k;
      E = out[at + 3] = d * k;
    }
    const prob = quickParticleProblem(px, py, pz, E);
    if (prob !== null) throw recErr(prob, line, where, i);
  }

  const rec: ParsedRecord = { line, id, weight, n };
  const pid = o.pid;
  if (pid !== undefined) {
    if (!Array.isArray(pid) || pid.length !== n) throw recErr(`"pid" must be an array of ${n} integers (one per particle)`, line, where, undefined, 'pid');
    const arr = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const v = pid[i];
      if (typeof v !== 'number' || !Number.isInteger(v) || Math.abs(v) > 2147483647) throw recErr(`pid must be an integer, found ${show(v)}`, line, where, i, 'pid');
      arr[i] = v;
    }
    rec.pid = arr;
  }
  const ch = o.charge;
  if (ch !== undefined) {
    if (!Array.isArray(ch) || ch.length !== n) throw recErr(`"charge" must be an array of ${n} numbers (one per particle)`, line, where, undefined, 'charge');
    const arr = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const v = ch[i];
      if (typeof v !== 'number' || !Number.isFinite(v)) throw recErr(`charge must be a finite number, found ${show(v)}`, line, where, i, 'charge');
      arr[i] = v;
    }
    rec.charge = arr;
  }
  const tags = parseRecordTags(o, line, ctx);
  if (tags) {
    rec.tags = tags.tags;
    rec.tagPid = tags.tagPid;
  }
  return rec;
}

const sharedScratch = new ParticleScratch();

function toRecord(r: ParsedRecord, scratch: ParticleScratch): ParticleRecord {
  const rec: ParticleRecord = { line: r.line, id: r.id, weight: r.weight, particles: scratch.buf.slice(0, 4 * r.n) };
  if (r.pid) rec.pid = r.pid;
  if (r.charge) rec.charge = r.charge;
  if (r.tags) {
    rec.tags = r.tags;
    rec.tagPid = r.tagPid;
  }
  return rec;
}

/** Turns a parsed record object into a ParticleRecord, or throws an IngestError naming the line and particle. */
export function parseRecordObject(obj: unknown, line: number, ctx: RecordContext): ParticleRecord {
  return toRecord(parseRecordObjectInto(obj, line, ctx, sharedScratch), sharedScratch);
}

const NAN_TOKEN = /([:[,]\s*)(-?)(NaN|Infinity|nan|inf)(?=\s*[,\]}])/g;

/**
 * JSON.parse of one record line; on a syntax error, explains it (NaN/Infinity are named with their particle
 * when they are the cause). Always throws IngestError on failure.
 */
export function parseRecordLine(text: string, line: number, ctx: RecordContext): ParticleRecord {
  return toRecord(parseRecordLineInto(text, line, ctx, sharedScratch), sharedScratch);
}

/** As parseRecordLine, with the particles written into `scratch` (no allocation for them). */
export function parseRecordLineInto(text: string, line: number, ctx: RecordContext, scratch: ParticleScratch): ParsedRecord {
  let obj: unknown;
  try {
    obj = JSON.parse(text);
  } catch (e) {
    obj = explainJsonError(text, line, ctx, e as Error);
  }
  return parseRecordObjectInto(obj, line, ctx, scratch);
}

function explainJsonError(text: string, line: number, ctx: RecordContext, e: Error): never {
  if (NAN_TOKEN.test(text)) {
    NAN_TOKEN.lastIndex = 0;
    const patched = text.replace(NAN_TOKEN, (_m, pre: string, sign: string, tok: string) => `${pre}"${sign}${tok}"`);
    let obj: unknown;
    try {
      obj = JSON.parse(patched);
    } catch {
      obj = undefined;
    }
    if (obj !== undefined) {
      // Throws with the particle and component when the NaN sits in a momentum.
      parseRecordObject(obj, line, ctx);
      throw recErr(`not valid JSON: NaN and Infinity are not JSON numbers (${e.message})`, line, ctx.where);
    }
  }
  NAN_TOKEN.lastIndex = 0;
  const t = text.trim();
  const hint = t.length === 0 ? '' : t[0] !== '{' ? ' (each record line must be one JSON object)' : '';
  throw recErr(`not valid JSON: ${e.message}${hint}`, line, ctx.where, undefined, undefined);
}

/** Decodes record lines that the one-pass reading leaves (invalid UTF-8 becomes U+FFFD, as for string lines). */
const utf8 = new TextDecoder('utf-8', { ignoreBOM: true });

/** As parseRecordLineInto, for the line bytes[start, end) (UTF-8): the usual line in one pass (record-scan.ts). */
export function parseRecordBytesInto(bytes: Uint8Array, start: number, end: number, line: number, ctx: RecordContext, scratch: ParticleScratch): ParsedRecord {
  return scanRecordLine(bytes, start, end, line, ctx, scratch) ?? parseRecordLineInto(utf8.decode(bytes.subarray(start, end)), line, ctx, scratch);
}
