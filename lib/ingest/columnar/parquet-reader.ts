// Apache Parquet input in Splitfield's columnar schema (layout.ts), read with hyparquet (pure JavaScript) and its
// decompressors, one row group at a time from the file on disk: memory holds one row group, not the file. A shard
// of the scaled mode reads only some row groups (lib/scale/row-group-plan.ts), numbered as in the whole file.

import { open, type FileHandle } from 'node:fs/promises';
import { parquetMetadataAsync, parquetRead, parquetSchema, type FileMetaData } from 'hyparquet';
import { compressors } from 'hyparquet-compressors';
import { IngestError } from '../errors';
import type { IngestHeader } from '../header';
import type { ParticleReader, ReaderOptions } from '../types';
import { ColumnarReader, type ChunkSource } from './columnar-reader';
import { columnarHeader, METADATA_KEY, planColumns, type Chunk, type ColumnPlan, type ColumnShape, type NumberColumn } from './layout';

const PARQUET_MAGIC = 'PAR1';

/** Whether a file starts as a Parquet file does (its magic bytes). */
export function isParquetStart(b: Uint8Array): boolean {
  return String.fromCharCode(...b.subarray(0, 4)) === PARQUET_MAGIC;
}

type SchemaNode = ReturnType<typeof parquetSchema>;

function kindOf(el: SchemaNode['element']): ColumnShape['kind'] {
  const t = el.type;
  if (t === 'DOUBLE' || t === 'FLOAT') return 'float';
  if (t === 'INT32' || t === 'INT64') return el.converted_type === 'DATE' || el.converted_type?.startsWith('TIME') ? 'other' : 'int';
  if (t === 'BYTE_ARRAY' && (el.converted_type === 'UTF8' || el.logical_type?.type === 'STRING')) return 'string';
  return 'other';
}

function describe(t: string | undefined, el: SchemaNode['element']): string {
  const logical = el.converted_type ?? el.logical_type?.type;
  return `${t ?? 'a group'}${logical ? ` (${logical})` : ''}`;
}

/** Top-level columns: plain values, or lists (a LIST group, or a repeated field) of plain values. */
function shapesOf(metadata: FileMetaData): Map<string, ColumnShape> {
  const shapes = new Map<string, ColumnShape>();
  for (const child of parquetSchema(metadata).children) {
    const el = child.element;
    if (child.children.length === 0) {
      const list = el.repetition_type === 'REPEATED';
      shapes.set(el.name, { list, kind: kindOf(el), typeText: describe(el.type, el) });
      continue;
    }
    let leaf = child;
    while (leaf.children.length === 1) leaf = leaf.children[0];
    const isList = el.converted_type === 'LIST' || el.logical_type?.type === 'LIST';
    if (!isList || leaf.children.length > 0) {
      shapes.set(el.name, { list: false, kind: 'other', typeText: `a nested group (${el.converted_type ?? 'struct'})` });
      continue;
    }
    shapes.set(el.name, { list: true, kind: kindOf(leaf.element), typeText: `a list of ${describe(leaf.element.type, leaf.element)}` });
  }
  return shapes;
}

/** hyparquet's file interface over a file on disk. */
function asyncBuffer(handle: FileHandle, byteLength: number, counter: { read: number }) {
  return {
    byteLength,
    async slice(start: number, end?: number): Promise<ArrayBuffer> {
      const stop = end ?? byteLength;
      const buf = new ArrayBuffer(stop - start);
      let done = 0;
      while (done < buf.byteLength) {
        const { bytesRead } = await handle.read(new Uint8Array(buf, done), 0, buf.byteLength - done, start + done);
        if (bytesRead === 0) throw new Error(`the file ended at byte ${start + done} (truncated?)`);
        done += bytesRead;
      }
      counter.read += buf.byteLength;
      return buf;
    },
  };
}

/** A list column of hyparquet (an array of arrays, null for a missing list) as values and offsets. */
function listColumn(data: ArrayLike<unknown>, rows: number, name: string, group: number, firstRow: number): NumberColumn {
  const offsets = new Int32Array(rows + 1);
  let n = 0;
  for (let r = 0; r < rows; r++) {
    const a = data[r] as ArrayLike<number> | null | undefined;
    if (a == null) throw new IngestError('the list is missing (null)', { rowGroup: group, line: firstRow + r, where: 'row', column: name, recordLevel: true });
    n += a.length;
    offsets[r + 1] = n;
  }
  const first = rows > 0 ? (data[0] as ArrayLike<unknown>) : null;
  const big = first !== null && first.length > 0 && typeof first[0] === 'bigint';
  const values = big ? new Array<bigint>(n) : new Float64Array(n);
  for (let r = 0, at = 0; r < rows; r++) {
    const a = data[r] as ArrayLike<number>;
    for (let i = 0; i < a.length; i++) (values as unknown as (number | bigint)[])[at++] = a[i];
  }
  return { values, offsets };
}

