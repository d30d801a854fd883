// Mail as people meet it, in a real browser: the owner of the demo study invites a collaborator by e-mail; the
// invitation mail is read on the admins' Outbox (the server's own local mail server caught it), its link is
// followed, the collaborator signs up and lands in the study; a forgotten password is reset through a mail read
// the same way. Screenshots go to tests/artifacts/mail-*.png.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_STUDY } from '@/lib/demo/study-text';
import { startTestServer, type TestServer } from '../support/server';
import { cspViolations, openBrowser, screenshot, signInThroughPage, type BrowserSession } from './browser';

const COLLABORATOR = { name: 'Ravi Esterlund', email: 'ravi@larkspur.test', password: 'tallis-inner-tracker' };

let server: TestServer;
let owner: BrowserSession;
let reader: BrowserSession;
let studyUrl = '';

function demoAccount(which: 'admin' | 'owner' | 'commenter') {
  if (which === 'admin') return server.credentials.admin;
  const account = server.credentials.members.find((member) => member.studyRole === which);
  if (!account) throw new Error(`The demo seed has no member with the ${which} role.`);
  return account;
}

/** Opens the newest Outbox message whose subject matches, once the local mail server has it. */
async function openMail(page: Page, subject: RegExp): Promise<void> {
  await page.goto(`${server.baseUrl}/admin/mail`);
  const link = page.getByRole('list', { name: 'Received mail' }).getByRole('link', { name: subject }).first();
  await link.waitFor({ timeout: 20_000 });
  await link.click();
  await page.getByTestId('mail-html').waitFor();
}

beforeAll(async () => {
  server = await startTestServer();
  owner = await openBrowser();
  reader = await openBrowser();
});

afterEach(async ({ task }) => {
  if (task.result?.state !== 'fail') return;
  await screenshot(owner.page, `failed-mail-owner-${task.name.replace(/\W+/g, '-')}`, 1280);
  await screenshot(reader.page, `failed-mail-reader-${task.name.replace(/\W+/g, '-')}`, 1280);
  console.error(server?.output().slice(-4000));
});

afterAll(async () => {
  await owner?.close();
  await reader?.close();
  await server?.stop();
});

