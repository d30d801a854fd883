// Processing jobs on a real server: one job at a time, live progress, cancelling, a server killed with SIGKILL in
// the middle of a job and started again on the same storage, and several users uploading at once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateEvents } from '@/tests/support/test-events';
import { startTestServer, signIn, type Client, type TestServer } from '../support/server';
import { toRows } from '../unit/ingest/helpers';
import { addMember, newPerson, newStudy } from './fixtures';
import { isFinished, jetsFileText, storedFiles, upload, uploadDone, waitForSample } from './sample-fixtures';

/**
 * A file whose job runs for seconds (one event of 300 particles, repeated), so that a test sees it running: the
 * tests wait for states, they never rely on how long the job takes.
 */
function slowEventsFile(events: number, tag: string): Blob {
  const [particles] = generateEvents(5, 1, { nParticles: 300, nJets: 4 });
  const rows = JSON.stringify(toRows(particles));
  const header = JSON.stringify({ format: 'splitfield-particles', version: 1, content: 'events', sample: { name: tag } });
  const lines = [header];
  for (let k = 1; k <= events; k++) lines.push(`{"id":"${tag}-${k}","particles":${rows}}`);
  return new Blob([`${lines.join('\n')}\n`]);
}

/**
 * A multipart form sent slowly: the fields, the file in ten pieces a tenth of a second apart, then the fields
 * after the file; so that the file is still arriving while a job could read it. With `hold`, the second half of
 * the file waits for it.
 */
function slowForm(
  before: [string, string][],
  file: string,
  after: [string, string][] = [],
  hold?: Promise<void>,
): { body: ReadableStream<Uint8Array>; contentType: string } {
  const boundary = 'splitfield-slow-form';
  const field = ([name, value]: [string, string]) => `--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`;
  const pieces = [before.map(field).join('') + `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="early.jsonl"\r\nContent-Type: application/octet-stream\r\n\r\n`];
  const size = Math.ceil(file.length / 10);
  for (let at = 0; at < file.length; at += size) pieces.push(file.slice(at, at + size));
  pieces.push(`\r\n${after.map(field).join('')}--${boundary}--\r\n`);
  const encoder = new TextEncoder();
  let next = 0;
  const body = new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (next > 0) await new Promise((resolve) => setTimeout(resolve, 100));
      if (hold && next === Math.ceil(pieces.length / 2)) await hold;
      if (next === pieces.length) controller.close();
      else controller.enqueue(encoder.encode(pieces[next++]));
    },
  });
  return { body, contentType: `multipart/form-data; boundary=${boundary}` };
}

const SLOW_EVENTS = 4000;
const isRunningWithProgress = (sample: any) => sample.state === 'running' && (sample.progress?.records ?? 0) > 0;

/** What of sample `id` is on disk: its folder and any half-written (staging) copy. */
function filesOf(server: TestServer, id: number): string[] {
  return storedFiles(server.storageDir).samples.filter((name) => name === String(id) || name.startsWith(`.${id}.`));
}

