// Splitfield's columnar schema for particle files (Apache Parquet and Arrow IPC; README "Columnar input"), shared by
// both readers: which columns a file must have, and how a chunk of rows (a Parquet row group or an Arrow record
// batch) becomes records. Two layouts:
//  - lists: one row a record; momentum columns px,py,pz,E (or pt,y,phi,m, as the header says) are lists of numbers;
//    optional id (string or integer), weight (number), pid (list of integers), charge (list of numbers), and tag
//    particles tag_px,tag_py,tag_pz,tag_E (or tag_pt,...) with tag_pid (lists).
//  - flat: one row a particle; the integer column "record" numbers the records (a record's rows are consecutive,
//    the numbers never decrease: the record offsets are where it changes); momentum, pid and charge are plain
//    columns; id and weight, when given, repeat on each row of a record.
// The file's key-value metadata "splitfield" holds the splitfield-particles header object (format, version,
// content, momentum, energyUnit, sample). Errors name the row group (or record batch), the row and the column.

import { fromPtYPhiM, toGeV } from '../../physics/fourvector';
import { IngestError } from '../errors';
import { validateParticlesHeader, type IngestHeader } from '../header';
import { quickParticleProblem } from '../particle-scratch';
import type { ParticleRecord } from '../types';

/** What a reader found out about one column of the file. */
export interface ColumnShape {
  list: boolean;
  /** 'float' and 'int' are numbers; anything else is refused where a number is needed. */
  kind: 'float' | 'int' | 'string' | 'other';
  /** The type as the file states it, for messages. */
  typeText: string;
}

export interface ColumnPlan {
  layout: 'lists' | 'flat';
  momentum: readonly string[];
  tagMomentum: readonly string[] | null;
  pid: boolean;
  charge: boolean;
  id: boolean;
  weight: boolean;
  /** Every column to read. */
  columns: string[];
}

/** A numeric column of a chunk: its values, and for lists the offsets (rows + 1) into them. */
export interface NumberColumn {
  values: ArrayLike<number | bigint>;
  offsets: Int32Array | null;
}

export interface Chunk {
  /** Row group (Parquet) or record batch (Arrow), 0-based. */
  group: number;
  /** Row of the file (0-based) of the chunk's first row. */
  firstRow: number;
  rows: number;
  columns: Map<string, NumberColumn>;
  /** id column values (strings, numbers or bigints), when the file has one. */
  ids: ArrayLike<unknown> | null;
}

export const METADATA_KEY = 'splitfield';
const PX = ['px', 'py', 'pz', 'E'];
const PT = ['pt', 'y', 'phi', 'm'];

function fileError(msg: string, column?: string): IngestError {
  return new IngestError(msg, { column, code: 'columnar' });
}

/** The header from the file's "splitfield" metadata. */
export function columnarHeader(text: string | undefined, layout: IngestHeader['layout']): IngestHeader {
  if (text === undefined) {
    throw fileError(
      `the file has no "${METADATA_KEY}" key in its metadata: write the splitfield-particles header object there ` +
        '(see README "Columnar input"), e.g. {"format":"splitfield-particles","version":1,"content":"events"}',
    );
  }
  let obj: unknown;
  try {
    obj = JSON.parse(text);
  } catch (e) {
    throw fileError(`the "${METADATA_KEY}" metadata is not valid JSON: ${(e as Error).message}`);
  }
  try {
    return { ...validateParticlesHeader(obj, 0), layout, gzip: false };
  } catch (e) {
    if (e instanceof IngestError) throw new IngestError(`the "${METADATA_KEY}" metadata: ${e.detail}`, { code: e.code, field: e.field });
    throw e;
  }
}

function need(shapes: Map<string, ColumnShape>, name: string, list: boolean, kinds: string, what: string): void {
  const s = shapes.get(name);
  if (!s) throw fileError(`the file has no column "${name}" (${what})`, name);
  const ok = s.list === list && kinds.split('|').includes(s.kind);
  if (!ok) throw fileError(`expected ${list ? 'a list of ' : ''}${what}, found ${s.typeText}`, name);
}

