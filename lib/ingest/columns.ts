// Binary column storage of one processed sample under a directory: a per-jet table, a per-splitting table and the
// record ids, each column one file of little-endian values, described by manifest.json. The writer streams into a
// hidden sibling directory and only commit() renames it into place, so readers never see a half-written sample.
import { randomUUID } from 'node:crypto';
import { type FileHandle, mkdir, open, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { endianness } from 'node:os';
import path from 'node:path';
import {
  type JetResult,
  type RecordResult,
  S_DELTA,
  S_GENERATION,
  S_KAPPA,
  S_KT,
  S_LN_INV_DELTA,
  S_LN_KT,
  S_M,
  S_PSI,
  S_Z,
  SPLIT_STRIDE,
} from '../physics/types';

export const COLUMNS_FORMAT = 'splitfield-columns';
export const COLUMNS_VERSION = 1;
export const MANIFEST_FILE = 'manifest.json';

export type ColumnType = 'float64' | 'int32';
type ColumnArray<T extends ColumnType> = T extends 'int32' ? Int32Array : Float64Array;

/** Per-jet table: `record` indexes the record id table, `jet` is the jet's index in its record (pt order). */
export const JET_COLUMNS = {
  record: 'int32',
  jet: 'int32',
  weight: 'float64',
  pt: 'float64',
  y: 'float64',
  phi: 'float64',
  m: 'float64',
  n: 'int32',
  mg: 'float64',
  zg: 'float64',
  Rg: 'float64',
  multiplicity: 'int32',
  flavour: 'int32',
  E: 'float64',
  theta: 'float64',
} as const satisfies Record<string, ColumnType>;

/**
 * Jet columns added after the first samples were stored: a sample without them reads them as their fill value
 * (flavour −1 = not tagged; E and theta NaN).
 */
const ADDED_JET_COLUMNS: Partial<Record<keyof typeof JET_COLUMNS, number>> = { flavour: -1, E: NaN, theta: NaN };

/** Per-splitting table: `jetRow` is the row of its jet in the jet table; primary splittings have generation 1. */
export const SPLITTING_COLUMNS = {
  jetRow: 'int32',
  generation: 'int32',
  lnInvDelta: 'float64',
  lnKt: 'float64',
  z: 'float64',
  delta: 'float64',
  kt: 'float64',
  psi: 'float64',
  m: 'float64',
  kappa: 'float64',
} as const satisfies Record<string, ColumnType>;

export type JetColumnName = keyof typeof JET_COLUMNS;
export type SplittingColumnName = keyof typeof SPLITTING_COLUMNS;

/** Where each splitting column's value sits within a splitting of the engine's Float64Array. */
export const SPLIT_FIELD_OF: Record<Exclude<SplittingColumnName, 'jetRow'>, number> = {
  generation: S_GENERATION,
  lnInvDelta: S_LN_INV_DELTA,
  lnKt: S_LN_KT,
  z: S_Z,
  delta: S_DELTA,
  kt: S_KT,
  psi: S_PSI,
  m: S_M,
  kappa: S_KAPPA,
};
export type TableName = 'jets' | 'splittings';

/** Which splittings a sample stores: the primary sequence, or the full C/A tree (primary = generation 1). */
export type StoredTree = 'primary' | 'full';

export interface ColumnManifest {
  format: typeof COLUMNS_FORMAT;
  version: typeof COLUMNS_VERSION;
  tree: StoredTree;
  records: { rows: number; bytes: number };
  jets: { rows: number; columns: Array<{ name: JetColumnName; type: ColumnType }> };
  splittings: { rows: number; columns: Array<{ name: SplittingColumnName; type: ColumnType }> };
}

/** One row of the jet table as the jet-table view shows it. */
export type JetRow = { row: number; recordId: string } & { [K in JetColumnName]: number };

/** What the writer needs of a record (the pipeline's RecordMeta fits). */
export interface RecordKey {
  id: string | number;
  weight: number;
}

const BYTES_PER_VALUE: Record<ColumnType, number> = { float64: 8, int32: 4 };
export const RECORD_OFFSETS_FILE = 'records.offsets.i32';
export const RECORD_IDS_FILE = 'records.ids.utf8';

export function columnFile(table: TableName, name: string, type: ColumnType): string {
  return `${table}.${name}.${type === 'int32' ? 'i32' : 'f64'}`;
}

function requireLittleEndian(): void {
  if (endianness() !== 'LE') throw new Error('column storage is little-endian and needs a little-endian platform');
}

/** A growable typed buffer that a column appends to and drains to its file. */
class ColumnBuffer<A extends Float64Array | Int32Array | Uint8Array> {
  private values: A;
  length = 0;

  constructor(private readonly make: (n: number) => A) {
    this.values = make(1024);
  }

  push(v: number): void {
    if (this.length === this.values.length) {
      const bigger = this.make(this.values.length * 2);
      bigger.set(this.values);
      this.values = bigger;
    }
    this.values[this.length++] = v;
  }

  pushAll(vs: Uint8Array): void {
    for (const v of vs) this.push(v);
  }

  async drainTo(file: FileHandle): Promise<void> {
    const bytes = new Uint8Array(this.values.buffer, 0, this.length * this.values.BYTES_PER_ELEMENT);
    let written = 0;
    while (written < bytes.length) written += (await file.write(bytes, written)).bytesWritten;
    this.length = 0;
  }
}

interface OpenColumn {
  buffer: ColumnBuffer<Float64Array | Int32Array | Uint8Array>;
  file: FileHandle;
}

export interface ColumnWriterOptions {
  /** Store the full tree (results must carry `all`) or only the primary sequence. Default 'primary'. */
  tree?: StoredTree;
  /** A column is written out once it holds this many values (bounds memory). Default 16384. */
  chunkValues?: number;
}

type WriterState = 'open' | 'committed' | 'aborted';

export class ColumnWriter {
  private state: WriterState = 'open';
  /** The jet columns in JET_COLUMNS order, with their names. */
  private readonly jetColumns: Array<[JetColumnName, ColumnBuffer<Float64Array | Int32Array | Uint8Array>]> = [];
  /** The splitting columns in SPLITTING_COLUMNS order, and where each one's value sits in a splitting (−1: jetRow). */
  private readonly splittingColumns: Array<ColumnBuffer<Float64Array | Int32Array | Uint8Array>> = [];
  private readonly splittingFields: number[] = [];
  private recordOffsets!: OpenColumn;
  private recordIds!: OpenColumn;
  /** Every column whose file is open, in opening order. */
  private readonly opened: OpenColumn[] = [];
  private rows: ColumnRows = { records: 0, recordBytes: 0, jets: 0, splittings: 0 };
  private readonly encoder = new TextEncoder();

  private constructor(
    /** Where commit() puts the sample. */
    readonly target: string,
    /** The hidden sibling directory being written. */
    readonly staging: string,
    readonly tree: StoredTree,
    private readonly chunkValues: number,
  ) {}

  /** Starts a sample that commit() will place at `target` (which must not exist yet). */
  static async create(target: string, options: ColumnWriterOptions = {}): Promise<ColumnWriter> {
    requireLittleEndian();
    const tree = options.tree ?? 'primary';
    if (tree !== 'primary' && tree !== 'full') throw new RangeError(`tree must be "primary" or "full" (got "${tree}")`);
    const chunkValues = options.chunkValues ?? 16384;
    if (!Number.isInteger(chunkValues) || chunkValues < 1) {
      throw new RangeError(`chunkValues must be a positive integer (got ${chunkValues})`);
    }
    const absolute = path.resolve(target);
    if (await exists(absolute)) throw new Error(`column store ${absolute} already exists`);
    await mkdir(path.dirname(absolute), { recursive: true });
    const staging = path.join(path.dirname(absolute), `.${path.basename(absolute)}.partial-${randomUUID()}`);
    await mkdir(staging);
    const writer = new ColumnWriter(absolute, staging, tree, chunkValues);
    try {
      await writer.openFiles();
    } catch (error) {
      await writer.abort();
      throw error;
    }
    return writer;
  }

  private async openColumn(file: string, make: (n: number) => Float64Array | Int32Array | Uint8Array): Promise<OpenColumn> {
    const column = { buffer: new ColumnBuffer(make), file: await open(path.join(this.staging, file), 'wx') };
    this.opened.push(column);
    return column;
  }

  private async openFiles(): Promise<void> {
    const typed = (type: ColumnType) => (type === 'int32' ? (n: number) => new Int32Array(n) : (n: number) => new Float64Array(n));
    for (const [name, type] of Object.entries(JET_COLUMNS) as Array<[JetColumnName, ColumnType]>) {
      this.jetColumns.push([name, (await this.openColumn(columnFile('jets', name, type), typed(type))).buffer]);
    }
    for (const [name, type] of Object.entries(SPLITTING_COLUMNS) as Array<[SplittingColumnName, ColumnType]>) {
      this.splittingColumns.push((await this.openColumn(columnFile('splittings', name, type), typed(type))).buffer);
      this.splittingFields.push(name === 'jetRow' ? -1 : SPLIT_FIELD_OF[name]);
    }
    this.recordOffsets = await this.openColumn(RECORD_OFFSETS_FILE, typed('int32'));
    this.recordIds = await this.openColumn(RECORD_IDS_FILE, (n) => new Uint8Array(n));
    this.recordOffsets.buffer.push(0);
  }

  private requireOpen(action: string): void {
    if (this.state !== 'open') throw new Error(`cannot ${action}: the column writer is already ${this.state}`);
  }

  /** Appends consecutive records with their results (same order and length); bounded memory across calls. */
  async append(records: readonly RecordKey[], results: readonly RecordResult[]): Promise<void> {
    this.requireOpen('append');
    const ids = this.checkedBatch(records, results);
    for (let r = 0; r < ids.length; r++) {
      const record = this.rows.records++;
      this.rows.recordBytes += ids[r].length;
      this.recordIds.buffer.pushAll(ids[r]);
      this.recordOffsets.buffer.push(this.rows.recordBytes);
      const jets = results[r].jets;
      for (let index = 0; index < jets.length; index++) this.pushJet(record, index, records[r].weight, jets[index]);
    }
    for (const column of this.opened) {
      if (column.buffer.length >= this.chunkValues) await column.buffer.drainTo(column.file);
    }
  }

  /** Validates a whole batch before anything is stored, so a bad batch leaves the tables aligned. */
  private checkedBatch(records: readonly RecordKey[], results: readonly RecordResult[]): Uint8Array[] {
    if (records.length !== results.length) {
      throw new RangeError(`append: ${records.length} records but ${results.length} results`);
    }
    let bytes = this.rows.recordBytes;
    return records.map((record, r) => {
      const where = `append: record ${this.rows.records + r + 1} of the sample`;
      const idOk = typeof record.id === 'string' || (typeof record.id === 'number' && Number.isFinite(record.id));
      if (!idOk) throw new RangeError(`${where}: id must be a string or a finite number`);
      if (!Number.isFinite(record.weight)) throw new RangeError(`${where}: weight must be a finite number (got ${record.weight})`);
      for (const jet of results[r].jets) {
        if (this.tree === 'full' && jet.all === null) {
          throw new RangeError(`${where}: the full tree is stored but a jet has no "all" splittings (process with fullTree)`);
        }
        const stored = this.tree === 'full' ? jet.all! : jet.primary;
        if (stored.length % SPLIT_STRIDE !== 0) throw new RangeError(`${where}: splittings length is not a multiple of ${SPLIT_STRIDE}`);
      }
      const id = this.encoder.encode(String(record.id));
      bytes += id.length;
      if (bytes > 0x7fffffff) throw new RangeError(`${where}: record ids exceed 2 GiB in total`);
      return id;
    });
  }

  private pushJet(record: number, index: number, weight: number, jet: JetResult): void {
    const jetRow = this.rows.jets++;
    const values: Record<JetColumnName, number> = {
      record,
      jet: index,
      weight,
      pt: jet.pt,
      y: jet.y,
      phi: jet.phi,
      m: jet.m,
      n: jet.n,
      mg: jet.softDrop.mg,
      zg: jet.softDrop.zg,
      Rg: jet.softDrop.Rg,
      multiplicity: jet.multiplicity,
      flavour: jet.flavour ?? -1,
      ...energyAndAngle(jet),
    };
    for (const [name, buffer] of this.jetColumns) buffer.push(values[name]);
    // Indexed loops over lists fixed at opening: this runs for every value of every splitting (iterating the
    // column Maps here took half of this function's time in a job).
    const splittings = this.tree === 'full' ? jet.all! : jet.primary;
    const columns = this.splittingColumns, fields = this.splittingFields;
    for (let at = 0; at < splittings.length; at += SPLIT_STRIDE) {
      for (let c = 0; c < columns.length; c++) {
        const field = fields[c];
        columns[c].push(field < 0 ? jetRow : splittings[at + field]);
      }
    }
    this.rows.splittings += splittings.length / SPLIT_STRIDE;
  }

  private async closeFiles(drain: boolean): Promise<void> {
    for (const column of this.opened) {
      if (drain) {
        await column.buffer.drainTo(column.file);
        await column.file.sync();
      }
      await column.file.close();
    }
  }

  /** Writes the manifest and renames the staging directory into place; on failure nothing is left behind. */
  async commit(): Promise<ColumnManifest> {
    this.requireOpen('commit');
    const manifest = columnManifest(this.tree, this.rows);
    try {
      await this.closeFiles(true);
      await writeFile(path.join(this.staging, MANIFEST_FILE), manifestText(manifest));
      if (await exists(this.target)) throw new Error(`column store ${this.target} appeared while writing; not replacing it`);
      await rename(this.staging, this.target);
    } catch (error) {
      this.state = 'aborted';
      await rm(this.staging, { recursive: true, force: true });
      throw error;
    }
    this.state = 'committed';
    return manifest;
  }

  /** Drops everything written so far. Safe to call more than once; a no-op after commit. */
  async abort(): Promise<void> {
    if (this.state !== 'open') return;
    this.state = 'aborted';
    try {
      await this.closeFiles(false);
    } finally {
      await rm(this.staging, { recursive: true, force: true });
    }
  }
}

/** Row counts of a column set. */
export interface ColumnRows {
  records: number;
  recordBytes: number;
  jets: number;
  splittings: number;
}

/** The manifest of a column set of the current version. */
export function columnManifest(tree: StoredTree, rows: ColumnRows): ColumnManifest {
  return {
    format: COLUMNS_FORMAT,
    version: COLUMNS_VERSION,
    tree,
    records: { rows: rows.records, bytes: rows.recordBytes },
    jets: { rows: rows.jets, columns: describe(JET_COLUMNS) },
    splittings: { rows: rows.splittings, columns: describe(SPLITTING_COLUMNS) },
  };
}

/** The manifest file's text (byte for byte what every writer writes). */
export function manifestText(manifest: ColumnManifest): string {
  return JSON.stringify(manifest, null, 1);
}

/** A jet's energy and polar angle: the e+e- engine's, or from pt, y and m. */
function energyAndAngle(jet: JetResult): { E: number; theta: number } {
  if (jet.E !== undefined && jet.theta !== undefined) return { E: jet.E, theta: jet.theta };
  const mt = Math.sqrt(jet.pt * jet.pt + jet.m * Math.abs(jet.m));
  return { E: mt * Math.cosh(jet.y), theta: Math.atan2(jet.pt, mt * Math.sinh(jet.y)) };
}

/** The jet columns a manifest lists: every current one, or those before ADDED_JET_COLUMNS existed. */
function storedJetColumns(listed: Array<{ name: string }>): Set<string> {
  return new Set(listed.map((c) => c.name));
}

function describe<T extends Record<string, ColumnType>>(columns: T): Array<{ name: keyof T & string; type: ColumnType }> {
  return Object.entries(columns).map(([name, type]) => ({ name: name as keyof T & string, type }));
}

async function exists(p: string): Promise<boolean> {
  try {
    await stat(p);
    return true;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return false;
    throw error;
  }
}

/** Largest page of the jet table one call returns. */
export const MAX_JET_PAGE = 10_000;

export class ColumnReader {
  /** The jet columns this sample stores (older samples lack ADDED_JET_COLUMNS). */
  readonly stored: Set<string>;
  private constructor(
    readonly directory: string,
    readonly manifest: ColumnManifest,
  ) {
    this.stored = storedJetColumns(manifest.jets.columns);
  }

  /** Rows of a jet column, or its fill value for a column this sample predates. */
  private jetRows<K extends JetColumnName>(name: K, first: number, count: number): Promise<ColumnArray<(typeof JET_COLUMNS)[K]>> {
    const type = JET_COLUMNS[name];
    if (!this.stored.has(name)) {
      const filled = type === 'int32' ? new Int32Array(count) : new Float64Array(count);
      filled.fill(ADDED_JET_COLUMNS[name] ?? 0);
      return Promise.resolve(filled as ColumnArray<(typeof JET_COLUMNS)[K]>);
    }
    return this.readRows(columnFile('jets', name, type), type, first, count);
  }

  /** Opens a committed sample, checking its manifest and that every file has the size the manifest implies. */
  static async open(directory: string): Promise<ColumnReader> {
    requireLittleEndian();
    const manifestPath = path.join(directory, MANIFEST_FILE);
    let text: string;
    try {
      text = await readFile(manifestPath, 'utf8');
    } catch (error) {
      throw new Error(`column store ${directory}: cannot read ${MANIFEST_FILE} (${(error as Error).message})`);
    }
    const manifest = checkedManifest(text, directory);
    const reader = new ColumnReader(directory, manifest);
    const expected: Array<[string, number]> = [
      [RECORD_OFFSETS_FILE, (manifest.records.rows + 1) * 4],
      [RECORD_IDS_FILE, manifest.records.bytes],
    ];
    for (const [name, type] of Object.entries(JET_COLUMNS)) {
      if (reader.stored.has(name)) expected.push([columnFile('jets', name, type), manifest.jets.rows * BYTES_PER_VALUE[type]]);
    }
    for (const [name, type] of Object.entries(SPLITTING_COLUMNS)) {
      expected.push([columnFile('splittings', name, type), manifest.splittings.rows * BYTES_PER_VALUE[type]]);
    }
    for (const [file, size] of expected) {
      const actual = await stat(path.join(/*turbopackIgnore: true*/ directory, file)).then(
        (s) => s.size,
        () => -1,
      );
      if (actual !== size) {
        throw new Error(`column store ${directory}: ${file} has ${actual < 0 ? 'gone missing' : `${actual} bytes, expected ${size}`}`);
      }
    }
    return reader;
  }

  /** Bytes [start, start + length) of one file, in a fresh buffer (aligned for typed-array views). */
  private async readBytes(file: string, start: number, length: number): Promise<ArrayBuffer> {
    const buffer = new ArrayBuffer(length);
    if (length === 0) return buffer;
    const handle = await open(path.join(this.directory, file), 'r');
    try {
      let done = 0;
      while (done < length) {
        const { bytesRead } = await handle.read(new Uint8Array(buffer, done), 0, length - done, start + done);
        if (bytesRead === 0) throw new Error(`column store ${this.directory}: ${file} ended early`);
        done += bytesRead;
      }
    } finally {
      await handle.close();
    }
    return buffer;
  }

  private async readRows<T extends ColumnType>(file: string, type: T, first: number, count: number): Promise<ColumnArray<T>> {
    const width = BYTES_PER_VALUE[type];
    const buffer = await this.readBytes(file, first * width, count * width);
    return (type === 'int32' ? new Int32Array(buffer) : new Float64Array(buffer)) as ColumnArray<T>;
  }

  /** A whole jet column. */
  jetColumn<K extends JetColumnName>(name: K): Promise<ColumnArray<(typeof JET_COLUMNS)[K]>> {
    const type = JET_COLUMNS[name];
    if (!type) return Promise.reject(new RangeError(`unknown jet column "${String(name)}"`));
    return this.jetRows(name, 0, this.manifest.jets.rows);
  }

  /** A whole splitting column. */
  splittingColumn<K extends SplittingColumnName>(name: K): Promise<ColumnArray<(typeof SPLITTING_COLUMNS)[K]>> {
    const type = SPLITTING_COLUMNS[name];
    if (!type) return Promise.reject(new RangeError(`unknown splitting column "${String(name)}"`));
    return this.readRows(columnFile('splittings', name, type), type, 0, this.manifest.splittings.rows);
  }

  /** Record ids [first, first + count), in record order. */
  async recordIds(first = 0, count = this.manifest.records.rows - first): Promise<string[]> {
    checkRange('record', first, count, this.manifest.records.rows);
    const offsets = await this.readRows(RECORD_OFFSETS_FILE, 'int32', first, count + 1);
    const bytes = new Uint8Array(await this.readBytes(RECORD_IDS_FILE, offsets[0], offsets[count] - offsets[0]));
    const decoder = new TextDecoder('utf-8', { fatal: true });
    const ids: string[] = [];
    for (let k = 0; k < count; k++) ids.push(decoder.decode(bytes.subarray(offsets[k] - offsets[0], offsets[k + 1] - offsets[0])));
    return ids;
  }

  /** Rows [first, first + count) of one jet column. */
  jetColumnRange<K extends JetColumnName>(name: K, first: number, count: number): Promise<ColumnArray<(typeof JET_COLUMNS)[K]>> {
    checkRange('jet', first, count, this.manifest.jets.rows);
    return this.jetRows(name, first, count);
  }

  /** Rows [first, first + count) of one splitting column. */
  splittingColumnRange<K extends SplittingColumnName>(
    name: K,
    first: number,
    count: number,
  ): Promise<ColumnArray<(typeof SPLITTING_COLUMNS)[K]>> {
    checkRange('splitting', first, count, this.manifest.splittings.rows);
    return this.readRows(columnFile('splittings', name, SPLITTING_COLUMNS[name]), SPLITTING_COLUMNS[name], first, count);
  }

  /** Values at scattered rows of one file (each file opened once, one small read a row). */
  private async readAt(file: string, type: ColumnType, rows: readonly number[]): Promise<Float64Array | Int32Array> {
    const width = BYTES_PER_VALUE[type];
    const buffer = new ArrayBuffer(rows.length * width);
    const handle = await open(path.join(this.directory, file), 'r');
    try {
      for (let k = 0; k < rows.length; k++) {
        const { bytesRead } = await handle.read(new Uint8Array(buffer, k * width, width), 0, width, rows[k] * width);
        if (bytesRead !== width) throw new Error(`column store ${this.directory}: ${file} ended early`);
      }
    } finally {
      await handle.close();
    }
    return type === 'int32' ? new Int32Array(buffer) : new Float64Array(buffer);
  }

  /** The jet table's rows with the given row numbers, in the order given (e.g. a page of a sorted view). */
  async jetRowsAt(rows: readonly number[]): Promise<JetRow[]> {
    for (const row of rows) checkRange('jet row', row, 1, this.manifest.jets.rows);
    const columns = {} as Record<JetColumnName, Float64Array | Int32Array>;
    for (const [name, type] of Object.entries(JET_COLUMNS) as Array<[JetColumnName, ColumnType]>) {
      columns[name] = this.stored.has(name) ? await this.readAt(columnFile('jets', name, type), type, rows) : await this.jetRows(name, 0, rows.length);
    }
    const records = Array.from(columns.record);
    const starts = await this.readAt(RECORD_OFFSETS_FILE, 'int32', records);
    const ends = await this.readAt(RECORD_OFFSETS_FILE, 'int32', records.map((record) => record + 1));
    const ids: string[] = [];
    for (let k = 0; k < rows.length; k++) {
      const bytes = new Uint8Array(await this.readBytes(RECORD_IDS_FILE, starts[k], ends[k] - starts[k]));
      ids.push(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
    }
    return rows.map((row, k) => {
      const jetRow = { row, recordId: ids[k] } as JetRow;
      for (const name of Object.keys(JET_COLUMNS) as JetColumnName[]) jetRow[name] = columns[name][k];
      return jetRow;
    });
  }

  /** Rows [offset, offset + limit) of the jet table (fewer at the end), reading only that range of each column. */
  async jetPage(offset: number, limit: number): Promise<JetRow[]> {
    if (!Number.isInteger(limit) || limit < 1 || limit > MAX_JET_PAGE) {
      throw new RangeError(`page limit must be an integer from 1 to ${MAX_JET_PAGE} (got ${limit})`);
    }
    if (!Number.isInteger(offset) || offset < 0) throw new RangeError(`page offset must be a non-negative integer (got ${offset})`);
    const count = Math.max(0, Math.min(limit, this.manifest.jets.rows - offset));
    if (count === 0) return [];
    const columns = {} as Record<JetColumnName, Float64Array | Int32Array>;
    for (const name of Object.keys(JET_COLUMNS) as JetColumnName[]) columns[name] = await this.jetRows(name, offset, count);
    const firstRecord = columns.record[0];
    const ids = await this.recordIds(firstRecord, columns.record[count - 1] - firstRecord + 1);
    const rows: JetRow[] = [];
    for (let k = 0; k < count; k++) {
      const row = { row: offset + k, recordId: ids[columns.record[k] - firstRecord] } as JetRow;
      for (const name of Object.keys(JET_COLUMNS) as JetColumnName[]) row[name] = columns[name][k];
      rows.push(row);
    }
    return rows;
  }
}

function checkRange(what: string, first: number, count: number, rows: number): void {
  if (!Number.isInteger(first) || !Number.isInteger(count) || first < 0 || count < 0 || first + count > rows) {
    throw new RangeError(`${what} range ${first}+${count} is outside 0..${rows}`);
  }
}

function checkedManifest(text: string, directory: string): ColumnManifest {
  const fail = (why: string): never => {
    throw new Error(`column store ${directory}: ${MANIFEST_FILE} ${why}`);
  };
  let m: ColumnManifest;
  try {
    m = JSON.parse(text) as ColumnManifest;
  } catch {
    return fail('is not valid JSON');
  }
  if (m === null || typeof m !== 'object' || m.format !== COLUMNS_FORMAT) fail(`is not a ${COLUMNS_FORMAT} manifest`);
  if (m.version !== COLUMNS_VERSION) fail(`has version ${String(m.version)}; this code reads version ${COLUMNS_VERSION}`);
  if (m.tree !== 'primary' && m.tree !== 'full') fail(`has an unknown tree "${String(m.tree)}"`);
  const count = (v: unknown) => Number.isInteger(v) && (v as number) >= 0;
  if (!count(m.records?.rows) || !count(m.records?.bytes)) fail('has invalid record counts');
  const tables: Array<[TableName, Record<string, ColumnType>]> = [
    ['jets', JET_COLUMNS],
    ['splittings', SPLITTING_COLUMNS],
  ];
  for (const [table, columns] of tables) {
    if (!count(m[table]?.rows)) fail(`has an invalid row count for ${table}`);
    const listed = JSON.stringify(m[table].columns);
    const before = describe(columns).filter((c) => !(table === 'jets' && c.name in ADDED_JET_COLUMNS));
    if (listed !== JSON.stringify(describe(columns)) && listed !== JSON.stringify(before)) {
      fail(`lists ${table} columns ${listed}, not those of version ${COLUMNS_VERSION}`);
    }
  }
  return m;
}
