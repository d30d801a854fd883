// Columnar input (README "Columnar input"): Parquet and Arrow IPC files, in the lists and the flat layouts, give
// exactly the export of the JSON Lines file with the same content, through the command-line bundle, with one
// thread and with two (records with pids, charges and tag particles cross to the worker threads); bad files get a
// message naming the row group, the row and the column.
import { readFileSync, truncateSync } from 'node:fs';
import path from 'node:path';
import { parquetWriteBuffer } from 'hyparquet-writer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromPtYPhiM } from '@/lib/physics/fourvector';
import { writeArrow, writeParquet, type ColumnarRecord } from '@/tests/support/columnar-files';
import { generateEvents, hardestDirection, listedPids } from '@/tests/support/test-events';
import { engineBundle, HEADER, jsonl, tempDir, toRows } from './helpers';

const t = tempDir('sf-columnar-');
const engine = engineBundle('columnar');

beforeAll(() => engine.build());
afterAll(() => {
  t.cleanup();
  engine.remove();
});

const run = (args: string[]) => engine.run(t.dir, args);

/** The export without its header line (which names the input format). */
const jetLines = (out: string) => out.split('\n').slice(1).join('\n');

const events = generateEvents(2024, 30, { nParticles: 120, nJets: 3 });
const records: ColumnarRecord[] = events.map((p, i) => {
  const { pid, charge } = listedPids(300 + i, p.length / 4);
  const rec: ColumnarRecord = { id: `ev${i}`, weight: 0.5 + i / 10, particles: p, pid, charge };
  if (i % 3 === 0) {
    // A B meson near the leading particle of the event.
    const tags = new Float64Array(4);
    fromPtYPhiM(40, ...hardestDirection(p), 5.279, tags, 0);
    rec.tags = tags;
    rec.tagPid = Int32Array.of(521);
  }
  return rec;
});
const H = { ...HEADER, content: 'events' };
const jsonFile = t.file(
  'events.jsonl',
  jsonl(H, records.map((r) => ({ id: r.id, weight: r.weight, particles: toRows(r.particles), pid: Array.from(r.pid!), charge: Array.from(r.charge!), ...(r.tags ? { tagParticles: toRows(r.tags), tagPid: Array.from(r.tagPid!) } : {}) }))),
);
const untagged = records.map(({ tags: _t, tagPid: _p, ...r }) => r);

describe('Parquet and Arrow files give the same results as JSON Lines', () => {
  const settings = [
    ['--ptmin', '10'],
    ['--charged-only', '--constituent-ptmin', '0.5', '--ptmin', '10', '--all'],
    ['--algorithm', 'kt', '--R', '1', '--exclusive-n', '3', '--ptmin', '0', '--ymax', '10'],
  ];
  const files: Array<[string, string, boolean]> = [];
  for (const layout of ['lists', 'flat'] as const) {
    const recs = layout === 'lists' ? records : untagged;
    files.push([`parquet ${layout}`, path.join(t.dir, `ev-${layout}.parquet`), layout === 'lists']);
    writeParquet(files.at(-1)![1], H, recs, { layout, rowGroupSize: 7 });
    files.push([`arrow ${layout}`, path.join(t.dir, `ev-${layout}.arrow`), layout === 'lists']);
    writeArrow(files.at(-1)![1], H, recs, { layout, batchRows: 11 });
  }
  const noTags = t.file('events-notags.jsonl', jsonl(H, untagged.map((r) => ({ id: r.id, weight: r.weight, particles: toRows(r.particles), pid: Array.from(r.pid!), charge: Array.from(r.charge!) }))));

  for (const [name, file, tagged] of files) {
    it(`${name}: the same export, one and two threads${tagged ? ', flavour tags' : ''}`, () => {
      const reference = tagged ? jsonFile : noTags;
      for (const opts of [...settings, ...(tagged ? [['--flavour-tags', '--ptmin', '10']] : [])]) {
        const want = run([reference, '--threads', '1', ...opts]);
        expect(want.code, want.err).toBe(0);
        expect(jetLines(want.out).length).toBeGreaterThan(1000);
        for (const threads of ['1', '2']) {
          const got = run([file, '--threads', threads, ...opts]);
          expect(got.code, got.err).toBe(0);
          expect(jetLines(got.out)).toBe(jetLines(want.out));
        }
      }
      if (tagged) {
        const flavours = jetLines(run([file, '--threads', '2', '--flavour-tags', '--ptmin', '10']).out).match(/"flavour":"b"/g) ?? [];
        expect(flavours.length).toBeGreaterThan(5);
      }
      const header = JSON.parse(run([file, '--threads', '1']).out.split('\n')[0]);
      expect(header.input.format).toBe('splitfield-particles');
    });
  }
});

