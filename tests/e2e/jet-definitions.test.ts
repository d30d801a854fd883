// The jet-definition settings as a person uses them, in a real browser against a real server: an editor uploads a
// Parquet file of e+e- -like events with tag hadrons, choosing e+e- Durham jets (exactly 2), charged particles only
// and flavour tags in the upload form; the sample page then shows the removed particles and the jet flavours in its
// counts, E and θ and the flavour in the jet table, the plane in ln(1/θ) and kₜ = E sin θ, and the settings in its
// provenance. A wrong combination is caught in the form. Screenshots go to tests/artifacts/.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { writeParquet, type ColumnarRecord } from '@/tests/support/columnar-files';
import { generateEeEvents, listedPids } from '@/tests/support/test-events';
import { newPerson, newStudy, type Person } from '../api/fixtures';
import { startTestServer, type TestServer } from '../support/server';
import { openBrowser, screenshot, signInThroughPage, type BrowserSession } from './browser';

let server: TestServer;
let folder: string;
let file: string;
let owner: Person;
let studyId: number;
let browser: BrowserSession;

function panel(page: Page, title: string) {
  return page.getByRole('region', { name: title, exact: true });
}

beforeAll(async () => {
  server = await startTestServer();
  folder = mkdtempSync(path.join(os.tmpdir(), 'splitfield-e2e-jetdefs-'));
  file = path.join(folder, 'tallis-ee-events.parquet');
  const events = generateEeEvents(515, 40, { nParticles: 80, nJets: 2, jetP: [20, 45] });
  const records: ColumnarRecord[] = events.map((p, i) => {
    const { pid, charge } = listedPids(900 + i, p.length / 4);
    // A B0 along the first spray's leading particle in every other event.
    const tags = i % 2 === 0 ? Float64Array.of(p[0] * 0.5, p[1] * 0.5, p[2] * 0.5, Math.sqrt(0.25 * (p[0] ** 2 + p[1] ** 2 + p[2] ** 2) + 5.279 ** 2)) : undefined;
    return { id: `ee${i}`, weight: 1, particles: p, pid, charge, tags, tagPid: tags ? Int32Array.of(511) : undefined };
  });
  const header = { format: 'splitfield-particles', version: 1, content: 'events', sample: { name: 'Tallis e+e- check', label: 'ee', tags: ['tallis'] } };
  writeParquet(file, header, records, { layout: 'lists' });
  owner = await newPerson(server, 'owner');
  studyId = await newStudy(owner.client, 'Lepton-collider jets');
  browser = await openBrowser();
  await signInThroughPage(browser.page, server.baseUrl, owner.email, owner.password);
});

afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  if (browser) await screenshot(browser.page, `failed-jetdefs-${task.name.replace(/\W+/g, '-')}`, 1280);
  console.error(server?.output().slice(-4000));
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
  if (folder) rmSync(folder, { recursive: true, force: true });
});

describe('jet definitions in a browser', () => {
  it('uploads an e+e- Parquet file with Durham jets, charged particles only and flavour tags', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/samples/new?studyId=${studyId}`);
    const form = page.getByRole('form', { name: 'Upload a sample' });
    await form.getByLabel('Particle file').setInputFiles(file);
    await expect.poll(() => form.getByLabel('Sample name').inputValue()).toBe('tallis-ee-events');
    await form.getByLabel('Collision').selectOption('ee');
    // Durham without an exclusive mode is refused before the file is sent, beside the field that says how many jets.
    await form.getByRole('button', { name: 'Upload and process' }).click();
    const exclusiveValue = form.getByLabel('n, dcut or ycut');
    await expect.poll(() => exclusiveValue.getAttribute('aria-invalid')).toBe('true');
    const describedBy = (await exclusiveValue.getAttribute('aria-describedby'))!.split(' ')[0];
    expect(await page.locator(`[id="${describedBy}"]`).textContent()).toContain('Durham jets need jet.exclusive');
    await form.getByLabel('Jets', { exact: true }).selectOption('n');
    await exclusiveValue.fill('2');
    await form.getByLabel('Charged particles only').check();
    await form.getByLabel('Flavour tagging (b, c, light)').check();
    await screenshot(page, 'jetdefs-upload-1280', 1280);
    await page.setViewportSize({ width: 1280, height: 900 });
    await form.getByRole('button', { name: 'Upload and process' }).click();
    await page.waitForURL(/\/samples\/\d+$/);
    await page.locator('h1 [data-state="done"]').waitFor({ timeout: 60_000 });

    const counts = panel(page, 'Counts');
    expect(await counts.getByText('Jets kept').locator('..').textContent()).toMatch(/80.*exclusive, exactly 2 jets/);
    expect(await counts.getByText('Particles removed').locator('..').textContent()).toMatch(/neutral \d+/);
    expect(await counts.getByText('Jet flavours').locator('..').textContent()).toMatch(/\d+ b/);

    const jets = panel(page, 'Jets');
    await jets.getByRole('columnheader', { name: 'E', exact: true }).waitFor();
    await jets.getByRole('columnheader', { name: 'θ', exact: true }).waitFor();
    expect(await jets.getByRole('columnheader', { name: 'pt', exact: true }).count()).toBe(0);
    await jets.getByRole('columnheader', { name: 'flavour', exact: true }).click();
    await expect.poll(() => jets.locator('tbody tr').first().textContent()).toMatch(/b$/);

    const plane = panel(page, 'Primary plane');
    await expect.poll(() => plane.getByLabel('Horizontal').locator('option').allTextContents()).toContain('ln(1/θ)');
    await plane.locator('figure svg').first().waitFor();
    expect(await plane.locator('figure').first().textContent()).toContain('kₜ = E sin θ');

    const provenance = panel(page, 'Provenance');
    expect(await provenance.textContent()).toContain('Durham (kt), exclusive, exactly 2 jets');
    expect(await provenance.textContent()).toContain('charged only');
    expect(await provenance.textContent()).toContain('parquet-lists');
    await screenshot(page, 'jetdefs-sample-1280', 1280);
    await screenshot(page, 'jetdefs-sample-390', 390);
    await page.setViewportSize({ width: 1280, height: 900 });
  });
});