/** Decides the layout from the momentum columns and checks every column the layout uses. */
export function planColumns(shapes: Map<string, ColumnShape>, header: IngestHeader): ColumnPlan {
  const momentum = header.momentum === 'pt,y,phi,m' ? PT : PX;
  const first = shapes.get(momentum[0]);
  if (!first) {
    const names = [...shapes.keys()].join(', ') || 'none';
    throw fileError(`the file has no column "${momentum[0]}": momentum "${header.momentum}" needs columns ${momentum.join(', ')} (found: ${names})`, momentum[0]);
  }
  const list = first.list;
  for (const m of momentum) need(shapes, m, list, 'float|int', 'numbers');
  const plan: ColumnPlan = { layout: list ? 'lists' : 'flat', momentum, tagMomentum: null, pid: false, charge: false, id: false, weight: false, columns: [...momentum] };
  if (!list) {
    need(shapes, 'record', false, 'int', 'integer record numbers (the flat layout numbers each particle\'s record)');
    plan.columns.push('record');
  }
  if (shapes.has('pid')) {
    need(shapes, 'pid', list, 'int', 'integer particle codes');
    plan.pid = true;
    plan.columns.push('pid');
  }
  if (shapes.has('charge')) {
    need(shapes, 'charge', list, 'float|int', 'numbers (charges)');
    plan.charge = true;
    plan.columns.push('charge');
  }
  if (shapes.has('id')) {
    need(shapes, 'id', false, 'string|int', 'record ids (strings or integers)');
    plan.id = true;
    plan.columns.push('id');
  }
  if (shapes.has('weight')) {
    need(shapes, 'weight', false, 'float|int', 'numbers (record weights)');
    plan.weight = true;
    plan.columns.push('weight');
  }
  const tags = momentum.map((m) => `tag_${m}`);
  if (tags.some((t) => shapes.has(t)) || shapes.has('tag_pid')) {
    if (!list) throw fileError('tag particles need the lists layout (one row a record)', 'tag_pid');
    for (const t of tags) need(shapes, t, true, 'float|int', 'numbers (tag particles)');
    need(shapes, 'tag_pid', true, 'int', 'integer particle codes (tag particles)');
    plan.tagMomentum = tags;
    plan.columns.push(...tags, 'tag_pid');
  }
  return plan;
}

function num(v: number | bigint): number {
  return typeof v === 'bigint' ? Number(v) : v;
}

/** Turns chunks into records; a flat-layout record may continue from one chunk into the next. */
export class RecordAssembler {
  private readonly k: number;
  private readonly ptForm: boolean;
  // Flat layout: the record being collected.
  private open: { key: number; group: number; row: number; id: unknown; weight: number; p: number[]; pid: number[]; charge: number[] } | null = null;

  constructor(
    private readonly plan: ColumnPlan,
    header: IngestHeader,
  ) {
    this.k = toGeV(header.energyUnit);
    this.ptForm = header.momentum === 'pt,y,phi,m';
  }

  private err(msg: string, c: Chunk, row: number, column?: string, particle?: number): IngestError {
    return new IngestError(msg, { rowGroup: c.group, line: row, where: 'row', column, particle, recordLevel: true, code: particle != null ? 'particle' : 'record' });
  }

  /** Writes particle i (4 numbers a..d in the file's convention) at out[4i], checked. */
  private put(a: number, b: number, c3: number, d: number, out: Float64Array, i: number, chunk: Chunk, row: number, names: readonly string[]): void {
    // (x − x === 0 is false for NaN and ±Infinity.)
    if (!(a - a === 0 && b - b === 0 && c3 - c3 === 0 && d - d === 0)) {
      const q = [a, b, c3, d].findIndex((v) => !Number.isFinite(v));
      throw this.err(`${names[q]} is not a finite number: ${[a, b, c3, d][q]}`, chunk, row, names[q], i);
    }
    const k = this.k;
    const at = 4 * i;
    if (this.ptForm) {
      if (a < 0) throw this.err(`pt must be >= 0, found ${a}`, chunk, row, names[0], i);
      if (d < 0) throw this.err(`negative mass m = ${d}`, chunk, row, names[3], i);
      fromPtYPhiM(a * k, b, c3, d * k, out, at);
    } else {
      out[at] = a * k;
      out[at + 1] = b * k;
      out[at + 2] = c3 * k;
      out[at + 3] = d * k;
    }
    const why = quickParticleProblem(out[at], out[at + 1], out[at + 2], out[at + 3]);
    if (why) throw this.err(why, chunk, row, undefined, i);
  }

