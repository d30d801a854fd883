// What processing makes of an upload, read back through the API on a real server: the results agree with the
// command line run on the same file (the same engine, outside the server); every accepted format is read; bad
// files end failed with the line and a plain explanation, and leave nothing in storage/.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultGrid, PlaneHistogram, type HorizontalCoordinate } from '@/lib/physics/density';
import { generateEvents } from '@/tests/support/test-events';
import { SPLIT_STRIDE } from '@/lib/physics/types';
import type { TestServer } from '../support/server';
import { hepmc3Text, toRows } from '../unit/ingest/helpers';
import { addMember, newPerson, newStudy, serverWithAdmin, type Person } from './fixtures';
import { isFinished, jetsFileText, storedFiles, upload, uploadDone, waitForSample } from './sample-fixtures';

const CLI = path.resolve(__dirname, '..', '..', 'dist', 'engine', 'cli.js');

let server: TestServer;
let owner: Person;
let outsider: Person;
let studyId: number;
let work: string;

beforeAll(async () => {
  // Two threads: the job's pipeline then runs its own pool of worker threads, and must still agree with the
  // command line on one.
  ({ server } = await serverWithAdmin({ env: { SPLITFIELD_JOB_THREADS: '2' } }));
  owner = await newPerson(server, 'owner');
  outsider = await newPerson(server, 'outsider');
  studyId = await newStudy(owner.client, 'Processing study');
  work = mkdtempSync(path.join(os.tmpdir(), 'splitfield-processing-'));
});
afterAll(async () => {
  await server?.stop();
  if (work) rmSync(work, { recursive: true, force: true });
});

/** Events of about `particles` particles with string ids (the export writes ids as text). */
function eventsFileText(count: number, particles: number, seed: number): string {
  const header = { format: 'splitfield-particles', version: 1, content: 'events', sample: { name: 'events' }, run: 'test' };
  const events = generateEvents(seed, count, { nParticles: particles, nJets: 3, massiveFraction: 0.3 });
  const lines = events.map((p, k) => JSON.stringify({ id: `ev${k + 1}`, weight: 1 + (k % 3) / 2, particles: toRows(p) }));
  return `${[JSON.stringify(header), ...lines].join('\n')}\n`;
}

/** The command line's export of the same file with the same options, as parsed lines (header first). */
function cliExport(text: string, options: string[]): any[] {
  const input = path.join(work, `input-${createHash('sha256').update(text).digest('hex').slice(0, 12)}.jsonl`);
  const output = `${input}.out`;
  writeFileSync(input, text);
  execFileSync(process.execPath, [CLI, input, '--threads', '1', '--quiet', '--out', output, ...options]);
  return readLines(readFileSync(output, 'utf8'));
}

function readLines(text: string): any[] {
  return text
    .split('\n')
    .filter((line) => line !== '')
    .map((line) => JSON.parse(line));
}

/** The plane histogram the exported jets give (their primary splittings, weighted), rebinned as the API does. */
function expectedPlane(jets: any[], horizontal: HorizontalCoordinate, R: number) {
  const histogram = new PlaneHistogram(defaultGrid(horizontal, horizontal === 'lnRoverDelta' ? R : null));
  for (const jet of jets) {
    const primary = new Float64Array(jet.primary.length * SPLIT_STRIDE);
    jet.primary.forEach((row: number[], k: number) => primary.set(row, k * SPLIT_STRIDE));
    histogram.fillJet(primary, jet.weight);
  }
  const { x, y } = histogram.grid;
  return histogram.rebin({ min: x.min, max: x.max, merge: 4 }, { min: y.min, max: y.max, merge: 4 });
}

function expectClose(actual: number[], expected: Float64Array) {
  expect(actual).toHaveLength(expected.length);
  actual.forEach((value, i) => expect(value).toBeCloseTo(expected[i], 12));
}

