// Binary column storage of a processed sample: round trip, atomic commit, abort, paging, damaged stores.
import { mkdtemp, readdir, readFile, rm, truncate, writeFile } from 'node:fs/promises';
import { existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  ColumnReader,
  ColumnWriter,
  JET_COLUMNS,
  type JetColumnName,
  SPLITTING_COLUMNS,
  type SplittingColumnName,
} from '@/lib/ingest/columns';
import { type JetResult, type RecordResult, SPLIT_STRIDE } from '@/lib/physics/types';

let root: string;
beforeEach(async () => {
  root = await mkdtemp(path.join(tmpdir(), 'splitfield-columns-'));
});
afterEach(async () => {
  await rm(root, { recursive: true, force: true });
});

/** A splitting whose nine fields are base, base+1, …, base+8 (generation = `generation`). */
function splitting(base: number, generation = 1): number[] {
  const values = Array.from({ length: SPLIT_STRIDE }, (_, k) => base + k);
  values[SPLIT_STRIDE - 1] = generation;
  return values;
}

function jet(pt: number, primary: number[][], all: number[][] | null = null, softDropPasses = true): JetResult {
  return {
    pt,
    y: pt / 1000,
    phi: 1 + pt / 1000,
    m: pt / 10,
    n: primary.length + 1,
    primary: Float64Array.from(primary.flat()),
    all: all ? Float64Array.from(all.flat()) : null,
    softDrop: softDropPasses ? { mg: pt / 20, zg: 0.25, Rg: 0.125 } : { mg: Number.NaN, zg: Number.NaN, Rg: Number.NaN },
    multiplicity: primary.length,
  };
}

async function expectColumns(read: (name: string) => Promise<ArrayLike<number>>, values: Record<string, number[]>) {
  for (const [name, expected] of Object.entries(values)) expect(Array.from(await read(name)), name).toEqual(expected);
}

const result = (...jets: JetResult[]): RecordResult => ({ jets, rejected: { pt: 0, y: 0, rank: 0 } });

