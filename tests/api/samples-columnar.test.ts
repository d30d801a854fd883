// Columnar uploads and the jet-definition settings through the upload route on a real server: a Parquet and an
// Arrow file with the same content as a JSON Lines file give the same export; the settings (charged-only, flavour
// tags) reach the job, its counts, the jet table and the provenance; a truncated or mistyped columnar file ends
// failed with a message naming where, and leaves nothing in storage/.
import { mkdtempSync, readFileSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { float64, list, tableFromArrays, tableToIPC, utf8 } from '@uwdata/flechette';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromPtYPhiM } from '@/lib/physics/fourvector';
import { writeArrow, writeParquet, type ColumnarRecord } from '@/tests/support/columnar-files';
import { generateEvents, hardestDirection, listedPids } from '@/tests/support/test-events';
import type { TestServer } from '../support/server';
import { toRows } from '../unit/ingest/helpers';
import { newPerson, newStudy, serverWithAdmin, type Person } from './fixtures';
import { isFinished, storedFiles, upload, uploadDone, waitForSample } from './sample-fixtures';

let server: TestServer;
let owner: Person;
let studyId: number;
let work: string;

const HEADER = { format: 'splitfield-particles', version: 1, content: 'events', sample: { name: 'columnar' } };
const events = generateEvents(612, 40, { nParticles: 150, nJets: 3 });
const records: ColumnarRecord[] = events.map((p, i) => {
  const { pid, charge } = listedPids(700 + i, p.length / 4);
  const tags = new Float64Array(4);
  fromPtYPhiM(50, ...hardestDirection(p), 1.87, tags, 0);
  return { id: `ev${i}`, weight: 1 + (i % 4) / 4, particles: p, pid, charge, tags, tagPid: Int32Array.of(i % 2 ? 411 : 511) };
});
const jsonText =
  [JSON.stringify(HEADER), ...records.map((r) => JSON.stringify({ id: r.id, weight: r.weight, particles: toRows(r.particles), pid: Array.from(r.pid!), charge: Array.from(r.charge!), tagParticles: toRows(r.tags!), tagPid: Array.from(r.tagPid!) }))].join('\n') + '\n';

beforeAll(async () => {
  ({ server } = await serverWithAdmin({ env: { SPLITFIELD_JOB_THREADS: '2' } }));
  owner = await newPerson(server, 'owner');
  studyId = await newStudy(owner.client, 'Columnar study');
  work = mkdtempSync(path.join(os.tmpdir(), 'splitfield-columnar-api-'));
});
afterAll(async () => {
  await server?.stop();
  if (work) rmSync(work, { recursive: true, force: true });
});

function fileBlob(file: string): Blob {
  return new Blob([readFileSync(file)]);
}

async function exportLines(sampleId: number): Promise<any[]> {
  const response = await owner.client.get(`/api/samples/${sampleId}/export`);
  expect(response.status).toBe(200);
  return response.text.split('\n').filter((l) => l).map((l) => JSON.parse(l));
}