describe('a processed file of events', () => {
  const text = eventsFileText(60, 300, 31);
  let sample: any;
  let reference: any[];
  /** Wall time the test saw from the start of the upload until the sample read as done. */
  let observedMs: number;

  beforeAll(async () => {
    const started = performance.now();
    sample = await uploadDone(owner.client, {
      studyId,
      name: 'Events',
      file: text,
      fileName: 'events.jsonl',
      fields: { label: 'ev', tags: 'events,anti-kt' },
    });
    observedMs = performance.now() - started;
    reference = cliExport(text, []);
  });

  it('has the counts of the command line run on the same file', () => {
    const jets = reference.slice(1);
    expect(sample.counts).toMatchObject({
      records: 60,
      particles: expect.any(Number),
      jets: jets.length,
      primarySplittings: jets.reduce((sum, jet) => sum + jet.primary.length, 0),
      allSplittings: 0,
    });
    expect(sample.counts.jetsRejected.pt + sample.counts.jetsRejected.y).toBeGreaterThan(0);
    expect(sample.progress).toMatchObject({ fraction: 1, records: 60, jets: jets.length, secondsLeft: 0 });
  });

  it('exports the same jets and splittings as the command line, with the same header settings', async () => {
    const response = await owner.client.get(`/api/samples/${sample.id}/export`);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toMatch(/application\/x-ndjson/);
    expect(response.headers.get('content-disposition')).toBe(`attachment; filename="sample-${sample.id}-declusterings.jsonl"`);
    const [header, ...jets] = readLines(response.text);
    const [referenceHeader, ...referenceJets] = reference;
    expect(jets).toEqual(referenceJets);
    expect({ ...header, input: null }).toEqual({ ...referenceHeader, input: null });
    expect(header.input).toMatchObject({ file: 'events.jsonl', format: 'splitfield-particles' });
  });

  it('serves the per-jet density of the primary plane from the cache, in both horizontal coordinates', async () => {
    for (const horizontal of ['lnInvDelta', 'lnRoverDelta'] as const) {
      const response = await owner.client.get(`/api/samples/${sample.id}/plane?horizontal=${horizontal}`);
      expect(response.status, response.text).toBe(200);
      const expected = expectedPlane(reference.slice(1), horizontal, 0.4);
      expect(response.body).toMatchObject({ horizontal, jetCount: reference.length - 1 });
      expect(response.body.jetWeight).toBeCloseTo(expected.jetWeight, 12);
      expectClose(response.body.xEdges, expected.xEdges);
      expectClose(response.body.yEdges, expected.yEdges);
      expectClose(response.body.density, expected.density);
      expectClose(response.body.variance, expected.variance);
    }
  });

  it('rebins to the bins asked for, and names a range that is not on the fine grid', async () => {
    const coarse = await owner.client.get(`/api/samples/${sample.id}/plane?xmin=0&xmax=6&xmerge=20&ymin=-2&ymax=6&ymerge=40`);
    expect(coarse.status, coarse.text).toBe(200);
    expect(coarse.body.xEdges).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(coarse.body.yEdges).toEqual([-2, 0, 2, 4, 6]);
    expect(coarse.body.density).toHaveLength(6 * 4);
    const offGrid = await owner.client.get(`/api/samples/${sample.id}/plane?xmin=0.01`);
    expect(offGrid.status).toBe(400);
    expect(offGrid.body.error.message).toMatch(/x range min = 0.01 must be an edge of the fine grid/);
    const bad = await owner.client.get(`/api/samples/${sample.id}/plane?horizontal=z&ymerge=0&colour=red`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((detail: { path: string }) => detail.path).sort()).toEqual(['(query)', 'horizontal', 'ymerge']);
  });

  it('pages through the jet table in file order and sorted by a column', async () => {
    const referenceJets = reference.slice(1);
    const first = await owner.client.get(`/api/samples/${sample.id}/jets?limit=3`);
    expect(first.status, first.text).toBe(200);
    expect(first.body.total).toBe(referenceJets.length);
    expect(first.body.jets).toEqual(
      referenceJets.slice(0, 3).map((jet, row) => ({
        row,
        record: jet.rec,
        jet: jet.jet,
        weight: jet.weight,
        pt: jet.pt,
        y: jet.y,
        phi: jet.phi,
        m: jet.m,
        n: jet.n,
        mg: jet.sd[0],
        zg: jet.sd[1],
        Rg: jet.sd[2],
        mult: jet.mult,
        // Not tagged; energy and polar angle from pt, y and m.
        flavour: null,
        E: expect.closeTo(Math.sqrt(jet.pt ** 2 + jet.m * Math.abs(jet.m)) * Math.cosh(jet.y), 9),
        theta: expect.closeTo(Math.atan2(jet.pt, Math.sqrt(jet.pt ** 2 + jet.m * Math.abs(jet.m)) * Math.sinh(jet.y)), 12),
      })),
    );
    const byPt = await owner.client.get(`/api/samples/${sample.id}/jets?sort=pt&limit=200`);
    const pts = byPt.body.jets.map((jet: { pt: number }) => jet.pt);
    expect(pts).toEqual([...referenceJets.map((jet) => jet.pt)].sort((a, b) => b - a));
    const lastFirst = await owner.client.get(`/api/samples/${sample.id}/jets?order=desc&limit=2`);
    expect(lastFirst.body.jets.map((jet: { row: number }) => jet.row)).toEqual([referenceJets.length - 1, referenceJets.length - 2]);
    const past = await owner.client.get(`/api/samples/${sample.id}/jets?offset=100000`);
    expect(past.body).toEqual({ total: referenceJets.length, jets: [] });
    const tooMany = await owner.client.get(`/api/samples/${sample.id}/jets?limit=201&sort=colour`);
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details.map((detail: { path: string }) => detail.path).sort()).toEqual(['limit', 'sort']);
  });

  it('gives its provenance as a JSON download', async () => {
    const response = await owner.client.get(`/api/samples/${sample.id}/provenance`);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-disposition')).toBe(`attachment; filename="sample-${sample.id}-provenance.json"`);
    expect(response.body).toMatchObject({
      sample: { id: sample.id, name: 'Events', label: 'ev', state: 'done' },
      study: { id: studyId, title: 'Processing study' },
      file: { name: 'events.jsonl', size: Buffer.byteLength(text), sha256: createHash('sha256').update(text).digest('hex') },
      input: { format: 'splitfield-particles', layout: 'jsonl', gzip: false, content: 'events', metadata: { run: 'test' } },
      settings: sample.settings,
      software: { name: 'splitfield', version: expect.stringMatching(/^\d+\.\d+\.\d+/) },
      uploadedBy: { id: owner.id, name: owner.name },
      counts: sample.counts,
      tree: 'primary',
    });
    const { timings } = response.body;
    expect(timings.processingSeconds).toBeGreaterThan(0);
    expect(timings.uploadSeconds).toBeGreaterThanOrEqual(0);
    // The job may start while the file arrives (the server had room): never before the upload began, and the
    // span from the upload's start to the job's end fits inside what the client saw from upload start to done
    // (2 ms: the clocks' whole milliseconds).
    const uploadStart = new Date(timings.uploadedAt).getTime() - timings.uploadSeconds * 1000;
    const started = new Date(timings.startedAt).getTime();
    expect(started).toBeGreaterThanOrEqual(uploadStart - 2);
    expect(started + timings.processingSeconds * 1000 - uploadStart).toBeLessThanOrEqual(observedMs + 2);
  });

  it('refuses export?all=1 when only the primary splittings are stored', async () => {
    const response = await owner.client.get(`/api/samples/${sample.id}/export?all=1`);
    expect(response.status).toBe(409);
    expect(response.body.error).toMatchObject({ code: 'full_tree_not_stored', message: expect.stringMatching(/"fullTree": true/) });
  });
});

