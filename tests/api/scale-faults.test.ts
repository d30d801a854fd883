// Faults of the scaled mode, on real processes: a worker killed in the middle of a shard, Redis restarted during
// a job, and the bucket refusing a write. A clean run of the same file on the same servers is the reference.
import { existsSync, readdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readS3Settings } from '@/lib/objects/config';
import { readObjectBytes } from '@/lib/objects/object-store';
import { S3ObjectStore } from '@/lib/objects/s3-store';
import { type FakeS3, type Redis, scaledEnv, type Service, startFakeS3, startRedis, startWorker } from '../support/scale-services';
import { type Client, signIn, startTestServer, type TestServer } from '../support/server';
import { newStudy, serverWithAdmin } from './fixtures';
import { isFinished, jetsFileText, upload, uploadDone, waitForSample } from './sample-fixtures';

const SHARD_BYTES = 64 * 1024;

let fake: FakeS3;
let redis: Redis;
const workers = new Map<string, Service>();
let server: TestServer;
let admin: Client;
let studyId: number;
let store: S3ObjectStore;
let reference: Map<string, Buffer>;
const text = jetsFileText(2500, 21);

function env(): Record<string, string> {
  return scaledEnv(fake, redis, SHARD_BYTES);
}

async function addWorker(name: string): Promise<void> {
  workers.set(name, await startWorker(env(), name));
}

async function objects(folder: number): Promise<Map<string, Buffer>> {
  const prefix = `samples/${folder}/`;
  const files = new Map<string, Buffer>();
  for (const key of await store.list(prefix)) files.set(key.slice(prefix.length), await readObjectBytes(store, key));
  return files;
}

function expectSameFiles(actual: Map<string, Buffer>, expected: Map<string, Buffer>): void {
  expect([...actual.keys()].sort()).toEqual([...expected.keys()].sort());
  for (const [name, bytes] of expected) expect(actual.get(name)!.equals(bytes), `${name} differs`).toBe(true);
}

/** Uploads the file again (forced past the duplicate check) and returns the queued sample's id. */
async function queueAgain(name: string): Promise<number> {
  const response = await upload(admin, { studyId, file: text, name, fields: { force: '1' } });
  expect(response.status, response.text).toBe(202);
  return response.body.sample.id;
}

/** Waits until the admin page lists a running shard job of the sample; returns the worker working on it. */
async function runningShardWorker(sampleId: number): Promise<string> {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    const overview = (await admin.get('/api/admin/processing')).body;
    const job = overview.running.find((j: { kind: string; sampleId: number; worker: string | null }) => j.kind === 'shard' && j.sampleId === sampleId && j.worker);
    if (job) return job.worker;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`no shard of sample ${sampleId} started`);
}

beforeAll(async () => {
  [fake, redis] = await Promise.all([startFakeS3(), startRedis()]);
  store = new S3ObjectStore(readS3Settings(fake.env)!);
  await Promise.all(['w1', 'w2'].map(addWorker));
  ({ server, admin } = await serverWithAdmin({ env: env(), demoJets: 200 }));
  // The demo samples of the first start go through the queue too.
  for (const id of [1, 2]) {
    const demo = await waitForSample(admin, id, isFinished, 'the end of its job');
    expect(demo.state, `${JSON.stringify(demo.error)}\n${server.output().split('\n').filter((line) => line.includes('[queue]')).join('\n')}`).toBe('done');
  }
  studyId = await newStudy(admin, 'Fault study');
  const clean = await uploadDone(admin, { studyId, file: text, name: 'Clean run' });
  reference = await objects(clean.id);
});
afterAll(async () => {
  await Promise.all([server?.stop(), ...[...workers.values()].map((worker) => worker.stop())]);
  await Promise.all([redis?.stop(), fake?.stop()]);
});

describe('scaled mode under faults', () => {
  it('retries the shard of a worker killed mid-shard on another worker: nothing lost, nothing stored twice', async () => {
    const id = await queueAgain('Worker killed');
    const victim = await runningShardWorker(id);
    workers.get(victim)!.process.kill('SIGKILL');
    workers.delete(victim);
    const sample = await waitForSample(admin, id, isFinished, 'the end of its job');
    expect(sample.state, JSON.stringify(sample.error)).toBe('done');
    expectSameFiles(await objects(id), reference);
    expect(await store.list('work/')).toEqual([]);
    await addWorker(`${victim}-again`);
  });

  it('carries a job on across a restart of Redis', async () => {
    const id = await queueAgain('Redis restarted');
    await runningShardWorker(id);
    await redis.stop();
    await new Promise((resolve) => setTimeout(resolve, 1000));
    await redis.restart();
    const sample = await waitForSample(admin, id, isFinished, 'the end of its job');
    expect(sample.state, JSON.stringify(sample.error)).toBe('done');
    expectSameFiles(await objects(id), reference);
  });

  it('follows a run still in the queue after the web server is killed and started again', async () => {
    const id = await queueAgain('Server restarted');
    await runningShardWorker(id);
    await server.kill();
    server = await startTestServer({ storageOf: server, env: env() });
    admin = await signIn(server.baseUrl, server.credentials.admin.email, server.credentials.admin.password);
    const sample = await waitForSample(admin, id, isFinished, 'the end of its job');
    expect(sample.state, JSON.stringify(sample.error)).toBe('done');
    expectSameFiles(await objects(id), reference);
  });

  it('fails the sample clearly when the bucket refuses a write, and leaves no half sample', { timeout: 180_000 }, async () => {
    const response = await upload(admin, { studyId, file: jetsFileText(400, 22), name: 'Refused write' });
    expect(response.status, response.text).toBe(202);
    const id = response.body.sample.id as number;
    // The fake server keeps a key's objects under folders named by its parts: a file in the way of the sample's
    // folder makes it refuse (HTTP 500) every write of the sample's columns, while uploads and shards still work.
    writeFileSync(path.join(fake.directory, fake.bucket, 'samples', String(id)), '');
    const sample = await waitForSample(admin, id, isFinished, 'the end of its job');
    expect(sample.state).toBe('failed');
    expect(sample.error.message).toMatch(new RegExp(`cannot write samples/${id}/\\S+ to s3://${fake.bucket}/`));
    expect(await store.list(`samples/${id}/`)).toEqual([]);
    expect(await store.list('work/')).toEqual([]);
    expect(await store.list('uploads/')).toEqual([]);
    const cache = path.join(server.storageDir, 'cache');
    expect(existsSync(cache) ? readdirSync(cache) : []).not.toContain(String(id));
    const jets = await admin.get(`/api/samples/${id}/jets`);
    expect(jets.status).toBe(409);
  });
});
