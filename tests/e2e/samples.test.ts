// Samples as a person uses them, in a real browser against a real server, database and job runner: an editor
// uploads a generated file through the file picker, watches it processed, reads its counts, plane and jets,
// meets the duplicate offer, deletes a copy, sees why a broken file failed; a script lists samples with an API
// token from the profile; a viewer gets no upload or delete controls. Screenshots go to tests/artifacts/.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { writeGeneratedSampleFile } from '@/lib/ingest/generated-sample-file';
import { demoSampleSpec } from '@/lib/demo/scenario';
import { addMember, newPerson, newStudy, type Person } from '../api/fixtures';
import { startTestServer, type TestServer } from '../support/server';
import { cspViolations, openBrowser, screenshot, signInThroughPage, type BrowserSession } from './browser';

const JETS = 60;
const SPEC = demoSampleSpec('gluon');
const STUDY_TITLE = 'Gluon jets, granularity check';
/** The bins Plot's rect marks draw inside the figure's plot (the first rect mark holds masked bins, none on a map). */
const BINS = 'figure svg g[aria-label="rect"] rect';

let server: TestServer;
let folder: string;
let sampleFile: string;
let owner: Person;
let editor: Person;
let viewer: Person;
let studyId: number;
let browser: BrowserSession;
let samplePath = '';

/** The panel (a labelled section) of this title. */
function panel(page: Page, title: string) {
  return page.getByRole('region', { name: title, exact: true });
}

/** Waits until the sample page shows this state in its heading. */
async function waitForState(page: Page, state: string) {
  await page.locator(`h1 [data-state="${state}"]`).waitFor({ timeout: 60_000 });
}

/** Sends a file to the upload route as a script would, with the session of `person`. */
async function uploadByApi(person: Person, fileName: string, text: string, name: string) {
  const form = new FormData();
  form.append('studyId', String(studyId));
  form.append('name', name);
  form.append('file', new Blob([text]), fileName);
  const cookie = person.client.cookieList().map(({ name: key, value }) => `${key}=${value}`).join('; ');
  const response = await fetch(`${server.baseUrl}/api/samples/upload`, { method: 'POST', headers: { cookie }, body: form });
  expect(response.status).toBe(202);
  return (await response.json()).sample.id as number;
}

beforeAll(async () => {
  server = await startTestServer();
  folder = mkdtempSync(path.join(os.tmpdir(), 'splitfield-e2e-samples-'));
  sampleFile = path.join(folder, 'gluon-check.jsonl');
  await writeGeneratedSampleFile(sampleFile, SPEC, JETS, 20240611);

  owner = await newPerson(server, 'owner');
  editor = await newPerson(server, 'editor');
  viewer = await newPerson(server, 'viewer');
  studyId = await newStudy(owner.client, STUDY_TITLE);
  await addMember(owner.client, studyId, editor.email, 'editor');
  await addMember(owner.client, studyId, viewer.email, 'viewer');
  browser = await openBrowser();
  await signInThroughPage(browser.page, server.baseUrl, editor.email, editor.password);
});

afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  if (browser) await screenshot(browser.page, `failed-samples-${task.name.replace(/\W+/g, '-')}`, 1280);
  console.error(server?.output().slice(-4000));
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
  if (folder) rmSync(folder, { recursive: true, force: true });
});

