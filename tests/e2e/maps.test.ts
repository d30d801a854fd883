// Maps and contrasts as an analyst uses them, in a real browser against a real server on the demo data of a first
// start (20 000 jets a sample): the demo study with its notes (maths typeset), Maps and Contrast; a Map opened on its
// own address, its binning and ranges changed, log colour, the expectation overlay, a hover value, a refused filter,
// SVG and CSV downloads; the Contrast with its box beside 9/4 and a projection. Screenshots go to tests/artifacts/.
import { readFileSync } from 'node:fs';
import { demoSampleSpec } from '@/lib/demo/scenario';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { type Client, signIn, startTestServer, type TestServer } from '../support/server';
import { waitForDemoSamples } from './demo-samples';
import { ARTIFACTS_DIR, openBrowser, screenshot, signInThroughPage, type BrowserSession } from './browser';

let server: TestServer;
let browser: BrowserSession;
let studyPath = '';
let mapPath = '';
let quarkSampleId = 0;

/** The figure's plot (the last svg of the figure: the first is the colour legend). */
const plotSvg = (page: Page) => page.locator('figure svg').last();

beforeAll(async () => {
  server = await startTestServer({ demoJets: 20_000 });
  const owner = server.credentials.members.find((member) => member.studyRole === 'owner')!;
  await waitForDemoSamples(await signIn(server.baseUrl, owner.email, owner.password));
  browser = await openBrowser();
  await signInThroughPage(browser.page, server.baseUrl, owner.email, owner.password);
});

afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  if (browser) await screenshot(browser.page, `failed-maps-${task.name.replace(/\W+/g, '-')}`, 1280);
  console.error(server?.output().slice(-4000));
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe('maps and contrasts in a browser', () => {
  it('opens the demo study with its notes, maps and contrast', async () => {
    const { page } = browser;
    await page.getByRole('link', { name: /Quark-like vs gluon-like jets/ }).click();
    await page.waitForURL(/\/studies\/\d+$/);
    studyPath = new URL(page.url()).pathname;
    const quarkMap = page.getByRole('article', { name: 'Quark-like jets: primary plane' });
    await quarkMap.locator('figure svg').last().waitFor();
    await page.getByRole('article', { name: 'Gluon-like over quark-like' }).locator('figure').first().waitFor();
    // maths in notes is typeset by KaTeX, not shown as dollars
    const expectNote = page.getByRole('article', { name: 'What we expect before looking' });
    expect(await expectNote.locator('.katex').count()).toBeGreaterThan(2);
    expect(await expectNote.textContent()).not.toContain('$$');
    const closing = page.getByRole('article', { name: 'What the contrast shows, and what it does not' });
    expect(await closing.textContent()).toContain('not 9/4 = 2.25');
    expect(await quarkMap.getByTestId('outside-note').textContent()).toMatch(/per jet outside the shown range/);
    // the card's figure fills the card
    const cardWidth = (await quarkMap.boundingBox())!.width;
    await expect.poll(async () => (await quarkMap.locator('figure svg').last().boundingBox())!.width).toBeGreaterThan(0.8 * cardWidth);
    await screenshot(page, 'maps-study-1280', 1280);
  });

  it('opens a map on its own address and changes its bins and ranges', async () => {
    const { page } = browser;
    await page.getByRole('article', { name: 'Quark-like jets: primary plane' }).getByRole('link', { name: 'Open map' }).click();
    await page.waitForURL(/\/entries\/\d+$/);
    mapPath = new URL(page.url()).pathname;
    await plotSvg(page).waitFor();
    const rects = () => page.locator('figure svg').last().locator('g[aria-label="rect"] rect').count();
    const before = await rects();
    await page.getByLabel('Horizontal bin size').fill('0.5');
    await page.getByLabel('Vertical bin size').fill('0.5');
    await page.getByLabel('Vertical min').fill('-1');
    await page.getByLabel('Vertical max').fill('5');
    await page.getByRole('button', { name: 'Apply' }).click();
    await page.waitForURL(/settings=/);
    const settings = JSON.parse(new URL(page.url()).searchParams.get('settings')!);
    expect(settings.view.bins).toMatchObject({ x: { step: 0.5 }, y: { min: -1, max: 5, step: 0.5 } });
    quarkSampleId = settings.sampleId;
    await expect.poll(rects).not.toBe(before);
    await expect.poll(() => plotSvg(page).textContent()).toContain('ln(kₜ/GeV)');
    // 12 vertical bins of 0.5 from -1 to 5: the highest tick label is 5
    expect(await page.getByTestId('outside-note').textContent()).toMatch(/per jet outside the shown range \(.*(below|above)/);
  });

  it('switches to log colour, toggles the expectation and reads a hover value', async () => {
    const { page } = browser;
    await page.getByRole('button', { name: 'Log colour' }).click();
    await expect.poll(() => page.getByRole('button', { name: 'Log colour' }).getAttribute('aria-pressed')).toBe('true');
    await page.waitForURL(/%22colour%22%3A%22log%22/);
    const contours = page.locator('figure svg g[aria-description="expectation contours"] path');
    await contours.first().waitFor(); // the demo map starts with the soft-collinear expectation
    await page.getByLabel('Leading-order expectation').selectOption('none');
    await expect.poll(() => contours.count()).toBe(0);
    await page.getByLabel('Leading-order expectation').selectOption('hardCollinear');
    await contours.first().waitFor();
    expect(await page.getByText(/Contours: leading-order expectation for quark jets/).count()).toBe(1);
    for (const kind of ['radius', 'zHalf', 'constantZ', 'ktOneGeV']) expect(await page.locator(`figure svg g[aria-description="${kind}"] path`).count()).toBeGreaterThan(0);
    // Pointing at the plot (again, should a late redraw have replaced it) shows the bin under the pointer.
    const hover = async () => {
      await plotSvg(page).scrollIntoViewIfNeeded();
      const box = (await plotSvg(page).boundingBox())!;
      await page.mouse.move(box.x + box.width * 0.45, box.y + box.height * 0.5);
      await page.mouse.move(box.x + box.width * 0.46, box.y + box.height * 0.55);
      return page.getByTestId('bin-readout').textContent();
    };
    await expect.poll(hover).toMatch(/ln\(1\/Δ\) .* to .*, ln\(kₜ\/GeV\) .* to .*: ρ = [\d.e-]+ ± [\d.e-]+, \d+ splittings?/);
    await screenshot(page, 'maps-map-1280', 1280);
    await page.locator('figure').first().screenshot({ path: `${ARTIFACTS_DIR}/maps-map-figure.png` });
  });

  it('refuses a wrong filter at the field where it was typed', async () => {
    const { page } = browser;
    const refusal = page.getByRole('alert').filter({ hasText: 'The filter is refused' });
    await page.getByLabel('Filter').fill('m_g = 3');
    await page.getByRole('button', { name: 'Apply' }).click();
    await refusal.waitFor();
    expect(await refusal.textContent()).toMatch(/assignments are not allowed/);
    await page.getByLabel('Filter').fill('ptt > 400 and mass < 40');
    await page.getByRole('button', { name: 'Apply' }).click();
    await expect.poll(() => refusal.textContent()).toMatch(/unknown names ptt, mass \(columns: pt, y, phi/);
    await page.getByLabel('Filter').fill('pt > 0 and multiplicity >= 3');
    await page.getByRole('button', { name: 'Apply' }).click();
    await expect.poll(() => page.getByTestId('jets-selected').textContent()).toMatch(/by the filter/);
  });

  it('downloads the figure as SVG and the values as CSV', async () => {
    const { page } = browser;
    const [svg] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'SVG', exact: true }).click()]);
    const svgText = readFileSync((await svg.path())!, 'utf8');
    expect(svg.suggestedFilename()).toMatch(/^map-\d+\.svg$/);
    expect(svgText).toMatch(/^<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/);
    expect(svgText).toContain('ln(1/Δ)');
    const [csv] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'CSV', exact: true }).click()]);
    const lines = readFileSync((await csv.path())!, 'utf8').trim().split('\n');
    expect(lines[0]).toBe('ln(1/Delta) low,ln(1/Delta) high,ln(kt/GeV) low,ln(kt/GeV) high,rho,rho error,splittings (raw count)');
    expect(lines.length).toBeGreaterThan(100);
  });

  it('opens the contrast: ratio with χ²/ndf, the box beside 9/4, and a projection of both with their ratio', async () => {
    const { page } = browser;
    await page.goto(`${server.baseUrl}${studyPath}`);
    await page.getByRole('article', { name: 'Gluon-like over quark-like' }).getByRole('link', { name: 'Open contrast' }).click();
    await page.waitForURL(/\/entries\/\d+$/);
    await page.getByTestId('chi2').first().waitFor();
    expect(await page.getByTestId('chi2').first().textContent()).toMatch(/χ²\/ndf = [\d.e+]+\/\d+ = [\d.]+ over the bins/);
    const result = page.getByTestId('box-result');
    await result.waitFor();
    const escaped = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
    const [gluon, quark] = [demoSampleSpec('gluon').name, demoSampleSpec('quark').name].map(escaped);
    expect(await result.textContent()).toMatch(new RegExp(`${gluon} / ${quark} = 2\\.\\d+ ± 0\\.0\\d`));
    expect(await result.textContent()).toContain('CA/CF = 9/4 = 2.25');
    expect(await result.textContent()).toContain('Nucl. Phys. B126 (1977) 298');
    const projection = page.getByRole('region', { name: 'Projection' });
    await projection.locator('svg').first().waitFor();
    expect(await projection.locator('figure svg').count()).toBeGreaterThan(1); // the projection and the ratio
    await screenshot(page, 'maps-contrast-1280', 1280);
    await screenshot(page, 'maps-contrast-390', 390);
    await page.setViewportSize({ width: 1280, height: 900 });
  });

  it('opens a linked view exactly as it was shown', async () => {
    const { page } = browser;
    const settings = { sampleId: quarkSampleId, view: { bins: { x: { min: 0, max: 4, step: 0.25 } } }, display: { colour: 'log' } };
    await page.goto(`${server.baseUrl}${mapPath}?settings=${encodeURIComponent(JSON.stringify(settings))}`);
    await plotSvg(page).waitFor();
    expect(await page.getByRole('button', { name: 'Log colour' }).getAttribute('aria-pressed')).toBe('true');
    expect(await page.getByLabel('Horizontal bin size').inputValue()).toBe('0.25');
    expect(await page.getByText('Shown with settings from this address, not yet saved.').count()).toBe(1);
  });
});
