// Headless Chromium for the end-to-end tests: Debian's binary, launched as STACK.md pitfall 12 says, each
// session in its own fresh profile so that signed-in users never share cookies.
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const ARTIFACTS_DIR = path.resolve(__dirname, '..', 'artifacts');

const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/**
 * Every Content-Security-Policy violation any page of this test file reported (Chromium logs each as a console
 * error and fires a securitypolicyviolation event): the app's own pages and charts must cause none.
 */
export const cspViolations: string[] = [];

export interface BrowserSession {
  context: BrowserContext;
  page: Page;
  /** Browser dialogs (alert, confirm) seen so far; the app never opens one, so any is a fault. */
  dialogs: string[];
  close(): Promise<void>;
}

/** A new browser with an empty profile (a fresh --user-data-dir) and one page at the given width. */
export async function openBrowser(width = 1280): Promise<BrowserSession> {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'splitfield-e2e-profile-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    args: CHROMIUM_ARGS,
    viewport: { width, height: 900 },
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const dialogs: string[] = [];
  page.on('dialog', (dialog) => {
    dialogs.push(dialog.message());
    void dialog.dismiss();
  });
  context.on('console', (message) => {
    if (/Content Security Policy|Content-Security-Policy/i.test(message.text())) cspViolations.push(`${message.page()?.url()}: ${message.text()}`);
  });
  await context.exposeBinding('__reportCspViolation', ({ page: source }, text: string) => {
    cspViolations.push(`${source?.url()}: ${text}`);
  });
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) => {
      const report = (window as unknown as { __reportCspViolation?: (text: string) => void }).__reportCspViolation;
      report?.(`${event.violatedDirective} blocked ${event.blockedURI || 'inline code'}`);
    });
  });
  return {
    context,
    page,
    dialogs,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Fills in and sends the sign-in form, as a person would; the outcome is for the caller to check. */
export async function submitSignIn(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Signs in through the sign-in page and waits for the studies list. */
export async function signInThroughPage(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await submitSignIn(page, baseUrl, email, password);
  await page.waitForURL(`${baseUrl}/studies`);
}

/** A full-page screenshot under tests/artifacts/ at the given viewport width. */
export async function screenshot(page: Page, name: string, width: number): Promise<string> {
  mkdirSync(ARTIFACTS_DIR, { recursive: true });
  await page.setViewportSize({ width, height: 900 });
  // Let fonts load and the layout settle at the new width before taking the picture.
  await page.evaluate(
    () => document.fonts.ready.then(() => new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(resolve)))),
  );
  const file = path.join(ARTIFACTS_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}