describe('one server', () => {
  let server: TestServer;
  let owner: Client;
  let studyId: number;

  beforeAll(async () => {
    server = await startTestServer();
    const person = await newPerson(server, 'owner');
    owner = person.client;
    studyId = await newStudy(owner, 'Jobs study');
  });
  afterAll(() => server?.stop());

  it('runs one job at a time, reports progress, and cancels a running and a queued job without a trace', async () => {
    // The second upload is made once the first job is seen running (a long file), so that the first cannot have
    // finished before it arrives however fast the engine is; it is small, and must wait in the queue.
    const first = await upload(owner, { studyId, name: 'First', file: slowEventsFile(2 * SLOW_EVENTS, 'a') });
    expect(first.status).toBe(202);
    const a = first.body.sample.id;

    const running = await waitForSample(owner, a, isRunningWithProgress, 'running with progress');
    expect(running.progress).toMatchObject({
      fraction: expect.any(Number),
      bytesTotal: running.fileSize,
      records: expect.any(Number),
      jets: expect.any(Number),
      splittings: expect.any(Number),
      jetsPerSecond: expect.any(Number),
    });
    expect(running.progress.fraction).toBeGreaterThan(0);
    expect(running.progress.fraction).toBeLessThan(1);
    const second = await upload(owner, { studyId, name: 'Second', file: slowEventsFile(100, 'b') });
    expect(second.status).toBe(202);
    const b = second.body.sample.id;
    expect((await owner.get(`/api/samples/${b}`)).body.sample.state).toBe('queued');

    const cancelledQueued = await owner.post(`/api/samples/${b}/cancel`);
    expect(cancelledQueued.status, cancelledQueued.text).toBe(200);
    expect(cancelledQueued.body.sample).toMatchObject({ id: b, state: 'cancelled', error: null });

    const cancelledRunning = await owner.post(`/api/samples/${a}/cancel`);
    expect(cancelledRunning.status, cancelledRunning.text).toBe(200);
    expect(cancelledRunning.body.sample).toMatchObject({ id: a, state: 'cancelled', counts: null });
    expect(filesOf(server, a)).toEqual([]);
    expect(storedFiles(server.storageDir).uploads).toEqual([]);

    const again = await owner.post(`/api/samples/${a}/cancel`);
    expect(again.body.sample.state).toBe('cancelled');
    expect((await owner.get(`/api/samples/${a}/jets`)).status).toBe(409);
  });

  it('deletes a sample whose job is running: the job stops and its files go', async () => {
    const made = await upload(owner, { studyId, name: 'Deleted while running', file: slowEventsFile(SLOW_EVENTS, 'c') });
    const id = made.body.sample.id;
    await waitForSample(owner, id, isRunningWithProgress, 'running with progress');
    expect((await owner.delete(`/api/samples/${id}`)).status).toBe(204);
    expect((await owner.get(`/api/samples/${id}`)).status).toBe(404);
    expect(filesOf(server, id)).toEqual([]);
    expect(storedFiles(server.storageDir).uploads).toEqual([]);
  });

  it('answers a request that waits (?wait=N) when the job ends, or once the wait is over', async () => {
    // Two long jobs: the second waits in the queue behind the first, then runs for seconds itself, so that it is
    // unfinished for longer than the waits below however fast the first one ends.
    const first = await upload(owner, { studyId, name: 'Long', file: slowEventsFile(2 * SLOW_EVENTS, 'w1') });
    const a = first.body.sample.id;
    await waitForSample(owner, a, isRunningWithProgress, 'running with progress');
    const second = await upload(owner, { studyId, name: 'Behind', file: slowEventsFile(2 * SLOW_EVENTS, 'w2') });
    const b = second.body.sample.id;

    // Unfinished when the wait is over: answered then, as it stands.
    const asked = Date.now();
    const waited = await owner.get(`/api/samples/${b}?wait=1`);
    expect(waited.status, waited.text).toBe(200);
    expect(['queued', 'running']).toContain(waited.body.sample.state);
    expect(Date.now() - asked).toBeGreaterThanOrEqual(950);

    // A request waiting on it gets its final state when its job ends (here by a cancel).
    const pending = owner.get(`/api/samples/${b}?wait=60`);
    expect((await owner.post(`/api/samples/${b}/cancel`)).status).toBe(200);
    expect((await pending).body.sample).toMatchObject({ id: b, state: 'cancelled' });

    // One request is enough to wait for a job's end.
    const done = await owner.get(`/api/samples/${a}?wait=60`);
    expect(done.body.sample).toMatchObject({ id: a, state: 'done', counts: { records: 2 * SLOW_EVENTS } });

    for (const bad of ['soon', '61', '-1', '1.5']) {
      const refused = await owner.get(`/api/samples/${a}?wait=${bad}`);
      expect(refused.status, bad).toBe(400);
      expect(refused.body.error.details).toEqual([{ path: 'wait', message: expect.stringMatching(/^wait must be/) }]);
    }
  });

  it('starts a job while its file arrives; the new sample adopts it, a duplicate drops it without a trace', async () => {
    const text = await slowEventsFile(400, 'early').text();
    const settings = JSON.stringify({ jet: { R: 0.8 } });
    // Fields before the file: the job starts once the file begins to arrive, and the sample is created running.
    const early = await owner.send('POST', '/api/samples/upload', {
      stream: slowForm([['studyId', String(studyId)], ['name', 'Early'], ['settings', settings]], text),
    });
    expect(early.status, early.text).toBe(202);
    expect(early.body.sample.state).toBe('running');
    const adopted = await waitForSample(owner, early.body.sample.id, isFinished, 'the end of its job');
    expect(adopted.state, JSON.stringify(adopted.error)).toBe('done');
    const { timings } = (await owner.get(`/api/samples/${adopted.id}/provenance`)).body;
    expect(Date.parse(timings.startedAt)).toBeLessThan(Date.parse(timings.uploadedAt));

    // The settings after the file: the job started with the defaults is not the sample's; it is dropped and the
    // sample queued as usual. Same file, same settings: the same counts.
    const queued = await owner.send('POST', '/api/samples/upload', {
      stream: slowForm([['studyId', String(studyId)], ['name', 'Queued'], ['force', 'true']], text, [['settings', settings]]),
    });
    expect(queued.status, queued.text).toBe(202);
    expect(queued.body.sample.state).toBe('queued');
    const usual = await waitForSample(owner, queued.body.sample.id, isFinished, 'the end of its job');
    expect(usual.state, JSON.stringify(usual.error)).toBe('done');
    expect(Date.parse(usual.provenance.timings.startedAt)).toBeGreaterThanOrEqual(Date.parse(usual.provenance.timings.uploadedAt));
    expect(usual.counts).toEqual(adopted.counts);
    expect(adopted.counts.jets).toBeGreaterThan(0);

    // A duplicate: its early job is stopped and its folder removed before the answer.
    const duplicate = await owner.send('POST', '/api/samples/upload', {
      stream: slowForm([['studyId', String(studyId)], ['name', 'Again'], ['settings', settings]], text),
    });
    expect(duplicate.status, duplicate.text).toBe(200);
    expect(duplicate.body.duplicateOf.id).toBe(usual.id); // the latest of the two in the study
    const left = storedFiles(server.storageDir);
    expect(left.uploads).toEqual([]);
    expect(left.samples.filter((name) => !/^\d+$/.test(name))).toEqual([]);
  });

  it("gives an early job's place up to a queued sample while its file is still arriving", async () => {
    const text = await slowEventsFile(200, 'held').text();
    let release!: () => void;
    const hold = new Promise<void>((resolve) => (release = resolve));
    const slow = owner.send('POST', '/api/samples/upload', {
      stream: slowForm([['studyId', String(studyId)], ['name', 'Slow upload']], text, [], hold),
    });
    // Its job has begun writing columns (into its own staging folder) while half the file is still to come.
    const deadline = Date.now() + 60_000;
    while (!storedFiles(server.storageDir).samples.some((name) => name.startsWith('.early-'))) {
      if (Date.now() > deadline) throw new Error('the early job never started');
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    // Another upload meanwhile is queued; the early job gives its place up, so this one does not wait for the slow one.
    const other = await uploadDone(owner, { studyId, name: 'Not held up', file: jetsFileText(100, 77) });
    expect(other.counts.records).toBe(100);
    release();
    const response = await slow;
    expect(response.status, response.text).toBe(202);
    expect(response.body.sample.state).toBe('queued');
    const held = await waitForSample(owner, response.body.sample.id, isFinished, 'the end of its job');
    expect(held.state, JSON.stringify(held.error)).toBe('done');
    expect(held.counts.records).toBe(200);
    expect(storedFiles(server.storageDir).samples.filter((name) => name.includes('early-'))).toEqual([]);
  });

  it('takes uploads from several users at once without "database is locked"', async () => {
    const people = await Promise.all(Array.from({ length: 6 }, (_, k) => newPerson(server, `concurrent-${k}`)));
    for (const person of people) await addMember(owner, studyId, person.email, 'editor');
    const responses = await Promise.all(
      people.map((person, k) => upload(person.client, { studyId, name: `Concurrent ${k}`, file: jetsFileText(200, 900 + k) })),
    );
    expect(responses.map((response) => response.status)).toEqual(people.map(() => 202));
    const finished = await Promise.all(
      responses.map((response) => waitForSample(owner, response.body.sample.id, isFinished, 'the end of its job')),
    );
    expect(finished.map((sample) => sample.state)).toEqual(people.map(() => 'done'));
    expect(server.output()).not.toMatch(/database is locked|SQLITE_BUSY/);
  });
});

describe('a server killed during a job', () => {
  let server: TestServer;
  let admin: Client;
  let studyId: number;

  /** Kills the server with SIGKILL and starts it again on the same storage. */
  async function killAndRestart(): Promise<void> {
    await server.kill();
    server = await startTestServer({ storageOf: server });
    admin = await signIn(server.baseUrl, server.credentials.admin.email, server.credentials.admin.password);
  }

  beforeAll(async () => {
    server = await startTestServer();
    admin = await signIn(server.baseUrl, server.credentials.admin.email, server.credentials.admin.password);
    studyId = await newStudy(admin, 'Crash study');
  });
  afterAll(() => server?.stop());

  it('requeues the job at the next start, which then completes with nothing half-written left', async () => {
    const made = await upload(admin, { studyId, name: 'Survivor', file: slowEventsFile(SLOW_EVENTS, 'd') });
    const id = made.body.sample.id;
    await waitForSample(admin, id, isRunningWithProgress, 'running with progress');
    await killAndRestart();

    const done = await waitForSample(admin, id, isFinished, 'the end of its job');
    expect(done.state).toBe('done');
    expect(done.counts.records).toBe(SLOW_EVENTS);
    expect(server.output()).toMatch(new RegExp(`requeued interrupted samples ${id}\\b`));
    expect(filesOf(server, id)).toEqual([String(id)]);
    expect(storedFiles(server.storageDir).samples.filter((name) => name.startsWith('.'))).toEqual([]);
    expect(storedFiles(server.storageDir).uploads).toEqual([]);
    expect((await admin.get(`/api/samples/${id}/plane`)).status).toBe(200);
  });

  it('marks a job failed, with the reason, once stops have cut it short twice', async () => {
    const made = await upload(admin, { studyId, name: 'Twice unlucky', file: slowEventsFile(SLOW_EVENTS, 'e') });
    const id = made.body.sample.id;
    await waitForSample(admin, id, isRunningWithProgress, 'running with progress');
    await killAndRestart();
    await waitForSample(admin, id, isRunningWithProgress, 'running again with progress');
    await killAndRestart();

    const failed = (await admin.get(`/api/samples/${id}`)).body.sample;
    expect(failed.state).toBe('failed');
    expect(failed.error).toMatchObject({
      code: 'interrupted',
      message: expect.stringMatching(/cut short by a stop of the server 2 times/),
      explanation: expect.stringMatching(/Upload the file again/),
    });
    expect(filesOf(server, id)).toEqual([]);
    expect(storedFiles(server.storageDir).uploads).toEqual([]);
  });
});
