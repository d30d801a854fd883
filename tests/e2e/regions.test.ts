// Regions and their threads as collaborators use them, in real browsers against a real server on the demo data:
// the demo study's commenter draws a rectangle on the quark map with the mouse and types a polygon's corners,
// mentions the owner (with completion) in the first comment; the mention mail reaches the Outbox; the owner sees the
// mention and the study's activity, opens the region from there, resolves it and replies; the commenter's open thread
// shows the reply without a reload. Titles with HTML stay text. Screenshots go to tests/artifacts/regions-*.png.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openDatabase } from '@/lib/db/connection';
import { signIn, startTestServer, type TestServer } from '../support/server';
import { cspViolations, openBrowser, screenshot, signInThroughPage, type BrowserSession } from './browser';
import { waitForDemoSamples } from './demo-samples';

let server: TestServer;
let collaborator: BrowserSession;
let owner: BrowserSession;
let mapUrl = '';
const TITLE = 'Wide-angle <b>excess</b>?';

const plotSvg = (page: Page) => page.locator('figure svg').last();
const regionsPanel = (page: Page) => page.getByRole('region', { name: 'Regions', exact: true });

beforeAll(async () => {
  server = await startTestServer();
  const people = server.credentials.members;
  const ownerAccount = people.find((member) => member.studyRole === 'owner')!;
  const commenterAccount = people.find((member) => member.studyRole === 'commenter')!;
  await waitForDemoSamples(await signIn(server.baseUrl, ownerAccount.email, ownerAccount.password));
  collaborator = await openBrowser();
  await signInThroughPage(collaborator.page, server.baseUrl, commenterAccount.email, commenterAccount.password);
  owner = await openBrowser();
  await signInThroughPage(owner.page, server.baseUrl, ownerAccount.email, ownerAccount.password);
});

afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  if (collaborator) await screenshot(collaborator.page, `failed-regions-collaborator-${task.name.replace(/\W+/g, '-')}`, 1280);
  if (owner) await screenshot(owner.page, `failed-regions-owner-${task.name.replace(/\W+/g, '-')}`, 1280);
  console.error(server?.output().slice(-4000));
});

afterAll(async () => {
  await collaborator?.close();
  await owner?.close();
  await server?.stop();
});

