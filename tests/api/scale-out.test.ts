// The scaled mode end to end: redis-server, the fake S3 server and two `splitfield worker` processes started by
// the project's scripts, a web server in queue mode on that bucket, and a web server in the embedded mode as the
// reference. A file cut into several shards must give the embedded mode's sample byte for byte.
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readS3Settings } from '@/lib/objects/config';
import { LocalObjectStore } from '@/lib/objects/local-store';
import { readObjectBytes } from '@/lib/objects/object-store';
import { S3ObjectStore } from '@/lib/objects/s3-store';
import { planShards } from '@/lib/scale/shard-plan';
import { type ColumnarRecord, writeParquet } from '@/tests/support/columnar-files';
import { generateEvents } from '@/tests/support/test-events';
import { type FakeS3, type Redis, scaledEnv, type Service, startFakeS3, startRedis, startWorker } from '../support/scale-services';
import type { Client, TestServer } from '../support/server';
import { HEADER, hepmc3Text } from '../unit/ingest/helpers';
import { newPerson, newStudy, serverWithAdmin } from './fixtures';
import { isFinished, jetsFileText, storedFiles, upload, uploadDone, waitForSample } from './sample-fixtures';

/** Small shards, so that test files of a few hundred kB are cut into several. */
const SHARD_BYTES = 64 * 1024;

let fake: FakeS3;
let redis: Redis;
let workers: Service[] = [];
let scaled: TestServer;
let embedded: TestServer;
let store: S3ObjectStore;
const people: Record<'scaled' | 'embedded', { client: Client; studyId: number }> = {} as never;

function env(): Record<string, string> {
  return { ...scaledEnv(fake, redis, SHARD_BYTES), SPLITFIELD_MAX_JOBS: '2' };
}

beforeAll(async () => {
  [fake, redis] = await Promise.all([startFakeS3(), startRedis()]);
  store = new S3ObjectStore(readS3Settings(fake.env)!);
  workers = await Promise.all(['w1', 'w2'].map((name) => startWorker(env(), name)));
  ({ server: scaled } = await serverWithAdmin({ env: env(), demoJets: 200 }));
  ({ server: embedded } = await serverWithAdmin({ env: { SPLITFIELD_JOB_THREADS: '1' }, demoJets: 200 }));
  for (const [mode, server] of [['scaled', scaled], ['embedded', embedded]] as const) {
    const person = await newPerson(server, 'analyst');
    people[mode] = { client: person.client, studyId: await newStudy(person.client, 'Scale study') };
  }
});
afterAll(async () => {
  await Promise.all([scaled?.stop(), embedded?.stop(), ...workers.map((worker) => worker.stop())]);
  await Promise.all([redis?.stop(), fake?.stop()]);
});

/** A jets file where every third record has no id (its id is then its line number, which shards must keep). */
function jetsWithoutSomeIds(count: number, seed: number): string {
  let k = 0;
  return jetsFileText(count, seed).replace(/^\{"id":"[^"]*",/gm, (match) => (k++ % 3 === 0 ? '{' : match));
}

/** Retries an assertion for a few seconds (work that other processes finish after the sample has ended). */
async function expectEventually(check: () => Promise<void>): Promise<void> {
  const deadline = Date.now() + 10_000;
  for (;;) {
    try {
      return await check();
    } catch (error) {
      if (Date.now() > deadline) throw error;
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
  }
}

async function bucketFiles(folder: number): Promise<Map<string, Buffer>> {
  const prefix = `samples/${folder}/`;
  const files = new Map<string, Buffer>();
  for (const key of await store.list(prefix)) files.set(key.slice(prefix.length), await readObjectBytes(store, key));
  return files;
}

function folderFiles(dir: string): Map<string, Buffer> {
  return new Map(readdirSync(dir).map((name) => [name, readFileSync(path.join(dir, name))]));
}

/** A Parquet file (lists layout, no id column: ids are rows) of `events` in row groups of 4, and its shard count. */
async function parquetEvents(events: Float64Array[], name: string): Promise<{ file: Blob; shards: number }> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'sf-scale-parquet-'));
  const records: ColumnarRecord[] = events.map((particles, k) => ({ id: `e${k}`, weight: 1 + k / 8, particles }));
  writeParquet(path.join(dir, name), { ...HEADER, content: 'events' }, records, { layout: 'lists', rowGroupSize: 4, noIds: true });
  const bytes = readFileSync(path.join(dir, name));
  const plan = await planShards(new LocalObjectStore(dir), name, bytes.length, SHARD_BYTES);
  return { file: new Blob([bytes]), shards: plan.kind === 'rowGroups' ? plan.shards.length : 1 };
}

