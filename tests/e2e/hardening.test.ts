// What a browser does with Splitfield's defences and the fixes a new user asked for: a form served from another
// origin (another port of the same host) cannot change anything; Markdown images are links, never loaded; the
// sign-in form says when to try again after too many failures; sessions end on the server; the narrow menu closes
// on Escape; the admin's own row offers no "Disable"; the upload bar shows what its text says.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { Client, postSignIn, signIn, startTestServer, type TestServer } from '../support/server';
import { openBrowser, screenshot, signInThroughPage, submitSignIn, type BrowserSession } from './browser';

let server: TestServer;
let other: http.Server;
let otherOrigin = '';
/** Paths the other origin was asked for (the pixel of a Markdown image would appear here). */
const otherHits: string[] = [];
let owner: BrowserSession;
let ownerApi: Client;

function demoAccount(studyRole: 'owner' | 'commenter') {
  const account = server.credentials.members.find((member) => member.studyRole === studyRole);
  if (!account) throw new Error(`no demo member with the ${studyRole} role`);
  return account;
}

/** Pages another site would serve: auto-submitting forms aimed at Splitfield's API. */
function attackerPage(pathname: string): string {
  const target = `${server.baseUrl}/api/studies/1/entries`;
  if (pathname === '/note-form') {
    // text/plain forms send "name=value": this name and value make the body a valid JSON note.
    return `<form id="f" method="POST" action="${target}" enctype="text/plain">
      <input name='{"kind":"note","title":"' value='","body":"planted from another origin"}'>
    </form><script>document.getElementById('f').submit()</script>`;
  }
  if (pathname === '/upload-form') {
    return `<form id="f" method="POST" action="${server.baseUrl}/api/samples/upload" enctype="multipart/form-data">
      <input name="studyId" value="1"><input name="name" value="planted sample">
    </form><script>document.getElementById('f').submit()</script>`;
  }
  return `<script>fetch(${JSON.stringify(target)}, { method: 'POST', mode: 'no-cors', credentials: 'include',
    headers: { 'content-type': 'text/plain' }, body: JSON.stringify({ kind: 'note', body: 'planted by fetch' }) })
    .finally(() => { document.title = 'sent'; });</script>`;
}

beforeAll(async () => {
  server = await startTestServer();
  other = http.createServer((request, response) => {
    otherHits.push(request.url ?? '');
    response.writeHead(200, { 'content-type': 'text/html' });
    response.end(`<!doctype html><html><body>${attackerPage(request.url ?? '/')}</body></html>`);
  });
  await new Promise<void>((resolve) => other.listen(0, '127.0.0.1', resolve));
  otherOrigin = `http://127.0.0.1:${(other.address() as AddressInfo).port}`;
  const { email, password } = demoAccount('owner');
  owner = await openBrowser();
  await signInThroughPage(owner.page, server.baseUrl, email, password);
  ownerApi = await signIn(server.baseUrl, email, password);
});

afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  if (owner) await screenshot(owner.page, `failed-hardening-${task.name.replace(/\W+/g, '-')}`, 1280);
  console.error(server?.output().slice(-4000));
});

afterAll(async () => {
  await owner?.close();
  await new Promise((resolve) => other?.close(resolve));
  await server?.stop();
});

async function noteBodies(): Promise<string[]> {
  const entries = await ownerApi.get('/api/studies/1/entries');
  expect(entries.status).toBe(200);
  return entries.body.entries.map((entry: { body: string }) => entry.body);
}

describe('defences in a browser', () => {
  it('lets no form or script served from another port change anything', async () => {
    const { page } = owner;
    const before = await noteBodies();
    const samplesBefore = (await ownerApi.get('/api/samples?studyId=1')).body.samples.length;
    for (const pathname of ['/note-form', '/upload-form']) {
      const answer = page.waitForResponse((response) => response.url().startsWith(server.baseUrl) && response.request().method() === 'POST');
      await page.goto(`${otherOrigin}${pathname}`);
      expect((await answer).status(), pathname).toBe(403);
    }
    await page.goto(`${otherOrigin}/fetch`);
    await page.waitForFunction(() => document.title === 'sent');
    expect(await noteBodies()).toEqual(before);
    expect((await ownerApi.get('/api/samples?studyId=1')).body.samples.length).toBe(samplesBefore);
  });

  it('shows a Markdown image as a link and never loads it', async () => {
    const { page } = owner;
    const pixel = `${otherOrigin}/pixel.png`;
    const made = await ownerApi.post('/api/studies/1/entries', { kind: 'note', title: 'Pixel', body: `Look: ![tracking pixel](${pixel})` });
    expect(made.status).toBe(201);
    await page.goto(`${server.baseUrl}/studies/1`);
    const link = page.getByRole('link', { name: 'Image: tracking pixel' });
    await link.waitFor();
    expect(await link.getAttribute('href')).toBe(pixel);
    expect(await page.locator('.note-body img').count()).toBe(0);
    expect(otherHits).not.toContain('/pixel.png');
  });

  it('says on the sign-in form when to try again after too many failures', async () => {
    const { email } = demoAccount('commenter');
    for (let i = 0; i < 10; i++) expect((await postSignIn(new Client(server.baseUrl), email, `wrong-${i}`)).status).toBe(401);
    const visitor = await openBrowser(390);
    try {
      await submitSignIn(visitor.page, server.baseUrl, email, demoAccount('commenter').password);
      const alert = visitor.page.getByRole('form', { name: 'Sign in' }).getByRole('alert');
      await alert.waitFor();
      expect(await alert.textContent()).toMatch(/Too many failed sign-in attempts\. Try again in \d+ (minutes|seconds)\./);
      expect(new URL(visitor.page.url()).pathname).toBe('/sign-in');
      await screenshot(visitor.page, 'sign-in-throttled-390', 390);
    } finally {
      await visitor.close();
    }
  });
});

