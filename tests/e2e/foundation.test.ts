// The foundation as a person uses it, in a real browser against a real server and database: signing in,
// a study with a Markdown note, sharing it read-only, and the admin's user list. Screenshots go to tests/artifacts/.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startTestServer, type TestServer } from '../support/server';
import { cspViolations, openBrowser, screenshot, signInThroughPage, submitSignIn, type BrowserSession } from './browser';

const STUDY_TITLE = 'Soft wide-angle corner, two tunes';
const NOTE_TITLE = 'First look';
const SCRIPT_LINE = '<script>window.__ranScript = true</script>';
// A heading, a list, an ordinary link, and three attempts to run code: a script tag, an inline handler and a
// javascript: link.
const NOTE_BODY = [
  '## Findings',
  '',
  '- the ratio rises below ln kt = 0',
  '',
  SCRIPT_LINE,
  '',
  '<img src="x" onerror="window.__ranHandler = true">',
  '',
  '[open me](javascript:window.__ranLink=true) and [the binning note](https://example.org/binning)',
].join('\n');

let server: TestServer;
let owner: BrowserSession;
let studyPath = '';

function demoAccount(studyRole: 'owner' | 'commenter') {
  const account = server.credentials.members.find((member) => member.studyRole === studyRole);
  if (!account) throw new Error(`The demo seed has no member with the ${studyRole} role.`);
  return account;
}

function noteCard(page: Page) {
  return page.getByRole('article', { name: NOTE_TITLE });
}

/** The message under the sign-in form. */
function signInAlert(page: Page) {
  return page.getByRole('form', { name: 'Sign in' }).getByRole('alert');
}

/** Visible buttons with this exact name on the page. */
function buttonCount(page: Page, name: string) {
  return page.getByRole('button', { name, exact: true }).count();
}

beforeAll(async () => {
  server = await startTestServer();
  owner = await openBrowser();
});

// When a step fails: a picture of the owner's page and the server's last words, to see what went wrong.
afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  if (owner) await screenshot(owner.page, `failed-${task.name.replace(/\W+/g, '-')}`, 1280);
  console.error(server?.output().slice(-4000));
});

afterAll(async () => {
  await owner?.close();
  await server?.stop();
});