  private id(c: Chunk, r: number, fallback: number): string | number {
    if (!c.ids) return fallback;
    const v = c.ids[r];
    if (typeof v === 'string') return v;
    if (typeof v === 'number' && Number.isFinite(v)) return v;
    if (typeof v === 'bigint') return Number(v);
    if (v === null || v === undefined) return fallback;
    throw this.err(`id must be a string or an integer, found ${String(v)}`, c, c.firstRow + r, 'id');
  }

  private weight(c: Chunk, r: number): number {
    const col = c.columns.get('weight');
    if (!col) return 1;
    const w = num(col.values[r]);
    if (!Number.isFinite(w)) throw this.err(`weight must be a finite number, found ${w}`, c, c.firstRow + r, 'weight');
    return w;
  }

  /** The list column's values of row r, checked to have n entries. */
  private span(c: Chunk, name: string, r: number, n: number | null): [number, number] {
    const col = c.columns.get(name)!;
    const off = col.offsets!;
    const a = off[r], b = off[r + 1];
    if (n !== null && b - a !== n) throw this.err(`has ${b - a} values, but the record has ${n} particles (column ${this.plan.momentum[0]})`, c, c.firstRow + r, name);
    return [a, b];
  }

  /** Lists layout: one record a row. Calls `add` with a parse function per row (so bad rows can be skipped). */
  listRecords(c: Chunk, add: (parse: () => ParticleRecord) => void): void {
    const [m0, m1, m2, m3] = this.plan.momentum.map((m) => c.columns.get(m)!.values);
    for (let r = 0; r < c.rows; r++) {
      add(() => {
        const row = c.firstRow + r;
        const [a0, b0] = this.span(c, this.plan.momentum[0], r, null);
        const n = b0 - a0;
        if (n === 0) throw this.err('the record has no particles', c, row, this.plan.momentum[0]);
        const starts = this.plan.momentum.map((m) => this.span(c, m, r, n)[0]);
        const particles = new Float64Array(4 * n);
        const [s0, s1, s2, s3] = starts;
        if (typeof m0[s0] === 'number' && typeof m1[s1] === 'number' && typeof m2[s2] === 'number' && typeof m3[s3] === 'number') {
          const f0 = m0 as ArrayLike<number>, f1 = m1 as ArrayLike<number>, f2 = m2 as ArrayLike<number>, f3 = m3 as ArrayLike<number>;
          for (let i = 0; i < n; i++) this.put(f0[s0 + i], f1[s1 + i], f2[s2 + i], f3[s3 + i], particles, i, c, row, this.plan.momentum);
        } else {
          for (let i = 0; i < n; i++) this.put(num(m0[s0 + i]), num(m1[s1 + i]), num(m2[s2 + i]), num(m3[s3 + i]), particles, i, c, row, this.plan.momentum);
        }
        const rec: ParticleRecord = { line: row, id: this.id(c, r, row), weight: this.weight(c, r), particles };
        if (this.plan.pid) rec.pid = this.ints(c, 'pid', r, n);
        if (this.plan.charge) rec.charge = this.numbers(c, 'charge', r, n);
        if (this.plan.tagMomentum) this.tags(c, r, rec);
        return rec;
      });
    }
  }

  private ints(c: Chunk, name: string, r: number, n: number | null): Int32Array {
    const [a, b] = this.span(c, name, r, n);
    const v = c.columns.get(name)!.values;
    const out = new Int32Array(b - a);
    for (let i = a; i < b; i++) {
      const x = num(v[i]);
      if (!Number.isInteger(x) || Math.abs(x) > 2147483647) throw this.err(`must be an integer particle code, found ${x}`, c, c.firstRow + r, name, i - a);
      out[i - a] = x;
    }
    return out;
  }