async function both(file: string | Blob, fileName: string, settings?: object) {
  const fields = settings ? { settings: JSON.stringify(settings) } : undefined;
  const [inQueue, here] = await Promise.all(
    (['scaled', 'embedded'] as const).map((mode) => uploadDone(people[mode].client, { studyId: people[mode].studyId, file, fileName, fields })),
  );
  return { inQueue, here };
}

async function expectSameSample(inQueue: { id: number }, here: { id: number }) {
  const expected = folderFiles(path.join(embedded.storageDir, 'samples', String(here.id)));
  const actual = await bucketFiles(inQueue.id);
  expect([...actual.keys()].sort()).toEqual([...expected.keys()].sort());
  for (const [name, bytes] of expected) expect(actual.get(name)!.equals(bytes), `${name} differs`).toBe(true);
  for (const horizontal of ['lnInvDelta', 'lnRoverDelta']) {
    const [a, b] = await Promise.all([
      people.scaled.client.get(`/api/samples/${inQueue.id}/plane?horizontal=${horizontal}`),
      people.embedded.client.get(`/api/samples/${here.id}/plane?horizontal=${horizontal}`),
    ]);
    expect(a.status, a.text).toBe(200);
    expect(a.text).toBe(b.text);
  }
  const [a, b] = await Promise.all([
    people.scaled.client.get(`/api/samples/${inQueue.id}`),
    people.embedded.client.get(`/api/samples/${here.id}`),
  ]);
  expect(a.body.sample.counts).toEqual(b.body.sample.counts);
  expect(a.body.sample.input).toEqual(b.body.sample.input);
}