describe('a sample stored with its full tree', () => {
  it('exports every splitting as the command line does with --all, and the primary ones without', async () => {
    const text = eventsFileText(20, 200, 32);
    const settings = { jet: { R: 0.6, maxJets: 2 }, softDrop: { zCut: 0.2, beta: 1 }, multiplicityKtCut: 2, fullTree: true };
    const sample = await uploadDone(owner.client, { studyId, name: 'Full tree', file: text, fields: { settings: JSON.stringify(settings) } });
    const options = ['--R', '0.6', '--njets', '2', '--zcut', '0.2', '--beta', '1', '--ktcut', '2'];
    const all = readLines((await owner.client.get(`/api/samples/${sample.id}/export?all=1`)).text);
    expect(all.slice(1)).toEqual(cliExport(text, [...options, '--all']).slice(1));
    const primary = readLines((await owner.client.get(`/api/samples/${sample.id}/export`)).text);
    expect(primary.slice(1)).toEqual(cliExport(text, options).slice(1));
    expect(sample.counts.allSplittings).toBe(all.slice(1).reduce((sum, jet) => sum + jet.all.length, 0));
    // The headers say what each file holds: the sample keeps the full tree; only one file carries "all".
    expect(all[0]).toMatchObject({ fullTree: true, splittings: ['primary', 'all'], columns: { all: expect.any(Array) } });
    expect(primary[0]).toMatchObject({ fullTree: true, splittings: ['primary'] });
    expect(primary[0].columns.all).toBeUndefined();
  });

  it('says in the export of a jets file that no jets were found', async () => {
    const sample = await uploadDone(owner.client, { studyId, name: 'Jets file', file: jetsFileText(30, 5) });
    const [header] = readLines((await owner.client.get(`/api/samples/${sample.id}/export`)).text);
    expect(header.content).toBe('jets');
    expect(header.jetDefinition).toEqual({ algorithm: null, R: 0.4, jetsFound: false, note: 'each record is one jet, taken as given' });
  });
});