describe('regions on the demo map', () => {
  it('lets the commenter draw a rectangle and save it with a category and a first comment that mentions the owner', async () => {
    const { page } = collaborator;
    await page.getByRole('link', { name: /Quark-like vs gluon-like jets/ }).click();
    await page.getByRole('article', { name: 'Quark-like jets: primary plane' }).getByRole('link', { name: 'Open map' }).click();
    await page.waitForURL(/\/entries\/\d+$/);
    mapUrl = page.url();
    await plotSvg(page).waitFor();
    const panel = regionsPanel(page);
    await panel.getByRole('button', { name: 'Draw a rectangle' }).click();
    await plotSvg(page).scrollIntoViewIfNeeded();
    const box = (await plotSvg(page).boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.35, box.y + box.height * 0.3);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.4, { steps: 4 });
    await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.55, { steps: 4 });
    await page.mouse.up();

    const form = page.getByRole('form', { name: 'New region' });
    expect(await form.getByTestId('pending-shape').textContent()).toMatch(/^Rectangle: ln\(1\/Δ\) [\d.-]+ to [\d.-]+, ln\(kₜ\/GeV\) [\d.-]+ to [\d.-]+$/);
    await form.getByLabel('Title').fill(TITLE);
    await form.getByLabel('Category').selectOption({ label: 'Excess' });
    const comment = form.getByLabel('First comment');
    await comment.pressSequentially('Denser than the expectation here? @Tam');
    await page.getByRole('option', { name: '@Tamsin Quell' }).waitFor();
    await comment.press('Enter');
    await comment.pressSequentially('could you check against $2\\alpha_s C_F/\\pi$?');
    expect(await comment.inputValue()).toMatch(/^Denser than the expectation here\? @\[Tamsin Quell\]\(user:\d+\) could you check/);
    await form.getByRole('button', { name: 'Save region' }).click();

    const row = panel.getByTestId('region-row').filter({ hasText: 'Wide-angle' });
    await row.waitFor();
    // The title is shown as the text typed, not as markup.
    expect(await row.textContent()).toContain(TITLE);
    expect(await row.locator('b').count()).toBe(0);
    expect(await row.getByTestId('region-numbers').textContent()).toMatch(/^∫ρ inside, splittings per jet: q-demo [\d.e-]+ ± [\d.e-]+$/);
    expect(await row.textContent()).toContain('open');
    // The outline is on the figure, in the category's colour.
    await expect.poll(() => plotSvg(page).locator('[stroke="#cc6677"]').count()).toBeGreaterThan(0);
    const thread = page.getByTestId('region-thread');
    await thread.getByTestId('comment').first().waitFor();
    expect(await thread.locator('.mention').first().textContent()).toBe('Tamsin Quell');
    expect(await thread.locator('.katex').count()).toBeGreaterThan(0);
    await screenshot(page, 'regions-drawn-1280', 1280);
  });

  it('draws a polygon corner by corner with the mouse', async () => {
    const { page } = collaborator;
    const panel = regionsPanel(page);
    await panel.getByRole('button', { name: 'Draw a polygon' }).click();
    await plotSvg(page).scrollIntoViewIfNeeded();
    const box = (await plotSvg(page).boundingBox())!;
    const at = (fx: number, fy: number) => [box.x + box.width * fx, box.y + box.height * fy] as const;
    for (const [fx, fy] of [[0.15, 0.6], [0.3, 0.6], [0.3, 0.75]]) await page.mouse.click(...at(fx, fy));
    expect((await plotSvg(page).getByTestId('polygon-trace').getAttribute('points'))!.split(' ')).toHaveLength(3);
    await page.mouse.dblclick(...at(0.18, 0.8));
    const form = page.getByRole('form', { name: 'New region' });
    expect(await form.getByTestId('pending-shape').textContent()).toMatch(/^Polygon of 4 corners: (\([\d.-]+, [\d.-]+\) ?){4}$/);
    await form.getByRole('button', { name: 'Discard' }).click();
    await form.waitFor({ state: 'detached' });
  });

  it('takes a polygon typed corner by corner, and refuses a crossing one with a message', async () => {
    const { page } = collaborator;
    const panel = regionsPanel(page);
    await panel.getByRole('button', { name: 'Type corners' }).click();
    const typed = page.getByRole('form', { name: "Type the region's corners" });
    await typed.getByRole('button', { name: 'Polygon' }).click();
    const corners = typed.getByLabel(/Corners, one a line/);
    await corners.fill('1, 0\n3, 2\n3, 0\n1, 2');
    await typed.getByRole('button', { name: 'Use these corners' }).click();
    expect(await typed.getByRole('alert').textContent()).toBe('The polygon crosses itself: edge 0 meets edge 2');
    await corners.fill('0.5, -1\n2.5, -1\n2, 0.5\n1, 0');
    await typed.getByRole('button', { name: 'Use these corners' }).click();
    const form = page.getByRole('form', { name: 'New region' });
    expect(await form.getByTestId('pending-shape').textContent()).toBe('Polygon of 4 corners: (0.500, -1.00) (2.50, -1.00) (2.00, 0.500) (1.00, 0)');
    await form.getByLabel('Title').fill('Collinear corner');
    await form.getByLabel('First comment').fill('Typed in: the **hard-collinear** corner.');
    await form.getByRole('button', { name: 'Save region' }).click();
    await panel.getByTestId('region-row').filter({ hasText: 'Collinear corner' }).waitFor();
    expect(await panel.getByTestId('region-row').count()).toBe(2);
  });

  it('tells the owner, who finds the region through the activity, resolves it and replies; the commenter sees the reply without reloading', async () => {
    expect((await notificationRows()).filter((row) => row.kind === 'mention')).toEqual([{ email: 'tamsin@larkspur.test', kind: 'mention', summary: `Oren Halvik mentioned you on region “${TITLE}”` }]);

    // The mention reaches the owner by mail: the local mail server's copy, read on the admins' Outbox page.
    const adminAccount = server.credentials.admin;
    const outbox = await openBrowser();
    try {
      await signInThroughPage(outbox.page, server.baseUrl, adminAccount.email, adminAccount.password);
      await outbox.page.goto(`${server.baseUrl}/admin/mail`);
      const mentionMail = outbox.page.getByRole('list', { name: 'Received mail' }).getByRole('link', { name: /Oren Halvik mentioned you on region/ });
      await mentionMail.waitFor({ timeout: 30_000 });
      await mentionMail.click();
      const html = outbox.page.getByTestId('mail-html');
      await html.waitFor();
      expect(await outbox.page.textContent('body')).toContain('tamsin@larkspur.test');
      expect(await html.innerText()).toContain(`mentioned you on region “${TITLE}”`);
      expect(await html.locator('b').count()).toBe(0);
      expect(await html.getByRole('link', { name: 'Open it' }).getAttribute('href')).toMatch(/\/studies\/\d+\/entries\/\d+\?region=\d+$/);
      await screenshot(outbox.page, 'regions-mention-mail-1280', 1280);
    } finally {
      await outbox.close();
    }

    // The commenter opens the rectangle's thread and keeps it open.
    await regionsPanel(collaborator.page).getByTestId('region-row').filter({ hasText: 'Wide-angle' }).click();
    await collaborator.page.getByTestId('region-thread').waitFor();

    const { page } = owner;
    await page.getByRole('link', { name: /Quark-like vs gluon-like jets/ }).click();
    const activity = page.getByRole('region', { name: 'Activity' });
    const drew = activity.getByRole('listitem').filter({ hasText: 'Oren Halvik drew region' }).filter({ hasText: 'Wide-angle' });
    await drew.waitFor();
    expect(await drew.getAttribute('data-unread')).toBe('true');
    expect(await activity.textContent()).toMatch(/\d+ new/);
    await screenshot(page, 'regions-activity-1280', 1280);
    await drew.getByRole('link').click();
    await page.waitForURL(/\/entries\/\d+\?region=\d+$/);
    const detail = page.getByRole('region', { name: `Region ${TITLE}` });
    await detail.getByTestId('comment').first().waitFor();
    await detail.getByRole('button', { name: 'Resolve' }).click();
    await detail.getByRole('button', { name: 'Reopen' }).waitFor();
    await detail.getByLabel('Add a comment').fill('Resolved: the excess is the finer binning, see the contrast.');
    await detail.getByRole('button', { name: 'Post comment' }).click();
    await detail.getByText('Resolved: the excess is the finer binning').waitFor();
    const ownersRow = regionsPanel(page).getByTestId('region-row').filter({ hasText: 'Wide-angle' });
    expect(await ownersRow.textContent()).toContain('resolved');
    await expect.poll(() => ownersRow.textContent()).toContain('2 comments');
    await screenshot(page, 'regions-resolved-1280', 1280);

    // No reload on the commenter's side: the thread polls.
    expect(collaborator.page.url()).toBe(mapUrl);
    await collaborator.page.getByTestId('region-thread').getByText('Resolved: the excess is the finer binning').waitFor({ timeout: 15_000 });
    await regionsPanel(collaborator.page).getByTestId('region-row').filter({ hasText: 'resolved' }).waitFor({ timeout: 15_000 });
    await screenshot(collaborator.page, 'regions-reply-seen-1280', 1280);
    await screenshot(collaborator.page, 'regions-reply-seen-390', 390);

    expect(await notificationRows()).toContainEqual({ email: 'oren@larkspur.test', kind: 'reply', summary: `Tamsin Quell commented on region “${TITLE}”` });
  });

  it("shows the study's regions on the contrast of the same plane, with each sample's numbers and their ratio", async () => {
    const { page } = owner;
    await page.goto(mapUrl.replace(/\/entries\/.*$/, ''));
    await page.getByRole('article', { name: 'Gluon-like over quark-like' }).getByRole('link', { name: 'Open contrast' }).click();
    await page.waitForURL(/\/entries\/\d+$/);
    const row = regionsPanel(page).getByTestId('region-row').filter({ hasText: 'Collinear corner' });
    await row.waitFor();
    expect(await row.getByTestId('region-numbers').textContent()).toMatch(/^∫ρ inside, splittings per jet: q-demo [\d.e-]+ ± [\d.e-]+; g-demo [\d.e-]+ ± [\d.e-]+; ratio g-demo\/q-demo = [\d.]+ ± [\d.e-]+$/);
    // Both regions are drawn on the comparison and on each input.
    await expect.poll(() => page.locator('figure svg [aria-description="region Collinear corner"]').count()).toBeGreaterThan(2);
    await screenshot(page, 'regions-contrast-1280', 1280);
  });

  it('met no Content-Security-Policy violation and opened no dialog', () => {
    expect(cspViolations).toEqual([]);
    expect([...collaborator.dialogs, ...owner.dialogs]).toEqual([]);
  });
});

/** Who was told of what, read from the server's database (mails are sent from these rows by another part). */
async function notificationRows(): Promise<Array<{ email: string; kind: string; summary: string }>> {
  const database = openDatabase(server.databasePath);
  try {
    const [rows] = await database.sequelize.query('SELECT u.email, n.kind, n.summary FROM notifications n JOIN users u ON u.id = n.user_id ORDER BY n.id');
    return rows as Array<{ email: string; kind: string; summary: string }>;
  } finally {
    await database.sequelize.close();
  }
}
