// Separations and taggers as a tagger developer uses them, in a real browser against a real server on the demo data
// of a first start (20 000 jets a sample): the demo study's Separation opened, its AUC and rejections read, the split
// rule on screen, a region proposal saved with the entry (checked in plane coordinates through the API), another
// made a Region with its thread, a tagger saved and applied to a third sample, and the ROC on a linear axis. Screenshots go to tests/artifacts/.
import { demoSampleSpec } from '@/lib/demo/scenario';
import { particlesFileLines } from '@/lib/ingest/generated-sample-file';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { uploadDone } from '../api/sample-fixtures';
import { type Client, signIn, startTestServer, type TestServer } from '../support/server';
import { waitForDemoSamples } from './demo-samples';
import { openBrowser, screenshot, signInThroughPage, type BrowserSession } from './browser';

let server: TestServer;
let browser: BrowserSession;
let owner: Client;
let studyId = 0;
let entryPath = '';
let thirdId = 0;
const THIRD = 'third check sample (gluon-like)';

beforeAll(async () => {
  server = await startTestServer({ demoJets: 20_000 });
  const person = server.credentials.members.find((member) => member.studyRole === 'owner')!;
  owner = await signIn(server.baseUrl, person.email, person.password);
  await waitForDemoSamples(owner);
  studyId = (await owner.get('/api/studies')).body.studies[0].id;
  const file = `${[...particlesFileLines(demoSampleSpec('gluon'), 2000, 777)].join('\n')}\n`;
  thirdId = (await uploadDone(owner, { studyId, name: THIRD, file, fields: { settings: JSON.stringify({ jet: { R: 0.8 } }) } })).id;
  browser = await openBrowser();
  await signInThroughPage(browser.page, server.baseUrl, person.email, person.password);
}, 300_000);

afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  if (browser) await screenshot(browser.page, `failed-separations-${task.name.replace(/\W+/g, '-')}`, 1280);
  console.error(server?.output().slice(-4000));
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const number = (text: string | null) => Number((text ?? '').trim().split(/\s/)[0]);

