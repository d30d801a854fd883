// Every mail enters the outgoing queue inside the transaction of the action that wants it, so the action never
// waits for (or fails with) the mail server; the mailer sends it once the transaction has committed.
import type { Transaction } from 'sequelize';
import { db } from '../db/connection';
import type { MailPurpose } from '@/models/vocabulary';
import type { ComposedMail } from './compose';

export interface QueuedMail {
  to: string;
  userId: number | null;
  purpose: MailPurpose;
  mail: ComposedMail;
}

const wakeKey = Symbol.for('splitfield.mailerWake');
type ProcessWide = typeof globalThis & { [wakeKey]?: () => void };

/** Called by the running mailer (mailer.ts) to hear of new mail; kept on globalThis across route bundles. */
export function onMailQueued(wake: () => void): void {
  (globalThis as ProcessWide)[wakeKey] = wake;
}

/** Tells the mailer to look at the queue now instead of at its next poll. */
export function wakeMailer(): void {
  (globalThis as ProcessWide)[wakeKey]?.();
}

export async function enqueueMail(queued: QueuedMail, transaction: Transaction): Promise<void> {
  await db().models.OutgoingMail.create(
    {
      toAddress: queued.to,
      userId: queued.userId,
      purpose: queued.purpose,
      subject: queued.mail.subject,
      textBody: queued.mail.text,
      htmlBody: queued.mail.html,
      nextAttemptAt: new Date(),
    },
    { transaction },
  );
  transaction.afterCommit(wakeMailer);
}
