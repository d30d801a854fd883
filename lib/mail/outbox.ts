// What the admins' Outbox shows: the outgoing queue (state, attempts, the last error) and the messages the
// local mail server received.
import { db } from '../db/connection';
import type { OutgoingMail } from '@/models/outgoing-mail';
import type { ReceivedMail } from '@/models/received-mail';
import { sanitizeMailHtml } from './sanitize-html';

/** Rows listed of each; older ones stay in the database. */
export const OUTBOX_LIST_MAX = 200;

export function outgoingMailView(mail: OutgoingMail) {
  const { id, toAddress, purpose, subject, state, attempts, nextAttemptAt, lastError, sentAt, createdAt } = mail;
  return { id, to: toAddress, purpose, subject, state, attempts, nextAttemptAt, lastError, sentAt, createdAt };
}

export function receivedMailSummary(mail: ReceivedMail) {
  const { id, sender, recipients, subject, createdAt } = mail;
  return { id, from: sender, to: recipients, subject, receivedAt: createdAt };
}

/** One received message with its text part and its HTML part made safe to show. */
export function receivedMailView(mail: ReceivedMail) {
  return {
    ...receivedMailSummary(mail),
    messageId: mail.messageId,
    size: mail.size,
    text: mail.textBody,
    html: mail.htmlBody === null ? null : sanitizeMailHtml(mail.htmlBody),
  };
}

export async function outboxLists() {
  const { models } = db();
  const [queue, received] = await Promise.all([
    models.OutgoingMail.findAll({ order: [['id', 'DESC']], limit: OUTBOX_LIST_MAX }),
    models.ReceivedMail.findAll({ order: [['id', 'DESC']], limit: OUTBOX_LIST_MAX }),
  ]);
  return { queue: queue.map(outgoingMailView), received: received.map(receivedMailSummary) };
}