describe('column storage', () => {
  it('round-trips jets, splittings and record ids', async () => {
    const target = path.join(root, 'samples', 's1');
    const writer = await ColumnWriter.create(target);
    await writer.append(
      [
        { id: 'évt-1', weight: 2.5 },
        { id: 17, weight: 1 },
      ],
      [result(jet(300, [splitting(10), splitting(20)]), jet(120, [], null, false)), result()],
    );
    await writer.append([{ id: 'e3', weight: 0.5 }], [result(jet(80, [splitting(30)]))]);
    const manifest = await writer.commit();
    expect(manifest.records).toEqual({ rows: 3, bytes: 'évt-1'.length + 1 + 2 + 2 }); // é is 2 bytes in UTF-8
    expect(manifest.jets.rows).toBe(3);
    expect(manifest.splittings.rows).toBe(3);

    const reader = await ColumnReader.open(target);
    expect(reader.manifest).toEqual(manifest);
    expect(await reader.recordIds()).toEqual(['évt-1', '17', 'e3']);
    const jetValues: Partial<Record<JetColumnName, number[]>> = {
      record: [0, 0, 2],
      jet: [0, 1, 0],
      weight: [2.5, 2.5, 0.5],
      pt: [300, 120, 80],
      phi: [1.3, 1.12, 1.08],
      n: [3, 1, 2],
      mg: [15, Number.NaN, 4],
      multiplicity: [2, 0, 1],
    };
    await expectColumns((name) => reader.jetColumn(name as JetColumnName), jetValues);
    expect(await reader.jetColumn('multiplicity')).toBeInstanceOf(Int32Array);
    expect(await reader.jetColumn('Rg')).toBeInstanceOf(Float64Array);
    // splitting fields in engine order: lnInvDelta, lnKt, z, delta, kt, psi, m, kappa, generation
    const splittingValues: Partial<Record<SplittingColumnName, number[]>> = {
      jetRow: [0, 0, 2],
      lnInvDelta: [10, 20, 30],
      lnKt: [11, 21, 31],
      kt: [14, 24, 34],
      kappa: [17, 27, 37],
      generation: [1, 1, 1],
    };
    await expectColumns((name) => reader.splittingColumn(name as SplittingColumnName), splittingValues);
    // one file per column plus the record id table and the manifest
    const files = await readdir(target);
    expect(files.length).toBe(Object.keys(JET_COLUMNS).length + Object.keys(SPLITTING_COLUMNS).length + 3);
    // little-endian Float64: pt of the first jet is 300 at byte 0 of jets.pt.f64
    const ptBytes = await readFile(path.join(target, 'jets.pt.f64'));
    expect(ptBytes.readDoubleLE(0)).toBe(300);
  });

  it('stores the full tree with generations when asked', async () => {
    const target = path.join(root, 'full');
    const writer = await ColumnWriter.create(target, { tree: 'full' });
    const all = [splitting(1, 1), splitting(2, 2), splitting(3, 1)];
    await writer.append([{ id: 'a', weight: 1 }], [result(jet(50, [splitting(1), splitting(3)], all))]);
    await writer.commit();
    const reader = await ColumnReader.open(target);
    expect(reader.manifest.tree).toBe('full');
    expect(Array.from(await reader.splittingColumn('generation'))).toEqual([1, 2, 1]);
    expect(Array.from(await reader.splittingColumn('z'))).toEqual([3, 4, 5]);

    const refuses = await ColumnWriter.create(path.join(root, 'full2'), { tree: 'full' });
    await expect(refuses.append([{ id: 'a', weight: 1 }], [result(jet(50, [splitting(1)]))])).rejects.toThrow(
      /record 1 of the sample: the full tree is stored but a jet has no "all"/,
    );
    await refuses.abort();
  });

  it('writes through many chunks with the same result', async () => {
    const target = path.join(root, 'chunked');
    const writer = await ColumnWriter.create(target, { chunkValues: 7 });
    const expectedPt: number[] = [];
    const expectedLnKt: number[] = [];
    for (let batch = 0; batch < 20; batch++) {
      const records = [];
      const results = [];
      for (let r = 0; r < 5; r++) {
        const pt = batch * 100 + r;
        expectedPt.push(pt);
        const primaries = [splitting(pt), splitting(pt + 0.5)];
        primaries.forEach((s) => expectedLnKt.push(s[1]));
        records.push({ id: `b${batch}r${r}`, weight: 1 });
        results.push(result(jet(pt, primaries)));
      }
      await writer.append(records, results);
    }
    await writer.commit();
    const reader = await ColumnReader.open(target);
    expect(Array.from(await reader.jetColumn('pt'))).toEqual(expectedPt);
    expect(Array.from(await reader.splittingColumn('lnKt'))).toEqual(expectedLnKt);
    expect((await reader.recordIds(97, 3))).toEqual(['b19r2', 'b19r3', 'b19r4']);
  });

  it('keeps the target absent until commit, then renames it into place', async () => {
    const target = path.join(root, 'atomic');
    const writer = await ColumnWriter.create(target);
    await writer.append([{ id: 'x', weight: 1 }], [result(jet(40, [splitting(5)]))]);
    expect(existsSync(target)).toBe(false);
    expect(path.dirname(writer.staging)).toBe(root);
    expect(existsSync(writer.staging)).toBe(true);
    await expect(ColumnReader.open(target)).rejects.toThrow(/cannot read manifest.json/);
    await writer.commit();
    expect(existsSync(target)).toBe(true);
    expect(existsSync(writer.staging)).toBe(false);
    expect(await readdir(root)).toEqual(['atomic']);
    await expect(writer.append([], [])).rejects.toThrow(/already committed/);
    await expect(ColumnWriter.create(target)).rejects.toThrow(/already exists/);
  });

  it('refuses to replace a store that appeared meanwhile, and cleans up', async () => {
    const target = path.join(root, 'raced');
    const writer = await ColumnWriter.create(target);
    await writeFile(target, 'someone else');
    await expect(writer.commit()).rejects.toThrow(/appeared while writing/);
    expect(await readdir(root)).toEqual(['raced']);
    expect(await readFile(target, 'utf8')).toBe('someone else');
  });

  it('abort leaves nothing behind', async () => {
    const target = path.join(root, 'dropped');
    const writer = await ColumnWriter.create(target);
    await writer.append([{ id: 'x', weight: 1 }], [result(jet(40, [splitting(5)]))]);
    await writer.abort();
    await writer.abort();
    expect(await readdir(root)).toEqual([]);
    await expect(writer.commit()).rejects.toThrow(/already aborted/);
  });

  it('validates a batch before storing any of it', async () => {
    const target = path.join(root, 'validated');
    const writer = await ColumnWriter.create(target);
    await expect(writer.append([{ id: 'a', weight: 1 }], [])).rejects.toThrow(/1 records but 0 results/);
    await expect(
      writer.append(
        [
          { id: 'a', weight: 1 },
          { id: 'b', weight: Number.NaN },
        ],
        [result(jet(40, [splitting(5)])), result()],
      ),
    ).rejects.toThrow(/record 2 of the sample: weight must be a finite number/);
    await expect(writer.append([{ id: Number.NaN, weight: 1 }], [result()])).rejects.toThrow(/id must be a string or a finite number/);
    await writer.append([{ id: 'ok', weight: 1 }], [result(jet(40, [splitting(5)]))]);
    const manifest = await writer.commit();
    expect([manifest.records.rows, manifest.jets.rows, manifest.splittings.rows]).toEqual([1, 1, 1]);
    expect(await (await ColumnReader.open(target)).recordIds()).toEqual(['ok']);
    await expect(ColumnWriter.create(path.join(root, 'bad'), { chunkValues: 0 })).rejects.toThrow(/chunkValues/);
  });
});

