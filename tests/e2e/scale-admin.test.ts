// The admin page of processing in the scaled mode, in a browser: queue counts, a running shard with its worker,
// and a failed shard with its reason (a bad record), on redis-server, the fake S3 server and one worker.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jetsFileText, upload, waitForSample, isFinished } from '../api/sample-fixtures';
import { type FakeS3, type Redis, scaledEnv, type Service, startFakeS3, startRedis, startWorker } from '../support/scale-services';
import { type Client, signIn, startTestServer, type TestServer } from '../support/server';
import { type BrowserSession, cspViolations, openBrowser, screenshot, signInThroughPage } from './browser';

let fake: FakeS3;
let redis: Redis;
let worker: Service;
let server: TestServer;
let admin: Client;
let browser: BrowserSession;

beforeAll(async () => {
  [fake, redis] = await Promise.all([startFakeS3(), startRedis()]);
  const env = scaledEnv(fake, redis, 32 * 1024);
  worker = await startWorker(env, 'lab-node-1');
  server = await startTestServer({ env, demoJets: 200 });
  const { email, password } = server.credentials.admin;
  admin = await signIn(server.baseUrl, email, password);
  browser = await openBrowser();
  await signInThroughPage(browser.page, server.baseUrl, email, password);
});
afterAll(async () => {
  await browser?.close();
  await Promise.all([server?.stop(), worker?.stop()]);
  await Promise.all([redis?.stop(), fake?.stop()]);
});

describe('admin processing page, scaled mode', () => {
  it('shows the queue, the running shard and its worker, then a failed shard with its reason', async () => {
    const lines = jetsFileText(600, 31).split('\n');
    lines[500] = lines[500].replace('"weight":1', '"weight":"heavy"');
    const bad = await upload(admin, { studyId: 1, file: lines.join('\n'), name: 'Bad weight' });
    expect(bad.status, bad.text).toBe(202);
    const big = await upload(admin, { studyId: 1, file: jetsFileText(3000, 32), name: 'Large sample' });
    expect(big.status, big.text).toBe(202);

    const { page } = browser;
    await page.goto(`${server.baseUrl}/admin/processing`);
    await page.getByText('Scaled mode: jobs go through the Redis queue').waitFor();
    const running = page.getByRole('region', { name: 'Running jobs' });
    await running.locator('tr', { hasText: /shard \d+/ }).filter({ hasText: 'lab-node-1' }).first().waitFor({ timeout: 60_000 });
    await screenshot(page, 'scale-admin-running', 1280);

    const ended = await waitForSample(admin, bad.body.sample.id, isFinished, 'the end of its job');
    expect(ended.state).toBe('failed');
    const failed = page.getByRole('region', { name: 'Failed shards' });
    await failed.getByText(/"weight" must be a finite number|weight/).first().waitFor({ timeout: 10_000 });
    await failed.getByRole('link', { name: `sample ${bad.body.sample.id}` }).waitFor();
    expect((await waitForSample(admin, big.body.sample.id, isFinished, 'the end of its job')).state).toBe('done');
    await screenshot(page, 'scale-admin-failed', 1280);
    await screenshot(page, 'scale-admin-narrow', 390);
  });

  it('met no Content-Security-Policy violation', () => {
    expect(cspViolations).toEqual([]);
  });
});
