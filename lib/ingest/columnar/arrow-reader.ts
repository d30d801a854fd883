// Apache Arrow IPC input (file or stream format) in Splitfield's columnar schema (layout.ts), read with
// @uwdata/flechette (pure JavaScript). The file is read whole (Arrow's buffers are used in place, without
// decoding), then handed on one record batch at a time.

import { readFile, stat } from 'node:fs/promises';
import { tableFromIPC, type Table } from '@uwdata/flechette';
import { IngestError } from '../errors';
import type { ParticleReader, ReaderOptions } from '../types';
import { ColumnarReader, type ChunkSource } from './columnar-reader';
import { columnarHeader, METADATA_KEY, planColumns, type Chunk, type ColumnPlan, type ColumnShape, type NumberColumn } from './layout';

/** "ARROW1" opens an Arrow IPC file; a stream starts with the continuation marker 0xFFFFFFFF. */
export function isArrowStart(b: Uint8Array): boolean {
  const file = b.length >= 6 && String.fromCharCode(...b.subarray(0, 6)) === 'ARROW1';
  const stream = b.length >= 4 && b[0] === 0xff && b[1] === 0xff && b[2] === 0xff && b[3] === 0xff;
  return file || stream;
}

// Type ids of the Arrow format (Schema.fbs): Int 2, FloatingPoint 3, Utf8 5, List 12, LargeUtf8 20, LargeList 21.
const INT = 2, FLOAT = 3, UTF8 = 5, LIST = 12, LARGE_UTF8 = 20, LARGE_LIST = 21;

interface ArrowType {
  typeId: number;
  children?: Array<{ type: ArrowType }>;
}

function kindOf(t: ArrowType): ColumnShape['kind'] {
  if (t.typeId === FLOAT) return 'float';
  if (t.typeId === INT) return 'int';
  if (t.typeId === UTF8 || t.typeId === LARGE_UTF8) return 'string';
  return 'other';
}

const TYPE_NAMES: Record<number, string> = { 1: 'null', 2: 'integer', 3: 'floating point', 4: 'binary', 5: 'utf8', 6: 'bool', 12: 'list', 13: 'struct' };

function shapesOf(table: Table): Map<string, ColumnShape> {
  const shapes = new Map<string, ColumnShape>();
  for (const f of table.schema.fields) {
    const t = f.type as unknown as ArrowType;
    const list = t.typeId === LIST || t.typeId === LARGE_LIST;
    const inner = list ? t.children![0].type : t;
    const name = TYPE_NAMES[inner.typeId] ?? `Arrow type ${inner.typeId}`;
    shapes.set(f.name, { list, kind: kindOf(inner), typeText: list ? `a list of ${name}` : name });
  }
  return shapes;
}

interface ArrowBatch {
  length: number;
  nullCount: number;
  values: ArrayLike<number | bigint>;
  offsets?: ArrayLike<number | bigint>;
  children?: ArrowBatch[];
  value(i: number): unknown;
}

class ArrowSource implements ChunkSource {
  constructor(
    private readonly table: Table,
    private readonly size: number,
  ) {}
  get bytesRead(): number {
    return this.size;
  }
  get bytesTotal(): number {
    return this.size;
  }
  close(): void {}

  async *chunks(plan: ColumnPlan): AsyncGenerator<Chunk> {
    const cols = new Map(plan.columns.map((name) => [name, this.table.getChild(name).data as unknown as ArrowBatch[]]));
    const nBatches = cols.get(plan.momentum[0])!.length;
    let firstRow = 0;
    for (let group = 0; group < nBatches; group++) {
      const rows = cols.get(plan.momentum[0])![group].length;
      const columns = new Map<string, NumberColumn>();
      let ids: unknown[] | null = null;
      for (const [name, batches] of cols) {
        const b = batches[group];
        if (b.nullCount > 0) throw new IngestError(`has ${b.nullCount} missing (null) values`, { rowGroup: group, column: name, code: 'columnar' });
        if (name === 'id') {
          ids = Array.from({ length: rows }, (_, i) => b.value(i));
        } else if (b.offsets && b.children) {
          const child = b.children[0];
          if (child.nullCount > 0) throw new IngestError(`has missing (null) values inside its lists`, { rowGroup: group, column: name, code: 'columnar' });
          const offsets = b.offsets instanceof Int32Array ? b.offsets : Int32Array.from(b.offsets as ArrayLike<number | bigint>, Number);
          columns.set(name, { values: child.values, offsets });
        } else {
          columns.set(name, { values: b.values, offsets: null });
        }
      }
      yield { group, firstRow, rows, columns, ids };
      firstRow += rows;
    }
  }
}

/** Opens an Arrow IPC file (file or stream format) in Splitfield's columnar schema. */
export async function openArrowFile(path: string, opts: ReaderOptions = {}): Promise<ParticleReader> {
  const size = (await stat(path)).size;
  const bytes = await readFile(path);
  let table: Table;
  try {
    table = tableFromIPC(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), { useBigInt: true });
  } catch (e) {
    throw new IngestError(`not a complete Arrow IPC file (it may be truncated): ${(e as Error).message}`, { code: 'columnar' });
  }
  const header = columnarHeader(table.schema.metadata?.get(METADATA_KEY), 'arrow-lists');
  const plan = planColumns(shapesOf(table), header);
  header.layout = plan.layout === 'lists' ? 'arrow-lists' : 'arrow-flat';
  return new ColumnarReader(header, new ArrowSource(table, size), opts, plan);
}