describe('jet table pages', () => {
  async function store(jets: number): Promise<ColumnReader> {
    const target = path.join(root, `paged-${jets}`);
    const writer = await ColumnWriter.create(target);
    // two jets a record: record k holds jets of pt 1000 − 2k and 999 − 2k
    for (let k = 0; k < jets / 2; k++) {
      await writer.append([{ id: `r${k}`, weight: k + 1 }], [result(jet(1000 - 2 * k, [splitting(k)]), jet(999 - 2 * k, []))]);
    }
    await writer.commit();
    return ColumnReader.open(target);
  }

  it('returns the requested rows with their record ids', async () => {
    const reader = await store(26);
    const page = await reader.jetPage(10, 5);
    expect(page.map((r) => r.row)).toEqual([10, 11, 12, 13, 14]);
    expect(page.map((r) => r.pt)).toEqual([990, 989, 988, 987, 986]);
    expect(page.map((r) => r.recordId)).toEqual(['r5', 'r5', 'r6', 'r6', 'r7']);
    expect(page.map((r) => r.jet)).toEqual([0, 1, 0, 1, 0]);
    expect(page.map((r) => r.weight)).toEqual([6, 6, 7, 7, 8]);
    expect(page[1].mg).toBeCloseTo(989 / 20, 12);
    const last = await reader.jetPage(20, 10);
    expect(last.map((r) => r.row)).toEqual([20, 21, 22, 23, 24, 25]);
    expect(last.at(-1)!.recordId).toBe('r12');
    expect(await reader.jetPage(26, 10)).toEqual([]);
  });

  it('refuses bad page requests', async () => {
    const reader = await store(4);
    await expect(reader.jetPage(-1, 5)).rejects.toThrow(/offset must be a non-negative integer/);
    await expect(reader.jetPage(0, 0)).rejects.toThrow(/limit must be an integer from 1 to 10000/);
    await expect(reader.jetPage(0.5, 5)).rejects.toThrow(/offset/);
    await expect(reader.recordIds(1, 5)).rejects.toThrow(/record range 1\+5 is outside 0..2/);
  });
});