describe('sessions and screens', () => {
  it('ends the other sessions on a password change, says so, and signs out everywhere', async () => {
    const person = { name: 'Profile person', email: 'profile@hardening.test', password: 'profile-password-1' };
    expect((await new Client(server.baseUrl).post('/api/signup', person)).status).toBe(201);
    const elsewhere = await signIn(server.baseUrl, person.email, person.password);
    const session = await openBrowser();
    try {
      const { page } = session;
      await signInThroughPage(page, server.baseUrl, person.email, person.password);
      await page.goto(`${server.baseUrl}/profile`);
      const form = page.getByRole('form', { name: 'Password' });
      await form.getByLabel('Current password').fill(person.password);
      await form.getByLabel('New password', { exact: true }).fill('profile-password-2');
      await form.getByLabel('New password again').fill('profile-password-2');
      await form.getByRole('button', { name: 'Change password' }).click();
      await page.getByText('Password changed: 1 other session was signed out, and 0 API tokens were revoked.').waitFor();
      expect((await elsewhere.get('/api/me')).status).toBe(401);
      await screenshot(page, 'profile-sessions-1280', 1280);

      const copied = session.context.cookies();
      await page.getByRole('button', { name: 'Sign out everywhere' }).click();
      await page.getByRole('button', { name: 'Sign out everywhere' }).last().click();
      await page.waitForURL(/\/sign-in/);
      const cookie = (await copied).map(({ name, value }) => `${name}=${value}`).join('; ');
      const replay = await new Client(server.baseUrl).send('GET', '/api/me', { headers: { cookie } });
      expect(replay.status).toBe(401);
    } finally {
      await session.close();
    }
  });

  it('closes the narrow menu on Escape and gives the focus back to its button', async () => {
    const { page } = owner;
    await page.setViewportSize({ width: 390, height: 800 });
    await page.goto(`${server.baseUrl}/studies`);
    const button = page.getByRole('button', { name: 'Menu' });
    await button.click();
    await page.locator('#top-menu').waitFor();
    await page.keyboard.press('Escape');
    await page.locator('#top-menu').waitFor({ state: 'detached' });
    expect(await button.evaluate((element) => element === document.activeElement)).toBe(true);
    await page.setViewportSize({ width: 1280, height: 900 });
  });

  it('offers the admin no "Disable" on their own row', async () => {
    const admin = await openBrowser();
    try {
      const { email, password, name } = server.credentials.admin;
      await signInThroughPage(admin.page, server.baseUrl, email, password);
      await admin.page.goto(`${server.baseUrl}/admin/users`);
      const own = admin.page.getByRole('listitem', { name });
      await own.waitFor();
      expect(await own.getByRole('button', { name: /Disable/ }).count()).toBe(0);
      expect(await own.getByRole('combobox').isDisabled()).toBe(true);
      const others = admin.page.getByRole('button', { name: /^Disable / });
      expect(await others.count()).toBeGreaterThan(0);
      await screenshot(admin.page, 'admin-users-own-row-1280', 1280);
    } finally {
      await admin.close();
    }
  });

  it('fills the upload bar as far as its text says', async () => {
    const { page } = owner;
    await page.goto(`${server.baseUrl}/samples/new?studyId=1`);
    const form = page.getByRole('form', { name: 'Upload a sample' });
    const header = JSON.stringify({ format: 'splitfield-particles', version: 1, content: 'jets' });
    const line = JSON.stringify({ particles: [[10, 0, 5, 12], [0, 8, -2, 9]] });
    await form.getByLabel('Particle file').setInputFiles({
      name: 'bar.jsonl',
      mimeType: 'application/json',
      buffer: Buffer.from(`${header}\n${`${line}\n`.repeat(60_000)}`),
    });
    await form.getByLabel('Sample name').fill('Bar check');
    // A slow line (about 400 kB/s up) makes the transfer last seconds; meanwhile the bar's filled share and the
    // percentage beside it are read together in one frame, again and again.
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: 400 * 1024 });
    await form.getByRole('button', { name: 'Upload and process' }).click();
    const readings = await page.evaluate(async () => {
      const seen: Array<{ text: number; bar: number }> = [];
      const deadline = performance.now() + 20_000;
      while (performance.now() < deadline) {
        await new Promise((resolve) => requestAnimationFrame(resolve));
        const bar = document.querySelector('[role="progressbar"][aria-label="Upload progress"]');
        if (!bar) {
          if (seen.length > 0) break;
          continue;
        }
        const text = /· (\d+) %/.exec(bar.parentElement?.textContent ?? '');
        const inner = bar.firstElementChild as HTMLElement;
        if (text) seen.push({ text: Number(text[1]), bar: (100 * inner.getBoundingClientRect().width) / bar.getBoundingClientRect().width });
      }
      return seen;
    });
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    const moving = readings.filter((reading) => reading.text > 0 && reading.text < 100);
    expect(moving.length).toBeGreaterThan(10);
    for (const reading of readings) expect(Math.abs(reading.bar - reading.text), JSON.stringify(reading)).toBeLessThanOrEqual(1.5);
    await page.waitForURL(/\/samples\/\d+$/);
  });
});
