// Producers (threads, the job runner) call this to tell people about an event; the mailer decides how and when.
import type { Transaction } from 'sequelize';
import { db } from '@/lib/db/connection';
import { NOTIFICATION_SUMMARY_MAX, type NotificationKind } from '@/models/vocabulary';

export interface NotificationEvent {
  kind: NotificationKind;
  /** Everyone to tell; the actor is left out (nobody is told about their own action), duplicates collapse. */
  userIds: readonly number[];
  actorId: number | null;
  studyId: number | null;
  /** Plain text, one sentence: "Ada mentioned you on region “Wide-angle excess”". */
  summary: string;
  /** A path inside the product, such as /studies/3/entries/12. */
  link: string;
}

/** Records one notification row per recipient, inside the caller's transaction when one is given. */
export async function recordNotifications(event: NotificationEvent, transaction?: Transaction): Promise<number> {
  const recipients = [...new Set(event.userIds)].filter((userId) => userId !== event.actorId);
  if (recipients.length === 0) return 0;
  const summary = event.summary.length > NOTIFICATION_SUMMARY_MAX ? `${event.summary.slice(0, NOTIFICATION_SUMMARY_MAX - 1)}…` : event.summary;
  await db().models.Notification.bulkCreate(
    recipients.map((userId) => ({ userId, kind: event.kind, studyId: event.studyId, actorId: event.actorId, summary, link: event.link })),
    { transaction },
  );
  return recipients.length;
}