describe('samples in a browser', () => {
  it('starts an upload from the study page, with the study chosen and the form filled from the file', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/studies/${studyId}`);
    await panel(page, 'Samples').getByText('No samples in this study yet.').waitFor();
    await panel(page, 'Samples').getByRole('link', { name: 'Upload a sample' }).click();
    await page.waitForURL(`${server.baseUrl}/samples/new?studyId=${studyId}`);
    const form = page.getByRole('form', { name: 'Upload a sample' });
    await form.getByLabel('Study').waitFor();
    expect(await form.getByLabel('Study').inputValue()).toBe(String(studyId));

    await form.getByLabel('Particle file').setInputFiles(sampleFile);
    await expect.poll(() => form.getByLabel('Sample name').inputValue()).toBe(SPEC.name);
    expect(await form.getByLabel('Label').inputValue()).toBe(SPEC.label);
    expect(await form.getByLabel('Tags').inputValue()).toBe(SPEC.tags.join(', '));
    expect(await form.getByLabel('Jet radius R').inputValue()).toBe('0.4');

    // An obvious mistake is caught before the file is sent, beside its field, which takes the focus and is
    // marked invalid for screen readers; a missing name is named beside its own field.
    const radius = form.getByLabel('Jet radius R');
    await radius.fill('-1');
    await form.getByLabel('Sample name').fill('');
    await form.getByRole('button', { name: 'Upload and process' }).click();
    await expect.poll(() => radius.getAttribute('aria-invalid')).toBe('true');
    expect(await form.getByLabel('Sample name').getAttribute('aria-invalid')).toBe('true');
    const describedBy = async (label: string) => {
      const ids = (await form.getByLabel(label).getAttribute('aria-describedby'))!.split(' ');
      return page.locator(`[id="${ids[0]}"]`).textContent();
    };
    expect(await describedBy('Jet radius R')).toBe('Must be in (0, 10].');
    expect(await describedBy('Sample name')).toBe('Give the sample a name.');
    // The first field in the form with a problem has the focus.
    expect(await form.getByLabel('Sample name').evaluate((element) => element === document.activeElement)).toBe(true);
    expect(await form.getByRole('alert').textContent()).toContain('2 fields need attention');
    await screenshot(page, 'sample-upload-errors-1280', 1280);
    await radius.fill(String(SPEC.settings.R));
    await form.getByLabel('Sample name').fill(SPEC.name);
    await screenshot(page, 'sample-upload-1280', 1280);
    await screenshot(page, 'sample-upload-390', 390);
    await page.setViewportSize({ width: 1280, height: 900 });
  });

  it('sends the file and follows the processing until it is done', async () => {
    const { page } = browser;
    await page.getByRole('button', { name: 'Upload and process' }).click();
    await page.waitForURL(/\/samples\/\d+$/);
    samplePath = new URL(page.url()).pathname;
    await page.getByRole('heading', { level: 1, name: SPEC.name }).waitFor();
    await waitForState(page, 'done');

    const counts = panel(page, 'Counts');
    expect(await counts.getByText('Jets kept').locator('..').textContent()).toContain(String(JETS));
    expect(await counts.getByText('Records').first().locator('..').textContent()).toContain(String(JETS));
    const provenance = panel(page, 'Provenance');
    expect(await provenance.textContent()).toContain('gluon-check.jsonl');
    expect(await provenance.textContent()).toContain('anti-kt, R = 0.8');
    expect(await provenance.getByRole('link', { name: 'Download provenance (JSON)' }).getAttribute('href')).toMatch(/\/provenance$/);
  });

  it('draws the primary plane as a Map view and switches its coordinate and bins', async () => {
    const { page } = browser;
    const plane = panel(page, 'Primary plane');
    const bins = plane.locator(BINS);
    await bins.first().waitFor();
    expect(await plane.locator('figure').textContent()).toContain('splittings per jet per unit ln(1/Δ) per unit ln(kₜ/GeV)');
    const axisText = () => plane.locator('figure svg').last().textContent();
    expect(await axisText()).toContain('ln(1/Δ)');
    expect(await axisText()).toContain('ln(kₜ/GeV)');
    expect(await plane.getByTestId('outside-note').textContent()).toMatch(/per jet outside the shown range/);

    await plane.getByLabel('Horizontal', { exact: true }).selectOption('lnRoverDelta');
    await expect.poll(axisText).toContain('ln(R/Δ)');
    // Coarser bins: fewer rectangles.
    const fine = await bins.count();
    await plane.getByLabel('Horizontal bin size').fill('0.5');
    await plane.getByLabel('Vertical bin size').fill('0.5');
    await plane.getByRole('button', { name: 'Apply' }).click();
    await expect.poll(() => bins.count()).toBeLessThan(fine);
    await plane.getByLabel('Horizontal', { exact: true }).selectOption('lnInvDelta');
    await expect.poll(axisText).toContain('ln(1/Δ)');
  });

  it('pages through the jet table', async () => {
    const { page } = browser;
    const jets = panel(page, 'Jets');
    await jets.getByText(`Jets 1–25 of ${JETS}`).waitFor();
    expect(await jets.getByRole('row').count()).toBe(26);
    await jets.getByRole('button', { name: 'Next' }).click();
    await jets.getByText(`Jets 26–50 of ${JETS}`).waitFor();
    await jets.getByRole('button', { name: 'Next' }).click();
    await jets.getByText(`Jets 51–${JETS} of ${JETS}`).waitFor();
    expect(await jets.getByRole('button', { name: 'Next' }).isDisabled()).toBe(true);
    expect(await jets.getByRole('row').count()).toBe(JETS - 50 + 1);
    await jets.getByRole('button', { name: 'Previous' }).click();
    await jets.getByText(`Jets 26–50 of ${JETS}`).waitFor();

    await screenshot(page, 'sample-detail-1280', 1280);
    await screenshot(page, 'sample-detail-390', 390);
    await page.setViewportSize({ width: 1280, height: 900 });
  });

  it('offers the existing sample for the same dropped file, processes it again on request, and deletes the copy', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/samples/new?studyId=${studyId}`);
    const form = page.getByRole('form', { name: 'Upload a sample' });
    // This time the file is dropped on the page rather than picked.
    const dropped = await page.evaluateHandle(
      ({ text, name }) => {
        const transfer = new DataTransfer();
        transfer.items.add(new File([text], name));
        return transfer;
      },
      { text: readFileSync(sampleFile, 'utf8'), name: path.basename(sampleFile) },
    );
    await form.getByText('Drop a particle file here').dispatchEvent('drop', { dataTransfer: dropped });
    await expect.poll(() => form.getByLabel('Sample name').inputValue()).toBe(SPEC.name);
    await form.getByLabel('Jet radius R').fill(String(SPEC.settings.R));
    await form.getByRole('button', { name: 'Upload and process' }).click();
    const offer = form.getByRole('alert');
    await offer.getByText('This file was uploaded before').waitFor();
    expect(await offer.getByRole('link', { name: 'Open the existing sample' }).getAttribute('href')).toBe(samplePath);

    await offer.getByRole('button', { name: 'Process it again anyway' }).click();
    await page.waitForURL((url) => /\/samples\/\d+$/.test(url.pathname) && url.pathname !== samplePath);
    await waitForState(page, 'done');
    await page.getByRole('button', { name: 'Delete sample' }).click();
    await page.getByRole('button', { name: 'Delete', exact: true }).click();
    await page.waitForURL(`${server.baseUrl}/samples`);
    await page.getByRole('table', { name: 'Samples' }).waitFor();
    expect(await page.getByRole('table', { name: 'Samples' }).getByRole('link', { name: SPEC.name }).count()).toBe(1);
  });

  it('offers the example files for download on the upload page', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/samples/new?studyId=${studyId}`);
    const examples = panel(page, 'No file at hand?');
    for (const name of ['tallis-quark-jets.jsonl', 'tallis-dijet-events.jsonl.gz', 'tallis-dijet-events.hepmc3.gz']) {
      const [download] = await Promise.all([page.waitForEvent('download'), examples.getByRole('link', { name }).click()]);
      expect(download.suggestedFilename()).toBe(name);
      const saved = path.join(folder, `downloaded-${name}`);
      await download.saveAs(saved);
      expect(readFileSync(saved).equals(readFileSync(path.join(__dirname, '../../public/examples', name)))).toBe(true);
    }
    await screenshot(page, 'upload-examples-1280', 1280);
  });

  it('shows where a broken file went wrong and what that means', async () => {
    const { page } = browser;
    const header = JSON.stringify({ format: 'splitfield-particles', version: 1, content: 'jets', momentum: 'px,py,pz,E' });
    const good = JSON.stringify({ id: 'a', particles: [[10, 0, 1, 11]] });
    const bad = JSON.stringify({ id: 'b', particles: [[10, 0, 1, 11], [30, 0, 40, 20]] });
    const id = await uploadByApi(editor, 'broken.jsonl', [header, good, bad, ''].join('\n'), 'Broken on purpose');
    await page.goto(`${server.baseUrl}/samples/${id}`);
    await waitForState(page, 'failed');
    const failure = panel(page, 'Processing failed');
    expect(await failure.textContent()).toContain('At line 3 of the file');
    expect(await failure.textContent()).toContain('particle 1');
    expect(await failure.textContent()).toContain('Fix or drop that particle');
  });

  it('lists, filters and sorts the samples', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/samples`);
    const table = page.getByRole('table', { name: 'Samples' });
    await table.getByRole('link', { name: 'Broken on purpose' }).waitFor();
    expect(await table.getByRole('row').count()).toBe(3);

    const filters = page.getByRole('group', { name: 'Filters' });
    await filters.getByLabel('State').selectOption('failed');
    await expect.poll(() => table.getByRole('row').count()).toBe(2);
    await filters.getByLabel('State').selectOption('');
    await filters.getByLabel('Tag').selectOption('gluon-like');
    await expect.poll(() => table.getByRole('row').count()).toBe(2);
    expect(await table.getByRole('link', { name: SPEC.name }).count()).toBe(1);
    await filters.getByLabel('Tag').selectOption('');
    await expect.poll(() => table.getByRole('row').count()).toBe(3);

    // Names A to Z, then Z to A.
    const [first, last] = [SPEC.name, 'Broken on purpose'].sort();
    const firstName = () => table.getByRole('row').nth(1).getByRole('link').first().textContent();
    await table.getByRole('button', { name: /Name/ }).click();
    await expect.poll(firstName).toBe(first);
    await table.getByRole('button', { name: /Name/ }).click();
    await expect.poll(firstName).toBe(last);
    await screenshot(page, 'sample-list-1280', 1280);
    await screenshot(page, 'sample-list-390', 390);
    await page.setViewportSize({ width: 1280, height: 900 });
  });

  it('creates an API token that a script uses to list samples, and revokes it', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/profile`);
    const tokens = panel(page, 'API tokens');
    await tokens.getByLabel('Token name').fill('nightly upload job');
    await tokens.getByRole('button', { name: 'Create token' }).click();
    const secret = (await tokens.getByLabel('Token secret').textContent())?.trim() ?? '';
    expect(secret.length).toBeGreaterThan(20);
    await tokens.getByRole('listitem').filter({ hasText: 'nightly upload job' }).getByText('never used').waitFor();
    await screenshot(page, 'profile-token-1280', 1280);

    const listed = await fetch(`${server.baseUrl}/api/samples`, { headers: { authorization: `Bearer ${secret}` } });
    expect(listed.status).toBe(200);
    const names = ((await listed.json()).samples as { name: string }[]).map((sample) => sample.name);
    expect(names).toContain(SPEC.name);

    await tokens.getByRole('button', { name: 'I have stored it' }).click();
    await page.reload();
    const row = panel(page, 'API tokens').getByRole('listitem').filter({ hasText: 'nightly upload job' });
    await row.getByText(/last used/).waitFor();
    await row.getByRole('button', { name: 'Revoke' }).click();
    await row.getByRole('button', { name: 'Revoke' }).click();
    await panel(page, 'API tokens').getByText('No tokens yet.').waitFor();
    const refused = await fetch(`${server.baseUrl}/api/samples`, { headers: { authorization: `Bearer ${secret}` } });
    expect(refused.status).toBe(401);
  });

  it('gives a viewer the sample to read but no upload or delete controls', async () => {
    const session = await openBrowser(390);
    try {
      const { page } = session;
      await signInThroughPage(page, server.baseUrl, viewer.email, viewer.password);
      await page.goto(`${server.baseUrl}${samplePath}`);
      await waitForState(page, 'done');
      await panel(page, 'Primary plane').locator(BINS).first().waitFor();
      expect(await page.getByRole('button', { name: 'Delete sample' }).count()).toBe(0);

      await page.goto(`${server.baseUrl}/studies/${studyId}`);
      await panel(page, 'Samples').getByRole('link', { name: SPEC.name }).waitFor();
      expect(await page.getByRole('link', { name: 'Upload a sample' }).count()).toBe(0);

      await page.goto(`${server.baseUrl}/samples`);
      await page.getByRole('table', { name: 'Samples' }).waitFor();
      expect(await page.getByRole('link', { name: 'Upload a sample' }).count()).toBe(0);

      await page.goto(`${server.baseUrl}/samples/new`);
      await page.getByText('No study to upload into').waitFor();
      expect(await page.getByRole('button', { name: 'Upload and process' }).count()).toBe(0);
    } finally {
      await session.close();
    }
  });

  it('meets no Content-Security-Policy violation on any page it opened', () => {
    expect(cspViolations).toEqual([]);
  });
});