/** Row groups [first, end) of a file. */
export interface RowGroupRange {
  first: number;
  end: number;
}

class ParquetSource implements ChunkSource {
  private readonly counter = { read: 0 };
  constructor(
    private readonly handle: FileHandle,
    private readonly size: number,
    private readonly metadata: FileMetaData,
    private readonly groups: RowGroupRange,
  ) {}

  get bytesRead(): number {
    return Math.min(this.counter.read, this.size);
  }
  get bytesTotal(): number {
    return this.size;
  }
  close(): void {
    void this.handle.close().catch(() => {});
  }

  async *chunks(plan: ColumnPlan): AsyncGenerator<Chunk> {
    const file = asyncBuffer(this.handle, this.size, this.counter);
    const rowsOf = (group: number) => Number(this.metadata.row_groups[group].num_rows);
    let firstRow = 0;
    for (let group = 0; group < this.groups.first; group++) firstRow += rowsOf(group);
    for (let group = this.groups.first; group < this.groups.end; group++) {
      const rows = rowsOf(group);
      const parts = new Map<string, Array<{ start: number; data: ArrayLike<unknown> }>>();
      try {
        await parquetRead({
          file,
          metadata: this.metadata,
          rowStart: firstRow,
          rowEnd: firstRow + rows,
          columns: plan.columns,
          compressors,
          onChunk: (c) => {
            const list = parts.get(c.columnName) ?? [];
            list.push({ start: c.rowStart, data: c.columnData as ArrayLike<unknown> });
            parts.set(c.columnName, list);
          },
        });
      } catch (e) {
        throw new IngestError(`cannot read this row group: ${(e as Error).message}`, { rowGroup: group, code: 'columnar' });
      }
      const whole = (name: string): ArrayLike<unknown> => {
        const list = (parts.get(name) ?? []).sort((a, b) => a.start - b.start);
        if (list.length === 1) return list[0].data;
        const out: unknown[] = [];
        for (const p of list) for (let i = 0; i < p.data.length; i++) out.push(p.data[i]);
        return out;
      };
      const columns = new Map<string, NumberColumn>();
      for (const name of plan.columns) {
        if (name === 'id') continue;
        const data = whole(name);
        if (data.length !== rows) throw new IngestError(`has ${data.length} values for ${rows} rows`, { rowGroup: group, column: name, code: 'columnar' });
        const isList = plan.layout === 'lists' && name !== 'weight';
        columns.set(name, isList ? listColumn(data, rows, name, group, firstRow) : { values: data as ArrayLike<number>, offsets: null });
      }
      yield { group, firstRow, rows, columns, ids: plan.id ? whole('id') : null };
      firstRow += rows;
    }
  }
}

/** The file's header (its "splitfield" metadata) and the columns its layout reads; throws for a file not in the schema. */
export function parquetColumns(metadata: FileMetaData): { header: IngestHeader; plan: ColumnPlan } {
  const meta = metadata.key_value_metadata?.find((kv) => kv.key === METADATA_KEY)?.value;
  const header = columnarHeader(meta, 'parquet-lists');
  const plan = planColumns(shapesOf(metadata), header);
  header.layout = plan.layout === 'lists' ? 'parquet-lists' : 'parquet-flat';
  return { header, plan };
}

/** Opens a Parquet file in Splitfield's columnar schema; `groups` limits the read to some row groups (all by default). */
export async function openParquetFile(path: string, opts: ReaderOptions = {}, groups?: RowGroupRange): Promise<ParticleReader> {
  const handle = await open(path, 'r');
  try {
    const size = (await handle.stat()).size;
    let metadata: FileMetaData;
    try {
      metadata = await parquetMetadataAsync(asyncBuffer(handle, size, { read: 0 }));
    } catch (e) {
      throw new IngestError(`not a complete Parquet file (it may be truncated): ${(e as Error).message}`, { code: 'columnar' });
    }
    const { header, plan } = parquetColumns(metadata);
    const range = groups ?? { first: 0, end: metadata.row_groups.length };
    return new ColumnarReader(header, new ParquetSource(handle, size, metadata, range), opts, plan);
  } catch (e) {
    await handle.close();
    throw e;
  }
}