describe('scaled mode: queue, shards, bucket', () => {
  it('cuts a JSON Lines file into shards on two workers and stores the embedded mode\'s sample byte for byte', async () => {
    const text = jetsWithoutSomeIds(1500, 14);
    expect(text.length).toBeGreaterThan(4 * SHARD_BYTES);
    const { inQueue, here } = await both(text, 'jets.jsonl');
    await expectSameSample(inQueue, here);
    // The web server keeps no upload and no sample folder of its own; the bucket keeps no upload or work objects.
    expect(storedFiles(scaled.storageDir)).toEqual({ uploads: [], samples: [] });
    expect(await store.list('uploads/')).toEqual([]);
    expect(await store.list('work/')).toEqual([]);
    // Exports stream from the bucket's columns: the same lines as the embedded mode's.
    const [a, b] = await Promise.all([
      people.scaled.client.get(`/api/samples/${inQueue.id}/export`),
      people.embedded.client.get(`/api/samples/${here.id}/export`),
    ]);
    expect(a.status).toBe(200);
    expect(a.text.split('\n').slice(1)).toEqual(b.text.split('\n').slice(1));
  });

  it('cuts HepMC3 events and the full tree the same way', async () => {
    const events = generateEvents(15, 60, { nParticles: 300 });
    const { inQueue, here } = await both(hepmc3Text(events), 'events.hepmc', { fullTree: true });
    await expectSameSample(inQueue, here);
  });

  it('cuts a Parquet file between row groups and stores the embedded mode\'s sample byte for byte', async () => {
    const { file, shards } = await parquetEvents(generateEvents(41, 40, { nParticles: 300 }), 'events.parquet');
    expect(shards).toBeGreaterThan(2);
    const { inQueue, here } = await both(file, 'events.parquet');
    await expectSameSample(inQueue, here);
    expect(await store.list('work/')).toEqual([]);
  });

  it('names the same row group, row and column as the embedded mode for a bad value in a later Parquet shard', async () => {
    const events = generateEvents(43, 40, { nParticles: 300 });
    events[33][4 * 2 + 1] = Number.POSITIVE_INFINITY;
    const { file, shards } = await parquetEvents(events, 'bad.parquet');
    expect(shards).toBeGreaterThan(2);
    const ended = await Promise.all(
      (['scaled', 'embedded'] as const).map(async (mode) => {
        const response = await upload(people[mode].client, { studyId: people[mode].studyId, file, fileName: 'bad.parquet', name: 'Bad columns' });
        expect(response.status, response.text).toBe(202);
        return waitForSample(people[mode].client, response.body.sample.id, isFinished, 'the end of its job');
      }),
    );
    expect(ended[0].state).toBe('failed');
    expect(ended[0].error).toEqual(ended[1].error);
    expect(ended[0].error.message).toContain('row group 8, row 33, column py, particle 2: py is not a finite number: Infinity');
    expect(await store.list(`samples/${ended[0].id}/`)).toEqual([]);
    await expectEventually(async () => expect(await store.list('work/')).toEqual([]));
  });

  it('names the same line as the embedded mode for a bad record in a later shard, and keeps nothing', async () => {
    const lines = jetsWithoutSomeIds(1200, 16).split('\n');
    lines[1000] = lines[1000].replace('"particles":[[', '"particles":[["x",');
    const text = lines.join('\n');
    const ended = await Promise.all(
      (['scaled', 'embedded'] as const).map(async (mode) => {
        const response = await upload(people[mode].client, { studyId: people[mode].studyId, file: text, name: 'Bad' });
        expect(response.status, response.text).toBe(202);
        return waitForSample(people[mode].client, response.body.sample.id, isFinished, 'the end of its job');
      }),
    );
    expect(ended[0].state).toBe('failed');
    expect(ended[0].error).toEqual(ended[1].error);
    expect(ended[0].error.line).toBe(1001);
    expect(await store.list(`samples/${ended[0].id}/`)).toEqual([]);
    // Shards still under way when the run failed stop, and remove what they publish after.
    await expectEventually(async () => expect(await store.list('work/')).toEqual([]));
  });

  it('keeps files in the bucket without the queue too: jobs run on the web server, columns go to the bucket', async () => {
    const bucketOnly = await serverWithAdmin({ env: { ...fake.env, SPLITFIELD_S3_PREFIX: 'bucket-only/', SPLITFIELD_JOB_THREADS: '1' }, demoJets: 200 });
    try {
      const own = new S3ObjectStore(readS3Settings({ ...fake.env, SPLITFIELD_S3_PREFIX: 'bucket-only/' })!);
      const studyId = await newStudy(bucketOnly.admin, 'Bucket study');
      const text = jetsWithoutSomeIds(300, 18);
      const [inBucket, here] = await Promise.all([
        uploadDone(bucketOnly.admin, { studyId, file: text }),
        uploadDone(people.embedded.client, { studyId: people.embedded.studyId, file: text, name: 'Reference' }),
      ]);
      const expected = folderFiles(path.join(embedded.storageDir, 'samples', String(here.id)));
      for (const [name, bytes] of expected) {
        expect((await readObjectBytes(own, `samples/${inBucket.id}/${name}`)).equals(bytes), `${name} differs`).toBe(true);
      }
      // The demo samples (written into uploads/ by the first start) are processed too before storage is looked at.
      for (const demo of [1, 2]) expect((await waitForSample(bucketOnly.admin, demo, isFinished, 'the end of its job')).state).toBe('done');
      expect(storedFiles(bucketOnly.server.storageDir)).toEqual({ uploads: [], samples: [] });
      expect(await own.list('uploads/')).toEqual([]);
      expect((await bucketOnly.admin.get(`/api/samples/${inBucket.id}/jets?limit=5`)).body.total).toBe(here.counts.jets);
      expect((await bucketOnly.admin.send('DELETE', `/api/samples/${inBucket.id}`)).status).toBe(204);
      expect(await own.list(`samples/${inBucket.id}/`)).toEqual([]);
    } finally {
      await bucketOnly.server.stop();
    }
  });

  it('deletes the objects of a deleted sample', async () => {
    const sample = await uploadDone(people.scaled.client, { studyId: people.scaled.studyId, file: jetsFileText(50, 17), name: 'To delete' });
    expect((await store.list(`samples/${sample.id}/`)).length).toBeGreaterThan(0);
    const response = await people.scaled.client.send('DELETE', `/api/samples/${sample.id}`);
    expect(response.status).toBe(204);
    expect(await store.list(`samples/${sample.id}/`)).toEqual([]);
  });
});
