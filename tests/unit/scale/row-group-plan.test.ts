// The scaled mode's cut of Parquet uploads between row groups (lib/scale/row-group-plan.ts): shards of consecutive
// row groups of about the shard size, and each shard's row groups read alone give exactly the records (rows, ids,
// error positions) of the whole-file read. Flat-layout files are cut only between row groups whose records differ.
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { openParquetFile } from '@/lib/ingest/columnar/parquet-reader';
import { IngestError } from '@/lib/ingest/errors';
import type { ParticleReader } from '@/lib/ingest/reader';
import { LocalObjectStore } from '@/lib/objects/local-store';
import type { RowGroupPlan } from '@/lib/scale/row-group-plan';
import { planShards } from '@/lib/scale/shard-plan';
import { type ColumnarRecord, writeParquet } from '@/tests/support/columnar-files';
import { HEADER } from '../ingest/helpers';

const dir = mkdtempSync(path.join(os.tmpdir(), 'sf-row-groups-'));
const store = new LocalObjectStore(dir);
const H = { ...HEADER, content: 'events' };

/** Records of 1 to 3 particles with distinct momenta. */
function records(count: number): ColumnarRecord[] {
  return Array.from({ length: count }, (_, k) => {
    const n = 1 + (k % 3);
    const particles = new Float64Array(4 * n);
    for (let i = 0; i < n; i++) particles.set([1 + k, 0.5 * i, 2 + i, 10 + k + i], 4 * i);
    return { id: `r${k}`, weight: 1, particles };
  });
}

/** Writes a Parquet file into the store; returns its key, size and path. */
function upload(name: string, recs: ColumnarRecord[], o: Parameters<typeof writeParquet>[3]) {
  const file = path.join(dir, name);
  writeParquet(file, H, recs, o);
  return { key: name, file };
}

async function readAll(reader: ParticleReader): Promise<unknown[]> {
  const out: unknown[] = [];
  try {
    for await (const rec of reader.records()) out.push({ line: rec.line, id: rec.id, particles: Array.from(rec.particles) });
  } finally {
    reader.close();
  }
  return out;
}

async function errorOf(reader: Promise<ParticleReader>): Promise<string> {
  try {
    await readAll(await reader);
  } catch (error) {
    expect(error).toBeInstanceOf(IngestError);
    return (error as Error).message;
  }
  return 'no error';
}

async function plan(key: string, shardBytes: number) {
  const size = (await store.size(key))!;
  return { size, plan: await planShards(store, key, size, shardBytes) };
}

describe('row-group shards of Parquet uploads', () => {
  it('cuts between row groups at about the shard size; the shards read alone give the whole read', async () => {
    const { key, file } = upload('lists.parquet', records(60), { layout: 'lists', rowGroupSize: 4, noIds: true });
    const { size, plan: cut } = await plan(key, 600);
    expect(cut.kind).toBe('rowGroups');
    const { shards, footerStart } = cut as RowGroupPlan;
    expect(shards.length).toBeGreaterThan(2);
    expect(footerStart).toBeGreaterThanOrEqual(shards.at(-1)!.end);
    expect(footerStart).toBeLessThan(size);
    shards.forEach((shard, k) => {
      expect(shard.firstGroup).toBe(k === 0 ? 0 : shards[k - 1].endGroup);
      if (k > 0) expect(shard.start).toBe(shards[k - 1].end);
      if (k < shards.length - 1) expect(shard.end - shard.start).toBeGreaterThanOrEqual(600);
    });
    expect(shards.at(-1)!.endGroup).toBe(15);
    const whole = await readAll(await openParquetFile(file));
    const parts = [];
    for (const shard of shards) parts.push(...(await readAll(await openParquetFile(file, {}, { first: shard.firstGroup, end: shard.endGroup }))));
    expect(parts).toEqual(whole);
    // Without an id column a record's id is its row of the whole file.
    expect(whole.at(-1)).toMatchObject({ line: 59, id: 59 });
  });

  it('names the whole file\'s row group and row for a bad value read in a later shard', async () => {
    const bad = records(60);
    bad[45].particles[0] = NaN;
    const { key, file } = upload('bad.parquet', bad, { layout: 'lists', rowGroupSize: 4 });
    const shards = ((await plan(key, 600)).plan as RowGroupPlan).shards;
    const later = shards.find((shard) => shard.firstGroup <= 11 && shard.endGroup > 11)!;
    expect(later.firstGroup).toBeGreaterThan(0);
    const message = await errorOf(openParquetFile(file));
    expect(message).toContain('row group 11, row 45, column px, particle 0');
    expect(await errorOf(openParquetFile(file, {}, { first: later.firstGroup, end: later.endGroup }))).toBe(message);
  });

  it('cuts a flat-layout file only between row groups whose records differ', async () => {
    // One row a particle: with 5 rows a group, records of 1 to 3 rows often run on into the next group.
    const { key, file } = upload('flat.parquet', records(40), { layout: 'flat', rowGroupSize: 5 });
    const { plan: cut } = await plan(key, 100);
    expect(cut.kind).toBe('rowGroups');
    const { shards } = cut as RowGroupPlan;
    expect(shards.length).toBeGreaterThan(2);
    expect(shards.some((shard) => shard.endGroup - shard.firstGroup > 1)).toBe(true);
    const whole = await readAll(await openParquetFile(file));
    const parts = [];
    for (const shard of shards) parts.push(...(await readAll(await openParquetFile(file, {}, { first: shard.firstGroup, end: shard.endGroup }))));
    expect(parts).toEqual(whole);
    expect(whole).toHaveLength(40);
  });

  it('reads one row group, a small file, a file outside the schema and a broken file whole', async () => {
    const one = upload('one.parquet', records(30), { layout: 'lists' });
    expect((await plan(one.key, 100)).plan).toEqual({ kind: 'whole' });
    const small = upload('small.parquet', records(30), { layout: 'lists', rowGroupSize: 4 });
    expect((await plan(small.key, 1024 * 1024)).plan).toEqual({ kind: 'whole' });
    const foreign = upload('foreign.parquet', records(30), { layout: 'lists', rowGroupSize: 4, noMetadata: true });
    expect((await plan(foreign.key, 100)).plan).toEqual({ kind: 'whole' });
    writeFileSync(path.join(dir, 'broken.parquet'), Buffer.concat([Buffer.from('PAR1'), Buffer.alloc(4000)]));
    expect((await plan('broken.parquet', 100)).plan).toEqual({ kind: 'whole' });
  });
});
