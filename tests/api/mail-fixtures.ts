// Reading the mail a test server sent: its local mail server stores every message, and admins read them through
// the Outbox API, as a person trying the product would.
import { expect } from 'vitest';
import { openDatabase } from '@/lib/db/connection';
import type { Client, TestServer } from '../support/server';

export interface ReceivedMail {
  id: number;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

export interface QueuedMail {
  id: number;
  to: string;
  purpose: string;
  subject: string;
  state: 'queued' | 'sent' | 'failed';
  attempts: number;
  lastError: string | null;
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Polls `check` until it returns a value (not undefined), or fails after `timeoutMs` naming `what`. */
export async function eventually<T>(what: string, check: () => Promise<T | undefined>, timeoutMs = 20_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = await check();
    if (found !== undefined) return found;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}`);
    await sleep(200);
  }
}

export async function outbox(admin: Client): Promise<{ mailer: any; queue: QueuedMail[]; received: Array<Omit<ReceivedMail, 'text' | 'html'>> }> {
  const answer = await admin.get('/api/admin/mail');
  expect(answer.status, answer.text).toBe(200);
  return answer.body;
}

/** The messages the local mail server received for `to` so far, newest first, in full. */
export async function mailsTo(admin: Client, to: string): Promise<ReceivedMail[]> {
  const { received } = await outbox(admin);
  // Addresses are stored lower-cased.
  const mine = received.filter((mail) => mail.to.includes(to.toLowerCase()));
  return Promise.all(mine.map(async (mail) => (await admin.get(`/api/admin/mail/${mail.id}`)).body.mail as ReceivedMail));
}

/** Waits for the `count`-th message to `to` (default the first) whose subject matches, and returns it. */
export function waitForMail(admin: Client, to: string, subject: RegExp, count = 1): Promise<ReceivedMail> {
  return eventually(`mail ${count} to ${to} matching ${subject}`, async () => {
    const matching = (await mailsTo(admin, to)).filter((mail) => subject.test(mail.subject));
    return matching.length >= count ? matching[matching.length - count] : undefined;
  });
}

/** The token of the first link to `path` (/invite or /reset-password) in a mail's text. */
export function linkToken(mail: ReceivedMail, path: '/invite' | '/reset-password'): string {
  const match = new RegExp(`https?://[^\\s]+${path}/([A-Za-z0-9_.-]+)`).exec(mail.text);
  expect(match, `a ${path} link in:\n${mail.text}`).not.toBeNull();
  return match![1];
}

/** Runs SQL on the server's database from the test (to let a link's time run out, or to stand for a producer). */
export async function onDatabase<T>(server: TestServer, work: (run: (sql: string, replacements?: unknown[]) => Promise<any[]>) => Promise<T>): Promise<T> {
  const database = openDatabase(server.databasePath);
  try {
    return await work(async (sql, replacements) => (await database.sequelize.query(sql, { replacements }))[0] as any[]);
  } finally {
    await database.sequelize.close();
  }
}

/** Lets the newest link of this table run out, as if its time had passed. */
export function expireNewestLink(server: TestServer, table: 'invitations' | 'password_resets'): Promise<void> {
  return onDatabase(server, async (run) => {
    await run(`UPDATE ${table} SET expires_at = ? WHERE id = (SELECT MAX(id) FROM ${table})`, [new Date(Date.now() - 60_000).toISOString().replace('T', ' ').replace('Z', ' +00:00')]);
  });
}
