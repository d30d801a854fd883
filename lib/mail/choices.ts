// A person's mail choices as the profile page and GET/PATCH /api/me/mail see them.
import type { Transaction } from 'sequelize';
import type { User } from '@/models/user';
import { NOTIFICATION_KINDS, type NotificationKind } from '@/models/vocabulary';

export interface MailChoices {
  /** Each notification kind: mailed (true) or not. */
  kinds: Record<NotificationKind, boolean>;
  /** One digest a day instead of one mail per notification. */
  digest: boolean;
}

export function mailChoicesOf(user: User): MailChoices {
  const off = new Set(user.mailKindsOff);
  return {
    kinds: Object.fromEntries(NOTIFICATION_KINDS.map((kind) => [kind, !off.has(kind)])) as MailChoices['kinds'],
    digest: user.mailDigest,
  };
}

/** Applies a change; turning the digest on starts its day now (the first digest comes a day later). */
export async function changeMailChoices(
  user: User,
  change: { kinds?: Partial<MailChoices['kinds']>; digest?: boolean },
  transaction: Transaction,
): Promise<MailChoices> {
  const kinds = { ...mailChoicesOf(user).kinds, ...change.kinds };
  const mailKindsOff = NOTIFICATION_KINDS.filter((kind) => !kinds[kind]);
  const startsDigest = change.digest === true && !user.mailDigest;
  await user.update(
    { mailKindsOff, mailDigest: change.digest ?? user.mailDigest, ...(startsDigest ? { digestSentAt: new Date() } : {}) },
    { transaction },
  );
  return mailChoicesOf(user);
}