  private numbers(c: Chunk, name: string, r: number, n: number): Float64Array {
    const [a, b] = this.span(c, name, r, n);
    const v = c.columns.get(name)!.values;
    const out = new Float64Array(n);
    for (let i = a; i < b; i++) {
      const x = num(v[i]);
      if (!Number.isFinite(x)) throw this.err(`must be a finite number, found ${x}`, c, c.firstRow + r, name, i - a);
      out[i - a] = x;
    }
    return out;
  }

  private tags(c: Chunk, r: number, rec: ParticleRecord): void {
    const names = this.plan.tagMomentum!;
    const tagPid = this.ints(c, 'tag_pid', r, null);
    const n = tagPid.length;
    const starts = names.map((m) => this.span(c, m, r, n)[0]);
    const cols = names.map((m) => c.columns.get(m)!.values);
    const tags = new Float64Array(4 * n);
    for (let i = 0; i < n; i++) {
      this.put(num(cols[0][starts[0] + i]), num(cols[1][starts[1] + i]), num(cols[2][starts[2] + i]), num(cols[3][starts[3] + i]), tags, i, c, c.firstRow + r, names);
    }
    rec.tags = tags;
    rec.tagPid = tagPid;
  }

  /** Flat layout: rows grouped by "record"; a record still open at the chunk's end waits for the next chunk. */
  flatRecords(c: Chunk, add: (parse: () => ParticleRecord) => void): void {
    const [m0, m1, m2, m3] = this.plan.momentum.map((m) => c.columns.get(m)!.values);
    const key = c.columns.get('record')!.values;
    const pid = c.columns.get('pid')?.values;
    const charge = c.columns.get('charge')?.values;
    for (let r = 0; r < c.rows; r++) {
      const row = c.firstRow + r;
      const k = num(key[r]);
      if (this.open && k !== this.open.key) {
        if (k < this.open.key) throw this.err(`record numbers must not decrease (${k} after ${this.open.key}): a record's rows are consecutive`, c, row, 'record');
        this.close(add);
      }
      if (!this.open) {
        this.open = { key: k, group: c.group, row, id: c.ids ? this.id(c, r, k) : k, weight: this.weight(c, r), p: [], pid: [], charge: [] };
      }
      const o = this.open;
      o.p.push(num(m0[r]), num(m1[r]), num(m2[r]), num(m3[r]));
      if (pid) o.pid.push(num(pid[r]));
      if (charge) o.charge.push(num(charge[r]));
    }
  }

  /** Ends the open flat-layout record (call after the last chunk too). */
  close(add: (parse: () => ParticleRecord) => void): void {
    const o = this.open;
    if (!o) return;
    this.open = null;
    const chunk: Chunk = { group: o.group, firstRow: o.row, rows: 0, columns: new Map(), ids: null };
    add(() => {
      const n = o.p.length / 4;
      const particles = new Float64Array(4 * n);
      for (let i = 0; i < n; i++) this.put(o.p[4 * i], o.p[4 * i + 1], o.p[4 * i + 2], o.p[4 * i + 3], particles, i, chunk, o.row + i, this.plan.momentum);
      const rec: ParticleRecord = { line: o.row, id: o.id as string | number, weight: o.weight, particles };
      if (this.plan.pid) {
        rec.pid = new Int32Array(n);
        o.pid.forEach((x, i) => {
          if (!Number.isInteger(x) || Math.abs(x) > 2147483647) throw this.err(`must be an integer particle code, found ${x}`, chunk, o.row + i, 'pid');
          rec.pid![i] = x;
        });
      }
      if (this.plan.charge) {
        rec.charge = Float64Array.from(o.charge);
        const bad = o.charge.findIndex((x) => !Number.isFinite(x));
        if (bad >= 0) throw this.err(`must be a finite number, found ${o.charge[bad]}`, chunk, o.row + bad, 'charge');
      }
      return rec;
    });
  }
}
