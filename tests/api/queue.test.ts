// The processing queue is fair between people and bounded: a newcomer's first job starts before the rest of
// someone else's long queue, one person may have only so many samples queued or running, and a sample may hold
// only so many records and so much text once decompressed.
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateEvents } from '@/tests/support/test-events';
import { startTestServer, type TestServer } from '../support/server';
import { toRows } from '../unit/ingest/helpers';
import { addMember, newPerson, newStudy, type Person } from './fixtures';
import { isFinished, jetsFileText, upload, waitForSample } from './sample-fixtures';

/** A file whose job runs for seconds, so that others queue behind it (the tests wait for states, never for time). */
function slowEventsFile(events: number): Blob {
  const [particles] = generateEvents(5, 1, { nParticles: 300, nJets: 4 });
  const rows = JSON.stringify(toRows(particles));
  const lines = [JSON.stringify({ format: 'splitfield-particles', version: 1, content: 'events' })];
  for (let k = 1; k <= events; k++) lines.push(`{"id":${k},"particles":${rows}}`);
  return new Blob([`${lines.join('\n')}\n`]);
}

describe('fair order and the per-person limit', () => {
  let server: TestServer;
  let busy: Person, newcomer: Person;
  let studyId: number;

  beforeAll(async () => {
    server = await startTestServer({ env: { SPLITFIELD_MAX_JOBS: '1', SPLITFIELD_MAX_JOBS_PER_USER: '3' } });
    busy = await newPerson(server, 'busy');
    newcomer = await newPerson(server, 'newcomer');
    studyId = await newStudy(busy.client, 'Queue study');
    await addMember(busy.client, studyId, newcomer.email, 'editor');
  });
  afterAll(() => server?.stop());

  it('starts a newcomer’s first job before the rest of a long queue, and limits each person’s queue', async () => {
    // Long enough that the uploads below all arrive while it runs (the engine reads about 2 000 such events a second).
    const long = await upload(busy.client, { studyId, name: 'Long', file: slowEventsFile(6000) });
    expect(long.status, long.text).toBe(202);
    await waitForSample(busy.client, long.body.sample.id, (sample) => sample.state === 'running', 'running');
    const queued = [];
    for (const seed of [1, 2]) {
      const answer = await upload(busy.client, { studyId, name: `Busy ${seed}`, file: jetsFileText(20, seed) });
      expect(answer.status, answer.text).toBe(202);
      queued.push(answer.body.sample.id);
    }
    // Three queued or running: the fourth is refused before the file is stored.
    const fourth = await upload(busy.client, { studyId, name: 'One too many', file: jetsFileText(20, 9) });
    expect(fourth.status).toBe(429);
    expect(fourth.body.error.code).toBe('too_many_jobs');
    expect(fourth.body.error.message).toMatch(/You have 3 samples queued or being processed/);

    const first = await upload(newcomer.client, { studyId, name: 'First of the newcomer', file: jetsFileText(20, 3) });
    expect(first.status, first.text).toBe(202);
    const ids = [long.body.sample.id, ...queued, first.body.sample.id];
    const finished = [];
    for (const id of ids) finished.push(await waitForSample(busy.client, id, isFinished, 'the end of its job'));
    for (const sample of finished) expect(sample.state, JSON.stringify(sample.error)).toBe('done');
    const startedAt = (sample: any) => Date.parse(sample.provenance.timings.startedAt);
    const [, busy1, busy2, newcomers] = finished;
    expect(startedAt(newcomers)).toBeLessThan(startedAt(busy1));
    expect(startedAt(busy1)).toBeLessThan(startedAt(busy2));
  });
});

describe('limits of one sample', () => {
  let server: TestServer;
  let owner: Person;
  let studyId: number;

  beforeAll(async () => {
    server = await startTestServer({ env: { SPLITFIELD_MAX_RECORDS: '10', SPLITFIELD_MAX_DECOMPRESSED_BYTES: '200000' } });
    owner = await newPerson(server, 'owner');
    studyId = await newStudy(owner.client, 'Limits study');
  });
  afterAll(() => server?.stop());

  async function failure(file: Blob | string) {
    const answer = await upload(owner.client, { studyId, file });
    expect(answer.status, answer.text).toBe(202);
    const sample = await waitForSample(owner.client, answer.body.sample.id, isFinished, 'the end of its job');
    expect(sample.state).toBe('failed');
    return sample.error;
  }

  it('fails a sample with more records than the limit, naming the first record over it', async () => {
    const error = await failure(jetsFileText(12, 4));
    expect(error).toMatchObject({ code: 'limit', line: 12 });
    expect(error.message).toBe('line 12: the file has more than 10 records, the most one sample may hold on this server');
    expect(error.explanation).toMatch(/SPLITFIELD_MAX_RECORDS/);
  });

  it('fails a small gzip file that expands past the limit of decompressed text', async () => {
    const text = jetsFileText(8, 5);
    // Eight records repeated in blank-line padding: valid, tiny once compressed, large once decompressed.
    const padded = text.replace(/\n/g, `\n${' '.repeat(60_000)}\n`);
    const error = await failure(new Blob([gzipSync(padded)]));
    expect(error.code).toBe('limit');
    expect(error.message).toMatch(/^line \d+: once decompressed, the file holds more than 195 kB of text/);
  });

  it('names the field of a second file in the upload form', async () => {
    const form = new FormData();
    form.append('studyId', String(studyId));
    form.append('name', 'Two files');
    form.append('file', new Blob([jetsFileText(2, 1)]), 'a.jsonl');
    form.append('file', new Blob([jetsFileText(2, 2)]), 'b.jsonl');
    const twice = await owner.client.send('POST', '/api/samples/upload', { multipart: form });
    expect(twice.status).toBe(400);
    expect(twice.body.error.message).toBe('Send exactly one file, in the "file" field: the form has a second file in the "file" field.');

    const other = new FormData();
    other.append('studyId', String(studyId));
    other.append('name', 'Wrong field');
    other.append('attachment', new Blob([jetsFileText(2, 1)]), 'a.jsonl');
    const wrong = await owner.client.send('POST', '/api/samples/upload', { multipart: other });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details).toEqual([{ path: 'attachment', message: 'unexpected file field' }]);
  });
});