describe('bad columnar files', () => {
  const few = records.slice(0, 6);

  it('a truncated Parquet file', () => {
    const f = path.join(t.dir, 'cut.parquet');
    writeParquet(f, H, few, { layout: 'lists' });
    truncateSync(f, Math.floor(readFileSync(f).length * 0.6));
    const r = run([f]);
    expect(r.code).toBe(1);
    expect(r.err).toContain('not a complete Parquet file (it may be truncated)');
  });

  it('a truncated Arrow file', () => {
    const f = path.join(t.dir, 'cut.arrow');
    writeArrow(f, H, few, { layout: 'lists' });
    truncateSync(f, Math.floor(readFileSync(f).length * 0.6));
    const r = run([f]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/not a complete Arrow IPC file \(it may be truncated\)/);
  });

  it('a mistyped momentum column (strings)', () => {
    const buf = parquetWriteBuffer({
      columnData: [
        { name: 'px', data: [['1', '2']] as never },
        { name: 'py', data: [[1, 2]] as never },
        { name: 'pz', data: [[1, 2]] as never },
        { name: 'E', data: [[5, 5]] as never },
      ],
      schema: [
        { name: 'root', num_children: 4 },
        ...['px', 'py', 'pz', 'E'].flatMap((n) => [
          { name: n, repetition_type: 'OPTIONAL', num_children: 1, converted_type: 'LIST' },
          { name: 'list', repetition_type: 'REPEATED', num_children: 1 },
          n === 'px' ? { name: 'element', repetition_type: 'REQUIRED', type: 'BYTE_ARRAY', converted_type: 'UTF8' } : { name: 'element', repetition_type: 'REQUIRED', type: 'DOUBLE' },
        ]),
      ] as never,
      kvMetadata: [{ key: 'splitfield', value: JSON.stringify(H) }],
    });
    const f = t.file('strings.parquet', new Uint8Array(buf) as unknown as Buffer);
    const r = run([f]);
    expect(r.code).toBe(1);
    expect(r.err).toContain('column px: expected a list of numbers, found a list of BYTE_ARRAY (UTF8)');
  });

  it('a non-finite value names the row group, row, column and particle', () => {
    const bad = few.map((r) => ({ ...r, particles: Float64Array.from(r.particles) }));
    bad[4].particles[4 * 3] = NaN;
    const f = path.join(t.dir, 'nan.parquet');
    writeParquet(f, H, bad, { layout: 'lists', rowGroupSize: 2 });
    const r = run([f]);
    expect(r.code).toBe(1);
    expect(r.err).toContain('row group 2, row 4, column px, particle 3: px is not a finite number: NaN');
    const a = path.join(t.dir, 'nan.arrow');
    writeArrow(a, H, bad, { layout: 'lists', batchRows: 3 });
    expect(run([a]).err).toContain('row group 1, row 4, column px, particle 3: px is not a finite number: NaN');
  });

  it('no "splitfield" metadata, a missing column, and decreasing record numbers', () => {
    const f = path.join(t.dir, 'nometa.parquet');
    writeParquet(f, H, few, { layout: 'lists', noMetadata: true });
    expect(run([f]).err).toContain('the file has no "splitfield" key in its metadata');
    const pt = path.join(t.dir, 'ptform.arrow');
    writeArrow(pt, { ...H, momentum: 'pt,y,phi,m' }, few, { layout: 'lists' });
    expect(run([pt]).err).toContain('column pt: the file has no column "pt": momentum "pt,y,phi,m" needs columns pt, y, phi, m');
    // A flat file whose record numbers go back: 1, 1, 0.
    const flat = parquetWriteBuffer({
      columnData: [
        { name: 'record', data: Int32Array.of(1, 1, 0) },
        { name: 'px', data: Float64Array.of(1, 2, 3) },
        { name: 'py', data: Float64Array.of(0, 0, 0) },
        { name: 'pz', data: Float64Array.of(0, 0, 0) },
        { name: 'E', data: Float64Array.of(2, 3, 4) },
      ],
      kvMetadata: [{ key: 'splitfield', value: JSON.stringify(H) }],
    });
    const r = run([t.file('order.parquet', new Uint8Array(flat) as unknown as Buffer)]);
    expect(r.code).toBe(1);
    expect(r.err).toContain('row group 0, row 2, column record: record numbers must not decrease (0 after 1)');
  });
});