describe('the foundation in a browser', () => {
  it('says clearly when the password is wrong, and stays on the sign-in page', async () => {
    const { page } = owner;
    await page.goto(`${server.baseUrl}/studies`);
    await page.waitForURL(/\/sign-in\?callbackUrl=/);
    await submitSignIn(page, server.baseUrl, demoAccount('owner').email, 'not-the-password');
    const alert = signInAlert(page);
    await alert.waitFor();
    expect(await alert.textContent()).toContain('Wrong email or password');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await screenshot(page, 'sign-in-wrong-password-390', 390);
  });

  it('signs in and creates a study', async () => {
    const { page } = owner;
    const account = demoAccount('owner');
    await signInThroughPage(page, server.baseUrl, account.email, account.password);
    await page.getByRole('link', { name: /Quark-like vs gluon-like/ }).waitFor();
    await screenshot(page, 'studies-list-1280', 1280);

    await page.getByRole('button', { name: 'New study' }).click();
    await page.getByLabel('Title').fill(STUDY_TITLE);
    await page.getByLabel('Description').fill('Where do the two tunes part ways?');
    await page.getByRole('button', { name: 'Create study' }).click();
    await page.waitForURL(/\/studies\/\d+$/);
    studyPath = new URL(page.url()).pathname;
    await page.getByRole('heading', { level: 1, name: STUDY_TITLE }).waitFor();
    expect(await page.getByText('No entries yet').isVisible()).toBe(true);
    // The browser tab is named after the study, not just the kind of page.
    await page.waitForFunction((title) => document.title === `${title} · Splitfield`, STUDY_TITLE);
  });

  it('adds a Markdown note whose HTML stays inert text', async () => {
    const { page, dialogs } = owner;
    await page.getByRole('button', { name: 'Add note' }).click();
    await page.getByLabel('Title').fill(NOTE_TITLE);
    await page.getByLabel('Text').fill(NOTE_BODY);
    // The preview renders the Markdown before it is saved.
    await page.getByRole('button', { name: 'Preview' }).click();
    const editor = page.getByRole('form', { name: 'Add note' });
    await editor.getByRole('heading', { name: 'Findings' }).waitFor();
    await screenshot(page, 'note-editor-preview-1280', 1280);
    await page.getByRole('button', { name: 'Back to writing' }).click();
    await page.getByRole('button', { name: 'Add note' }).click();

    const card = noteCard(page);
    await card.getByRole('heading', { level: 2, name: 'Findings' }).waitFor();
    expect(await card.getByRole('listitem').textContent()).toContain('the ratio rises below ln kt = 0');
    // The markup shows as the characters typed, and nothing of it became an element or ran.
    expect(await card.textContent()).toContain(SCRIPT_LINE);
    const injected = await card.evaluate((element) => ({
      scripts: element.querySelectorAll('script').length,
      images: element.querySelectorAll('img').length,
      scriptLinks: [...element.querySelectorAll('a')].filter((a) => /^\s*javascript:/i.test(a.getAttribute('href') ?? '')).length,
    }));
    expect(injected).toEqual({ scripts: 0, images: 0, scriptLinks: 0 });
    // The javascript: link is left as plain text; the ordinary one works and opens apart from the app.
    expect(await card.getByText('open me').isVisible()).toBe(true);
    const links = card.getByRole('link');
    expect(await links.count()).toBe(1);
    expect(await links.getAttribute('href')).toBe('https://example.org/binning');
    expect(await links.getAttribute('rel')).toContain('noopener');
    const ran = await page.evaluate(() => {
      const globals = window as unknown as Record<string, unknown>;
      return [globals.__ranScript, globals.__ranHandler, globals.__ranLink];
    });
    expect(ran).toEqual([undefined, undefined, undefined]);
    expect(dialogs).toEqual([]);

    // It is stored: a reload shows it again.
    await page.reload();
    await noteCard(page).getByRole('heading', { name: 'Findings' }).waitFor();
  });

  it('edits, reorders and deletes notes', async () => {
    const { page } = owner;
    await page.getByRole('button', { name: 'Add note' }).click();
    await page.getByLabel('Title').fill('Scratch');
    await page.getByLabel('Text').fill('To be moved, edited and removed.');
    await page.getByRole('button', { name: 'Add note' }).click();
    const scratch = page.getByRole('article', { name: 'Scratch' });
    await scratch.waitFor();

    await scratch.getByRole('button', { name: 'Move up' }).click();
    await expect.poll(() => page.getByRole('article').first().getAttribute('aria-label')).toBe('Scratch');

    await scratch.getByRole('button', { name: 'Edit' }).click();
    await page.getByLabel('Text').fill('Edited text.');
    await page.getByRole('button', { name: 'Save note' }).click();
    await scratch.getByText('Edited text.').waitFor();

    await scratch.getByRole('button', { name: 'Delete' }).click();
    await scratch.getByRole('button', { name: 'Delete note' }).click();
    await scratch.waitFor({ state: 'detached' });
    expect(await page.getByRole('article').count()).toBe(1);
  });

  it('adds a member as viewer', async () => {
    const { page } = owner;
    const viewer = demoAccount('commenter');
    const addForm = page.getByRole('form', { name: 'Add member' });
    await addForm.getByLabel('Email').fill(viewer.email);
    await addForm.getByLabel('Role').selectOption('viewer');
    await addForm.getByRole('button', { name: 'Add member' }).click();
    const roleSelect = page.getByRole('combobox', { name: `Role of ${viewer.name}` });
    await roleSelect.waitFor();
    expect(await roleSelect.inputValue()).toBe('viewer');
    await screenshot(page, 'study-owner-1280', 1280);
    await screenshot(page, 'study-owner-390', 390);
  });

  it('lets the viewer read the study but not change it', async () => {
    const viewerAccount = demoAccount('commenter');
    const viewer = await openBrowser(390);
    try {
      const { page } = viewer;
      await signInThroughPage(page, server.baseUrl, viewerAccount.email, viewerAccount.password);
      await page.goto(`${server.baseUrl}${studyPath}`);
      await noteCard(page).getByRole('heading', { name: 'Findings' }).waitFor();

      const badge = page.locator('header [data-role]');
      expect(await badge.getAttribute('data-role')).toBe('viewer');
      expect(await badge.textContent()).toContain('viewer');
      expect(await page.getByText('Read only').isVisible()).toBe(true);
      for (const control of ['Rename', 'Add note', 'Edit', 'Delete', 'Move up', 'Remove', 'Add member', 'Delete study']) {
        expect(await buttonCount(page, control), `no "${control}" button for a viewer`).toBe(0);
      }
      expect(await page.getByRole('combobox').count()).toBe(0);
      await screenshot(page, 'study-viewer-390', 390);

      // At this width the side navigation folds into a menu under the top bar.
      const mainNav = page.getByRole('navigation', { name: 'Main' });
      expect(await mainNav.count()).toBe(0);
      await page.getByRole('button', { name: 'Menu' }).click();
      expect(await mainNav.getByRole('link', { name: 'Studies' }).isVisible()).toBe(true);
      expect(await mainNav.getByRole('link', { name: 'Users' }).count()).toBe(0);
      await screenshot(page, 'nav-menu-390', 390);

      // The API refuses the viewer too, whatever the page shows.
      const studyId = studyPath.split('/').pop();
      const statuses = await page.evaluate(async (id) => {
        const send = (method: string, url: string, body: unknown) =>
          fetch(url, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
        const added = await send('POST', `/api/studies/${id}/entries`, { kind: 'note', body: 'sneaked in' });
        const renamed = await send('PATCH', `/api/studies/${id}`, { title: 'Renamed by a viewer' });
        return { added: added.status, renamed: renamed.status, message: (await added.json()).error?.message };
      }, studyId);
      expect(statuses.added).toBe(403);
      expect(statuses.renamed).toBe(403);
      expect(typeof statuses.message).toBe('string');
    } finally {
      await viewer.close();
    }
  });

  it('changes the display name, and says why a password change fails', async () => {
    const { page } = owner;
    await page.setViewportSize({ width: 1280, height: 900 });
    await page.goto(`${server.baseUrl}/profile`);
    const nameForm = page.getByRole('form', { name: 'Name' });
    await nameForm.getByLabel('Display name').fill('Tamsin Quell-Arden');
    await nameForm.getByRole('button', { name: 'Save name' }).click();
    await nameForm.getByText('Name saved.').waitFor();
    await page.getByRole('complementary').getByText('Tamsin Quell-Arden').waitFor();

    const passwordForm = page.getByRole('form', { name: 'Password' });
    await passwordForm.getByLabel('Current password').fill('not-my-password');
    await passwordForm.getByLabel('New password', { exact: true }).fill('another long password');
    await passwordForm.getByLabel('New password again').fill('another long password');
    await passwordForm.getByRole('button', { name: 'Change password' }).click();
    const alert = passwordForm.getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toContain('current password is wrong');
    await screenshot(page, 'profile-1280', 1280);
  });

  it('says so when a study or a page does not exist', async () => {
    const { page } = owner;
    const study = await page.goto(`${server.baseUrl}/studies/999999`);
    expect(study?.status()).toBe(404);
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
    const sample = await page.goto(`${server.baseUrl}/samples/999999`);
    expect(sample?.status()).toBe(404);
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
    const missing = await page.goto(`${server.baseUrl}/no-such-page`);
    expect(missing?.status()).toBe(404);
    expect(await page.getByRole('heading', { name: 'Page not found' }).isVisible()).toBe(true);
    await screenshot(page, 'not-found-390', 390);
  });

  it('lets a newcomer sign up, showing the server\'s reason when it refuses', async () => {
    const newcomer = await openBrowser(390);
    try {
      const { page } = newcomer;
      await page.goto(`${server.baseUrl}/sign-up`);
      const form = page.getByRole('form', { name: 'Create account' });
      await form.getByLabel('Name').fill('Pia Newcomb');
      await form.getByLabel('Email').fill(demoAccount('owner').email);
      await form.getByLabel('Password').fill('a long enough password');
      await form.getByRole('button', { name: 'Create account' }).click();
      const alert = form.getByRole('alert');
      await alert.waitFor();
      expect(await alert.textContent()).toContain('already exists');

      await form.getByLabel('Email').fill('pia@larkspur.test');
      await form.getByRole('button', { name: 'Create account' }).click();
      await page.waitForURL(`${server.baseUrl}/studies`);
      await page.getByText('No studies yet').waitFor();
      await screenshot(page, 'studies-empty-390', 390);
    } finally {
      await newcomer.close();
    }
  });

  it('shows the admin every account', async () => {
    const admin = await openBrowser();
    try {
      const { page } = admin;
      const account = server.credentials.admin;
      await signInThroughPage(page, server.baseUrl, account.email, account.password);
      await page.getByRole('link', { name: 'Users' }).click();
      await page.waitForURL(`${server.baseUrl}/admin/users`);
      for (const person of [account, ...server.credentials.members]) {
        await page.getByRole('listitem', { name: person.name }).getByText(person.email).waitFor();
      }
      expect(await page.getByRole('switch', { name: /Open sign-up/ }).count()).toBe(1);
      await screenshot(page, 'admin-users-1280', 1280);
      await screenshot(page, 'admin-users-390', 390);
    } finally {
      await admin.close();
    }
  });

  it('lets the admin close sign-up and disable an account, and tells the people affected', async () => {
    const admin = await openBrowser();
    const visitor = await openBrowser(390);
    try {
      const { page } = admin;
      const account = server.credentials.admin;
      const disabled = demoAccount('commenter');
      await signInThroughPage(page, server.baseUrl, account.email, account.password);
      await page.goto(`${server.baseUrl}/admin/users`);

      const openSignup = page.getByRole('switch', { name: /Open sign-up/ });
      await openSignup.waitFor({ state: 'attached' });
      await expect.poll(() => openSignup.isChecked()).toBe(true);
      await openSignup.click({ force: true });
      await expect.poll(() => openSignup.isChecked()).toBe(false);
      await visitor.page.goto(`${server.baseUrl}/sign-up`);
      await visitor.page.getByText('Sign-up is closed on this server').waitFor();

      const row = page.getByRole('listitem', { name: disabled.name });
      await row.getByRole('button', { name: `Disable ${disabled.name}` }).click();
      await row.getByText('Disabled', { exact: true }).waitFor();
      await submitSignIn(visitor.page, server.baseUrl, disabled.email, disabled.password);
      const alert = signInAlert(visitor.page);
      await alert.waitFor();
      expect(await alert.textContent()).toContain('This account is disabled');
    } finally {
      await visitor.close();
      await admin.close();
    }
  });

  it('signs out, after which pages ask for a sign-in again', async () => {
    const { page } = owner;
    await page.setViewportSize({ width: 1280, height: 900 });
    await page.goto(`${server.baseUrl}/studies`);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(`${server.baseUrl}/sign-in`);
    await page.goto(`${server.baseUrl}/studies`);
    await page.waitForURL(/\/sign-in\?callbackUrl=%2Fstudies/);
  });

  it('meets no Content-Security-Policy violation on any page it opened', () => {
    expect(cspViolations).toEqual([]);
  });
});