describe('the accepted formats', () => {
  const events = generateEvents(41, 8, { nParticles: 120, nJets: 2 });

  it.each([
    ['JSON Lines, gzip-compressed', () => gzipSync(eventsFileText(8, 120, 41)), { layout: 'jsonl', gzip: true }],
    [
      'the one-document form',
      () =>
        JSON.stringify({
          format: 'splitfield-particles',
          version: 1,
          content: 'events',
          records: events.map((p, k) => ({ id: `ev${k + 1}`, particles: toRows(p) })),
        }),
      { layout: 'document', gzip: false },
    ],
    ['HepMC3 ASCII', () => hepmc3Text(events), { format: 'hepmc3', layout: 'ascii', gzip: false }],
  ])('reads %s', async (_what, content, input) => {
    const sample = await uploadDone(owner.client, { studyId, file: new Blob([content()]), fileName: 'input.dat' });
    expect(sample.counts.records).toBe(8);
    expect(sample.counts.jets).toBeGreaterThan(0);
    expect(sample.provenance.input).toMatchObject({ content: 'events', ...input });
  });
});

describe('a file that cannot be processed', () => {
  const header = JSON.stringify({ format: 'splitfield-particles', version: 1, content: 'jets' });
  const goodJet = JSON.stringify({ particles: [[10, 0, 1, 10.1], [20, 1, 2, 20.2]] });

  it.each([
    ['of another format', () => 'px,py,pz,E\n1,2,3,4\n', 'header', 1, /line 1: the header is not valid JSON/],
    [
      'in gzip, cut short',
      () => {
        const whole = gzipSync(`${header}\n${`${goodJet}\n`.repeat(5000)}`);
        return whole.subarray(0, Math.floor(whole.length / 2));
      },
      'gzip',
      null,
      /truncated file/,
    ],
    [
      'with a bad record at line 50 000',
      () => {
        const lines = [header, ...Array.from({ length: 49_998 }, () => goodJet)];
        lines.push(JSON.stringify({ particles: [[10, 0, 1, 10.1], [30, 0, 0, 2]] }), goodJet);
        return `${lines.join('\n')}\n`;
      },
      'particle',
      50_000,
      /^line 50000, particle 1: /,
    ],
    ['with a header and no records', () => `${header}\n`, 'empty', 1, /has a header \(line 1\) but no records/],
  ])('%s ends failed, naming the line, with an explanation, and leaves no files', async (_what, content, code, line, message) => {
    const response = await upload(owner.client, { studyId, name: `Bad ${code}`, file: new Blob([content()]) });
    expect(response.status, response.text).toBe(202);
    const sample = await waitForSample(owner.client, response.body.sample.id, isFinished);
    expect(sample.state).toBe('failed');
    expect(sample.error).toMatchObject({ code, message: expect.stringMatching(message), explanation: expect.any(String) });
    if (line !== null) expect(sample.error.line).toBe(line);
    expect(sample.error.explanation.length).toBeGreaterThan(40);
    expect(sample.counts).toBeNull();
    const stored = storedFiles(server.storageDir);
    expect(stored.samples.filter((name) => name === String(sample.id) || name.startsWith(`.${sample.id}.`))).toEqual([]);
    const plane = await owner.client.get(`/api/samples/${sample.id}/plane`);
    expect(plane.status).toBe(409);
    expect(plane.body.error).toMatchObject({ code: 'not_ready', message: expect.stringMatching(/is failed/) });
  });
});