describe('Parquet and Arrow uploads', () => {
  const settings = JSON.stringify({ particles: { chargedOnly: true, ptMin: 0.3 }, flavourTags: true, jet: { ptMin: 15 } });

  it('give the export of the same content as JSON Lines, with the settings in provenance, counts and jet table', async () => {
    const parquet = path.join(work, 'events.parquet');
    writeParquet(parquet, HEADER, records, { layout: 'lists', rowGroupSize: 9 });
    const arrow = path.join(work, 'events.arrow');
    writeArrow(arrow, HEADER, records, { layout: 'lists', batchRows: 13 });
    const json = await uploadDone(owner.client, { studyId, name: 'JSON Lines', file: jsonText, fileName: 'events.jsonl', fields: { settings } });
    const pq = await uploadDone(owner.client, { studyId, name: 'Parquet', file: fileBlob(parquet), fileName: 'events.parquet', fields: { settings } });
    const ar = await uploadDone(owner.client, { studyId, name: 'Arrow', file: fileBlob(arrow), fileName: 'events.arrow', fields: { settings } });

    const [jsonHeader, ...jsonJets] = await exportLines(json.id);
    expect(jsonJets.length).toBeGreaterThan(40);
    expect(jsonHeader.constituents).toMatchObject({ chargedOnly: true, ptMin: 0.3 });
    expect(jsonJets.map((j) => j.flavour)).toEqual(expect.arrayContaining(['b', 'c', 'light']));
    for (const other of [pq, ar]) {
      const [, ...jets] = await exportLines(other.id);
      expect(jets).toEqual(jsonJets);
      expect(other.counts).toEqual(json.counts);
    }
    expect(json.counts.particlesRemoved.neutral).toBeGreaterThan(0);
    expect(json.counts.flavours.b + json.counts.flavours.c + json.counts.flavours.light).toBe(jsonJets.length);

    const detail = (await owner.client.get(`/api/samples/${pq.id}`)).body.sample;
    expect(detail.provenance.input).toMatchObject({ format: 'splitfield-particles', layout: 'parquet-lists' });
    expect(detail.provenance.settings).toMatchObject({ particles: { chargedOnly: true }, flavourTags: true, collision: 'hadron' });
    const table = await owner.client.get(`/api/samples/${ar.id}/jets?sort=flavour&limit=5`);
    expect(table.status, table.text).toBe(200);
    expect(table.body.jets[0].flavour).toBe('b');
  });

  it('a flat-layout Parquet file with one thread as well', async () => {
    const flat = path.join(work, 'flat.parquet');
    const untagged = records.map(({ tags: _t, tagPid: _p, ...r }) => r);
    writeParquet(flat, HEADER, untagged, { layout: 'flat', rowGroupSize: 1000 });
    const sample = await uploadDone(owner.client, { studyId, name: 'Flat', file: fileBlob(flat), fileName: 'flat.parquet' });
    expect(sample.counts.records).toBe(records.length);
  });
});

describe('bad columnar uploads end failed and keep nothing', () => {
  it.each([
    ['a truncated Parquet file', 'cut.parquet', /not a complete Parquet file \(it may be truncated\)/],
    ['an Arrow file with a mistyped column', 'strings.arrow', /column pid: expected a list of integer particle codes, found a list of floating point/],
  ])('%s', async (_what, name, message) => {
    const file = path.join(work, name);
    if (name.endsWith('.parquet')) {
      writeParquet(file, HEADER, records.slice(0, 8), { layout: 'lists' });
      truncateSync(file, Math.floor(readFileSync(file).length / 2));
    } else {
      // pid written as floating-point numbers.
      const few = records.slice(0, 8);
      const comp = (c: number) => few.map((r) => Array.from({ length: r.particles.length / 4 }, (_, i) => r.particles[4 * i + c]));
      const table = tableFromArrays(
        { id: few.map((r) => r.id), px: comp(0), py: comp(1), pz: comp(2), E: comp(3), pid: few.map((r) => Array.from(r.pid!, Number)) },
        { types: { id: utf8(), px: list(float64()), py: list(float64()), pz: list(float64()), E: list(float64()), pid: list(float64()) } },
      );
      (table.schema as { metadata?: Map<string, string> }).metadata = new Map([['splitfield', JSON.stringify(HEADER)]]);
      writeFileSync(file, tableToIPC(table, { format: 'file' })!);
    }
    const response = await upload(owner.client, { studyId, name, file: fileBlob(file), fileName: name });
    expect(response.status, response.text).toBe(202);
    const sample = await waitForSample(owner.client, response.body.sample.id, isFinished);
    expect(sample.state).toBe('failed');
    expect(sample.error).toMatchObject({ code: 'columnar', message: expect.stringMatching(message), explanation: expect.stringContaining('columnar schema') });
    expect(sample.counts).toBeNull();
    const stored = storedFiles(server.storageDir);
    expect(stored.samples.filter((n) => n === String(sample.id) || n.startsWith(`.${sample.id}.`))).toEqual([]);
    expect(stored.uploads).toEqual([]);
  });
});