describe('separations and taggers in a browser', () => {
  it('shows the demo separation in the study with its AUC, and opens it: AUC, rejections, split rule', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}/studies/${studyId}`);
    const card = page.getByRole('article', { name: 'Quark-like against gluon-like: a tagger from the plane' });
    await card.getByTestId('compact-auc').waitFor({ timeout: 60_000 });
    expect(await card.getByTestId('compact-auc').textContent()).toMatch(/Plane score AUC 0\.\d+ ± 0\.\d+/);
    await card.getByRole('link', { name: 'Open separation' }).click();
    await page.waitForURL(/\/entries\/\d+$/);
    entryPath = new URL(page.url()).pathname;
    const auc = page.getByTestId('score-auc');
    await auc.waitFor({ timeout: 60_000 });
    // Quark-like against gluon-like jets from the plane: clearly better than chance, short of perfect.
    const aucValue = number(await auc.textContent());
    expect(aucValue).toBeGreaterThan(0.6);
    expect(aucValue).toBeLessThan(0.95);
    expect(await auc.textContent()).toMatch(/± 0\.00\d/);
    const rejections = [];
    for (const point of [30, 50, 70]) rejections.push(number(await page.getByTestId(`score-rejection-${point}`).textContent()));
    // Rejection falls as the signal efficiency rises.
    expect(rejections[0]).toBeGreaterThan(rejections[1]);
    expect(rejections[1]).toBeGreaterThan(rejections[2]);
    expect(rejections[2]).toBeGreaterThan(1);
    expect(await page.getByTestId('split-rule').textContent()).toMatch(/even positions.*odd positions/);
    const table = await page.getByTestId('separation-figures').textContent();
    for (const name of ['primary multiplicity', 'groomed mass', 'z_g', 'R_g', 'jet mass', 'constituent count']) expect(table).toContain(name);
    await page.getByRole('figure', { name: /ROC curves/ }).locator('svg').first().waitFor();
    await screenshot(page, 'separations-entry-1280', 1280);
  });

  it('saves the first region proposal with the entry, in plane coordinates', async () => {
    const { page } = browser;
    const first = page.getByTestId('region-1');
    await first.getByRole('button', { name: 'Save with the entry' }).click();
    await page.getByTestId('saved-regions').getByText(/Region proposal #1/).waitFor();
    await first.getByRole('button', { name: 'Saved' }).waitFor();
    const entryId = Number(entryPath.split('/').pop());
    const entry = (await owner.get(`/api/studies/${studyId}/entries`)).body.entries.find((e: { id: number }) => e.id === entryId);
    const [region] = entry.settings.savedRegions;
    expect(region).toMatchObject({ title: 'Region proposal #1', rank: 1, geometry: { axes: { x: 'lnInvDelta', y: 'lnKt' }, shape: { type: 'rectangle' } } });
    expect(region.geometry.shape.x2).toBeGreaterThan(region.geometry.shape.x1);
    expect(region.geometry.shape.y2).toBeGreaterThan(region.geometry.shape.y1);
    await page.getByRole('region', { name: 'Region proposals' }).scrollIntoViewIfNeeded();
    await screenshot(page, 'separations-regions-1280', 1280);
  });

  it('turns the second proposal into a Region with a thread in one step; it shows in the regions panel of the page', async () => {
    const { page } = browser;
    const second = page.getByTestId('region-2');
    await second.getByRole('button', { name: 'Make this a region to discuss' }).click();
    const form = second.getByRole('form', { name: 'New region' });
    expect(await form.getByLabel('Title').inputValue()).toBe('Separating region #2');
    await form.getByLabel('First comment').fill('Background-rich corner proposed by the separation: worth a closer look.');
    await form.getByRole('button', { name: 'Save region' }).click();
    await form.waitFor({ state: 'detached' });
    const listed = page.getByRole('region', { name: 'Regions', exact: true }).getByTestId('region-row').filter({ hasText: 'Separating region #2' });
    await listed.waitFor();
    // The numbers of both samples (background first: the ratio is signal over background).
    expect(await listed.getByTestId('region-numbers').textContent()).toMatch(/ratio .+ = [\d.]+ ± [\d.e-]+/);
    const { regions } = (await owner.get(`/api/studies/${studyId}/regions`)).body;
    const made = regions.find((r: { title: string }) => r.title === 'Separating region #2');
    expect(made.geometry).toMatchObject({ axes: { x: 'lnInvDelta', y: 'lnKt' }, shape: { type: 'rectangle' } });
    expect(made.entryId).toBe(Number(entryPath.split('/').pop()));
    await screenshot(page, 'separations-region-made-1280', 1280);
  });

  it('saves a tagger and applies it to a third sample', async () => {
    const { page } = browser;
    await page.getByLabel('Tagger name').fill('Demo quark tagger');
    await page.getByRole('button', { name: 'Save as a tagger' }).click();
    await page.getByText('Saved as a tagger.').waitFor();
    const item = page.getByRole('listitem', { name: 'Tagger Demo quark tagger' });
    await item.getByLabel('Apply Demo quark tagger to').selectOption(String(thirdId));
    const applied = item.getByTestId('tagger-application');
    await applied.waitFor({ timeout: 60_000 });
    // A gluon-like sample passes the quark working points about as often as the training background did.
    const efficiency50 = number(await applied.getByTestId('applied-efficiency-50').textContent());
    expect(efficiency50).toBeGreaterThan(0);
    expect(efficiency50).toBeLessThan(0.5);
    await applied.scrollIntoViewIfNeeded();
    await screenshot(page, 'separations-tagger-1280', 1280);
    // The figures keep their size through the changes of the page (each chart is at least 400 px wide).
    const widths = await page.evaluate(() => Array.from(document.querySelectorAll('[role=figure] > div > figure > svg')).map((svg) => svg.getBoundingClientRect().width));
    expect(widths.length).toBe(3);
    for (const width of widths) expect(width).toBeGreaterThan(400);
  });

  it('draws the ROC on a linear rejection axis on request, kept in the address', async () => {
    const { page } = browser;
    await page.getByRole('button', { name: 'Linear axis' }).click();
    await page.waitForURL(/settings=/);
    expect(decodeURIComponent(page.url())).toContain('"rocAxis":"linear"');
    await page.getByRole('region', { name: 'ROC' }).scrollIntoViewIfNeeded();
    await screenshot(page, 'separations-roc-linear-1280', 1280);
  });
});