describe('listing samples', () => {
  it('filters by study, label, tag and state, sorts, and shows only samples the caller may see', async () => {
    const other = await newStudy(outsider.client, 'Outsider study');
    await uploadDone(outsider.client, { studyId: other, name: 'Not for the owner', file: jetsFileText(5, 51), fields: { label: 'ev' } });
    const mine = await uploadDone(owner.client, { studyId, name: 'Alpha', file: jetsFileText(5, 52), fields: { label: 'alpha', tags: 'x,events' } });

    const names = async (query: string) => {
      const response = await owner.client.get(`/api/samples${query}`);
      expect(response.status, response.text).toBe(200);
      return response.body.samples.map((sample: { name: string }) => sample.name);
    };
    expect(await names('')).not.toContain('Not for the owner');
    expect(await names('?label=ev')).toEqual(['Events']);
    expect(await names('?tag=events')).toEqual(['Alpha', 'Events']);
    expect(await names(`?studyId=${other}`)).toEqual([]);
    expect(await names('?state=failed')).toEqual(expect.arrayContaining(['Bad header', 'Bad gzip']));
    const byName = await names(`?studyId=${studyId}&sort=name`);
    expect(byName).toEqual([...byName].sort((a: string, b: string) => a.localeCompare(b)));
    expect((await owner.client.get('/api/samples')).body.samples[0]).toMatchObject({
      id: mine.id,
      studyTitle: 'Processing study',
      state: 'done',
      uploadedBy: { id: owner.id, name: owner.name },
    });
    const bad = await owner.client.get('/api/samples?state=finished&sort=colour');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((detail: { path: string }) => detail.path).sort()).toEqual(['sort', 'state']);
    expect((await outsider.client.get(`/api/samples/${mine.id}`)).status).toBe(404);
  });
});

describe('deleting a sample', () => {
  it('removes its row and its files', async () => {
    const sample = await uploadDone(owner.client, { studyId, name: 'Short-lived', file: jetsFileText(5, 61) });
    expect(storedFiles(server.storageDir).samples).toContain(String(sample.id));
    const removed = await owner.client.delete(`/api/samples/${sample.id}`);
    expect(removed.status).toBe(204);
    expect((await owner.client.get(`/api/samples/${sample.id}`)).status).toBe(404);
    expect(storedFiles(server.storageDir).samples).not.toContain(String(sample.id));
  });

  it('goes with its study, files included', async () => {
    const study = await newStudy(owner.client, 'Study to delete');
    const sample = await uploadDone(owner.client, { studyId: study, name: 'In a deleted study', file: jetsFileText(5, 62) });
    expect((await owner.client.delete(`/api/studies/${study}`)).status).toBe(204);
    expect((await owner.client.get(`/api/samples/${sample.id}`)).status).toBe(404);
    expect(storedFiles(server.storageDir).samples).not.toContain(String(sample.id));
  });

  it('is for editors: a viewer is refused and the sample stays', async () => {
    const viewer = await newPerson(server, 'viewer');
    await addMember(owner.client, studyId, viewer.email, 'viewer');
    const sample = await uploadDone(owner.client, { studyId, name: 'Kept', file: jetsFileText(5, 63) });
    expect((await viewer.client.delete(`/api/samples/${sample.id}`)).status).toBe(403);
    expect(storedFiles(server.storageDir).samples).toContain(String(sample.id));
  });
});