describe('mail in the browser', () => {
  it('the owner invites a collaborator by e-mail', async () => {
    const { page } = owner;
    const { email, password } = demoAccount('owner');
    await signInThroughPage(page, server.baseUrl, email, password);
    await page.getByRole('link', { name: DEMO_STUDY.title }).click();
    await page.waitForURL(/\/studies\/\d+$/);
    studyUrl = page.url();
    const form = page.getByRole('form', { name: 'Invite by e-mail' });
    await form.getByLabel('Email').fill(COLLABORATOR.email);
    await form.getByLabel('Role').selectOption('commenter');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    // The demo study's maps are drawn meanwhile on a small machine: allow time.
    await form.getByText('Invitation mailed.').waitFor({ timeout: 30_000 });
    await page.getByRole('list', { name: 'Pending invitations' }).getByText(COLLABORATOR.email).waitFor();
    await screenshot(page, 'mail-invite-members', 1280);
  });

  it('the collaborator opens the mail in the Outbox, follows its link, signs up and lands in the study', async () => {
    const { page } = reader;
    const admin = demoAccount('admin');
    await signInThroughPage(page, server.baseUrl, admin.email, admin.password);
    await page.goto(`${server.baseUrl}/admin/mail`);
    await page.getByRole('list', { name: 'Received mail' }).getByRole('link', { name: /invites you to the study/ }).waitFor({ timeout: 20_000 });
    await expect.poll(() => page.getByRole('list', { name: 'Outgoing mail' }).getByText('sent', { exact: true }).count()).toBeGreaterThan(0);
    await screenshot(page, 'mail-outbox', 1280);

    await openMail(page, /invites you to the study/);
    const html = page.getByTestId('mail-html');
    expect(await html.innerText()).toContain(`invites you to join the study “${DEMO_STUDY.title}” on Splitfield as commenter.`);
    expect(await html.innerText()).toContain('Why you got this mail');
    expect(await page.getByTestId('mail-text').getByRole('link').count()).toBe(1);
    await screenshot(page, 'mail-invitation-message', 1280);

    await html.getByRole('link', { name: 'Accept the invitation' }).click();
    await page.waitForURL(/\/invite\//);
    // Signed in as the admin, who is not the invited person: the page says so and offers to sign out.
    await page.getByText(`You are signed in as ${admin.email}`).waitFor();
    await screenshot(page, 'mail-invitation-other-account', 1280);
    await page.getByRole('button', { name: 'Sign out and continue' }).click();
    const signUp = page.getByRole('form', { name: 'Create account and join' });
    await signUp.waitFor();
    expect(await signUp.getByLabel('Email').inputValue()).toBe(COLLABORATOR.email);
    await signUp.getByLabel('Name').fill(COLLABORATOR.name);
    await signUp.getByLabel('Password').fill(COLLABORATOR.password);
    await screenshot(page, 'mail-invitation-sign-up', 1280);
    await signUp.getByRole('button', { name: 'Create account and join' }).click();
    await page.waitForURL(studyUrl);
    await page.getByRole('heading', { name: DEMO_STUDY.title }).waitFor();
    const members = page.getByRole('region', { name: 'Members' });
    await expect.poll(() => members.getByText(COLLABORATOR.name).count()).toBe(1);
    await screenshot(page, 'mail-invitation-joined', 1280);

    // The owner's list no longer shows the invitation as pending.
    await owner.page.reload();
    await owner.page.getByRole('form', { name: 'Invite by e-mail' }).waitFor();
    expect(await owner.page.getByRole('list', { name: 'Pending invitations' }).count()).toBe(0);
  });

  it('a forgotten password is reset through the mail in the Outbox', async () => {
    const { page } = reader;
    const commenter = demoAccount('commenter');
    await page.context().clearCookies();
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.waitForURL(/\/forgot-password$/);
    await page.getByLabel('Email').fill(commenter.email);
    await page.getByRole('button', { name: 'Mail me a reset link' }).click();
    await page.getByText(`If an account has the address ${commenter.email}`).waitFor();
    await screenshot(page, 'mail-reset-request', 1280);

    const admin = demoAccount('admin');
    await signInThroughPage(page, server.baseUrl, admin.email, admin.password);
    await openMail(page, /Reset your Splitfield password/);
    await screenshot(page, 'mail-reset-message', 1280);
    await page.getByTestId('mail-html').getByRole('link', { name: 'Choose a new password' }).click();
    await page.waitForURL(/\/reset-password\//);
    const form = page.getByRole('form', { name: 'Choose a new password' });
    await form.getByLabel('New password', { exact: true }).fill('a-fresh-password-42');
    await form.getByLabel('New password again').fill('a-fresh-password-42');
    await form.getByRole('button', { name: 'Set new password' }).click();
    await page.getByText('Password changed; every session of the account was signed out').waitFor();
    await screenshot(page, 'mail-reset-done', 1280);

    await page.context().clearCookies();
    await signInThroughPage(page, server.baseUrl, commenter.email, 'a-fresh-password-42');
    expect(page.url()).toBe(`${server.baseUrl}/studies`);
  });

  it('each person chooses on the profile which notifications come by mail, and how often', async () => {
    const { page } = reader;
    await page.goto(`${server.baseUrl}/profile#mail`);
    const panel = page.getByRole('region', { name: 'Mail' });
    const replies = panel.getByLabel('a reply in a thread you take part in');
    await replies.waitFor();
    expect(await replies.isChecked()).toBe(true);
    await replies.uncheck();
    await panel.getByLabel('One digest a day with everything since the last one').check();
    await expect.poll(() => panel.getByLabel('One digest a day with everything since the last one').isChecked()).toBe(true);
    await page.reload();
    await panel.getByLabel('a reply in a thread you take part in').waitFor();
    expect(await panel.getByLabel('a reply in a thread you take part in').isChecked()).toBe(false);
    expect(await panel.getByLabel('someone mentions you').isChecked()).toBe(true);
    expect(await panel.getByLabel('One digest a day with everything since the last one').isChecked()).toBe(true);
    await screenshot(page, 'mail-profile-choices', 1280);
  });

  it('met no Content-Security-Policy violation', () => {
    expect(cspViolations).toEqual([]);
  });
});
