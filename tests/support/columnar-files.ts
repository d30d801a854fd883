// Writes particle records as columnar files in Splitfield's schema (README "Columnar input"), for tests and the
// benchmark: Parquet with hyparquet-writer, Arrow IPC with @uwdata/flechette; the lists and the flat layouts.

import { writeFileSync } from 'node:fs';
import { float64, int32, list, tableFromArrays, tableToIPC, utf8 } from '@uwdata/flechette';
import { parquetWriteBuffer } from 'hyparquet-writer';
import type { ParticleRecord } from '../../lib/ingest/types';

/** A record as the readers give it (px, py, pz, E interleaved; pids, charges and tag particles optional). */
export type ColumnarRecord = Omit<ParticleRecord, 'line' | 'id'> & { id: string };

export interface ColumnarOptions {
  layout: 'lists' | 'flat';
  /** Rows a Parquet row group (default: hyparquet-writer's). */
  rowGroupSize?: number;
  /** Write the Arrow record batches with at most this many rows (default one batch). */
  batchRows?: number;
  /** Leave out the "splitfield" metadata. */
  noMetadata?: boolean;
  /** Leave out the id column (records are then numbered by the reader). */
  noIds?: boolean;
}

const NAMES = ['px', 'py', 'pz', 'E'] as const;

function component(records: ColumnarRecord[], c: number, key: 'particles' | 'tags' = 'particles'): number[][] {
  return records.map((r) => {
    const p = r[key] ?? new Float64Array(0);
    const out: number[] = [];
    for (let i = c; i < p.length; i += 4) out.push(p[i]);
    return out;
  });
}

/** Column name → [parquet list element type or scalar type, values] in the file's order. */
function columnsOf(records: ColumnarRecord[], layout: 'lists' | 'flat'): Array<{ name: string; list: boolean; type: 'DOUBLE' | 'INT32' | 'STRING'; data: unknown[] }> {
  const withPid = records.every((r) => r.pid);
  const withCharge = records.every((r) => r.charge);
  const withTags = records.some((r) => r.tags);
  if (layout === 'lists') {
    const cols: Array<{ name: string; list: boolean; type: 'DOUBLE' | 'INT32' | 'STRING'; data: unknown[] }> = [
      { name: 'id', list: false, type: 'STRING', data: records.map((r) => r.id) },
      { name: 'weight', list: false, type: 'DOUBLE', data: records.map((r) => r.weight) },
      ...NAMES.map((n, c) => ({ name: n, list: true, type: 'DOUBLE' as const, data: component(records, c) })),
    ];
    if (withPid) cols.push({ name: 'pid', list: true, type: 'INT32', data: records.map((r) => Array.from(r.pid!)) });
    if (withCharge) cols.push({ name: 'charge', list: true, type: 'DOUBLE', data: records.map((r) => Array.from(r.charge!)) });
    if (withTags) {
      NAMES.forEach((n, c) => cols.push({ name: `tag_${n}`, list: true, type: 'DOUBLE', data: component(records, c, 'tags') }));
      cols.push({ name: 'tag_pid', list: true, type: 'INT32', data: records.map((r) => Array.from(r.tagPid ?? [])) });
    }
    return cols;
  }
  const rec: number[] = [], ids: string[] = [], w: number[] = [], pid: number[] = [], charge: number[] = [];
  const comps: number[][] = [[], [], [], []];
  records.forEach((r, k) => {
    for (let i = 0; i < r.particles.length / 4; i++) {
      rec.push(k);
      ids.push(r.id);
      w.push(r.weight);
      for (let c = 0; c < 4; c++) comps[c].push(r.particles[4 * i + c]);
      if (withPid) pid.push(r.pid![i]);
      if (withCharge) charge.push(r.charge![i]);
    }
  });
  const cols: Array<{ name: string; list: boolean; type: 'DOUBLE' | 'INT32' | 'STRING'; data: unknown[] }> = [
    { name: 'record', list: false, type: 'INT32', data: rec },
    { name: 'id', list: false, type: 'STRING', data: ids },
    { name: 'weight', list: false, type: 'DOUBLE', data: w },
    ...NAMES.map((n, c) => ({ name: n, list: false, type: 'DOUBLE' as const, data: comps[c] })),
  ];
  if (withPid) cols.push({ name: 'pid', list: false, type: 'INT32', data: pid });
  if (withCharge) cols.push({ name: 'charge', list: false, type: 'DOUBLE', data: charge });
  return cols;
}

/** Writes a Parquet file (snappy-compressed, hyparquet-writer's default). */
export function writeParquet(path: string, header: object, records: ColumnarRecord[], o: ColumnarOptions): void {
  const cols = columnsOf(records, o.layout).filter((c) => !(o.noIds && c.name === 'id'));
  const schema: Record<string, unknown>[] = [{ name: 'root', num_children: cols.length }];
  for (const c of cols) {
    const leaf = c.type === 'STRING' ? { type: 'BYTE_ARRAY', converted_type: 'UTF8' } : { type: c.type };
    if (c.list) {
      schema.push({ name: c.name, repetition_type: 'OPTIONAL', num_children: 1, converted_type: 'LIST' });
      schema.push({ name: 'list', repetition_type: 'REPEATED', num_children: 1 });
      schema.push({ name: 'element', repetition_type: 'REQUIRED', ...leaf });
    } else schema.push({ name: c.name, repetition_type: 'REQUIRED', ...leaf });
  }
  const buf = parquetWriteBuffer({
    columnData: cols.map((c) => ({ name: c.name, data: c.data as never })),
    schema: schema as never,
    rowGroupSize: o.rowGroupSize,
    kvMetadata: o.noMetadata ? [] : [{ key: 'splitfield', value: JSON.stringify(header) }],
  });
  writeFileSync(path, new Uint8Array(buf));
}

/** Writes an Arrow IPC file (file format). */
export function writeArrow(path: string, header: object, records: ColumnarRecord[], o: ColumnarOptions): void {
  const cols = columnsOf(records, o.layout);
  const data: Record<string, unknown[]> = {};
  const types: Record<string, unknown> = {};
  for (const c of cols) {
    data[c.name] = c.data;
    const leaf = c.type === 'STRING' ? utf8() : c.type === 'INT32' ? int32() : float64();
    types[c.name] = c.list ? list(leaf) : leaf;
  }
  const table = tableFromArrays(data as never, { types: types as never, maxBatchRows: o.batchRows });
  if (!o.noMetadata) (table.schema as { metadata?: Map<string, string> }).metadata = new Map([['splitfield', JSON.stringify(header)]]);
  writeFileSync(path, tableToIPC(table, { format: 'file' })!);
}