describe('damaged stores', () => {
  async function committed(): Promise<string> {
    const target = path.join(root, 'damaged');
    const writer = await ColumnWriter.create(target);
    await writer.append([{ id: 'a', weight: 1 }], [result(jet(40, [splitting(5), splitting(6)]))]);
    await writer.commit();
    return target;
  }

  it('names a truncated column file', async () => {
    const target = await committed();
    await truncate(path.join(target, 'splittings.lnKt.f64'), 12);
    await expect(ColumnReader.open(target)).rejects.toThrow(/splittings.lnKt.f64 has 12 bytes, expected 16/);
  });

  it('names a missing column file', async () => {
    const target = await committed();
    await rm(path.join(target, 'jets.zg.f64'));
    await expect(ColumnReader.open(target)).rejects.toThrow(/jets.zg.f64 has gone missing/);
  });

  it('refuses a manifest of another format or version', async () => {
    const target = await committed();
    const manifestPath = path.join(target, 'manifest.json');
    const manifest = JSON.parse(await readFile(manifestPath, 'utf8'));
    await writeFile(manifestPath, JSON.stringify({ ...manifest, version: 2 }));
    await expect(ColumnReader.open(target)).rejects.toThrow(/has version 2; this code reads version 1/);
    await writeFile(manifestPath, JSON.stringify({ ...manifest, jets: { ...manifest.jets, rows: -1 } }));
    await expect(ColumnReader.open(target)).rejects.toThrow(/invalid row count for jets/);
    await writeFile(manifestPath, '{"format":');
    await expect(ColumnReader.open(target)).rejects.toThrow(/is not valid JSON/);
  });
});

describe('jet columns added later (flavour, E, theta)', () => {
  it('are stored for new samples, and samples stored before them read as untagged with NaN E and theta', async () => {
    const target = path.join(root, 'new');
    const writer = await ColumnWriter.create(target);
    const tagged = { ...jet(100, [splitting(1)]), flavour: 5, E: 250, theta: 0.4 };
    await writer.append([{ id: 'r1', weight: 1 }], [result(tagged, jet(50, []))]);
    await writer.commit();
    const reader = await ColumnReader.open(target);
    const page = await reader.jetPage(0, 10);
    expect(page.map((row) => [row.flavour, row.E, row.theta])).toEqual([
      [5, 250, 0.4],
      // Not tagged; E and θ from pt, y and m (m = 5, y = 0.05).
      [-1, Math.sqrt(50 * 50 + 25) * Math.cosh(0.05), Math.atan2(50, Math.sqrt(50 * 50 + 25) * Math.sinh(0.05))],
    ]);

    // The same sample as an older version stored it: no such columns in the manifest or on disk.
    const manifestFile = path.join(target, 'manifest.json');
    const manifest = JSON.parse(await readFile(manifestFile, 'utf8'));
    manifest.jets.columns = manifest.jets.columns.filter((c: { name: string }) => !['flavour', 'E', 'theta'].includes(c.name));
    await writeFile(manifestFile, JSON.stringify(manifest));
    for (const file of await readdir(target)) if (/^jets\.(flavour|E|theta)\./.test(file)) await rm(path.join(target, file));
    const old = await ColumnReader.open(target);
    const rows = await old.jetPage(0, 10);
    expect(rows.map((row) => row.flavour)).toEqual([-1, -1]);
    expect(rows.every((row) => Number.isNaN(row.E) && Number.isNaN(row.theta))).toBe(true);
    expect(Array.from(await old.jetColumn('flavour'))).toEqual([-1, -1]);
    expect(rows.map((row) => row.pt)).toEqual([100, 50]);
    expect((await old.jetRowsAt([1]))[0].flavour).toBe(-1);
  });
});
