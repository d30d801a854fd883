// Turns pending notifications (mailed_at null) into mails by each person's choices: a kind turned off is marked
// dealt with and not sent; one mail per notification, or, for the daily digest, one mail with all of them once
// a day. One transaction: a notification is either queued as mail and marked, or left for the next round.
import { Op } from 'sequelize';
import { db } from '../db/connection';
import type { Notification } from '@/models/notification';
import type { User } from '@/models/user';
import type { MailConfig } from './config';
import { digestMail, notificationMail } from './messages';
import { enqueueMail } from './queue';

/** Notifications looked at per round; the rest wait for the next one. */
const BATCH = 500;

export async function mailPendingNotifications(config: MailConfig, now = new Date()): Promise<number> {
  const { models, write } = db();
  const absolute = (link: string) => `${config.publicUrl}${link.startsWith('/') ? link : `/${link}`}`;
  const profileUrl = absolute('/profile#mail');
  return write(async (transaction) => {
    const pending = await models.Notification.findAll({
      where: { mailedAt: null },
      include: [{ model: models.User, as: 'user', required: true }],
      order: [['id', 'ASC']],
      limit: BATCH,
      transaction,
    });
    const byUser = new Map<number, { user: User; rows: Notification[] }>();
    for (const row of pending) {
      const user = (row as Notification & { user: User }).user;
      const group = byUser.get(user.id) ?? { user, rows: [] };
      group.rows.push(row);
      byUser.set(user.id, group);
    }
    const dealtWith: number[] = [];
    let queued = 0;
    for (const { user, rows } of byUser.values()) {
      const off = new Set(user.mailKindsOff);
      const wanted = user.disabled ? [] : rows.filter((row) => !off.has(row.kind));
      dealtWith.push(...rows.filter((row) => !wanted.includes(row)).map((row) => row.id));
      if (wanted.length === 0) continue;
      if (!user.mailDigest) {
        for (const row of wanted) {
          const mail = notificationMail({ kind: row.kind, summary: row.summary, url: absolute(row.link), profileUrl });
          await enqueueMail({ to: user.email, userId: user.id, purpose: 'notification', mail }, transaction);
        }
      } else {
        const last = user.digestSentAt?.getTime() ?? 0;
        if (now.getTime() - last < config.digestSeconds * 1000) continue;
        const mail = digestMail({ items: wanted.map((row) => ({ summary: row.summary, url: absolute(row.link) })), profileUrl });
        await enqueueMail({ to: user.email, userId: user.id, purpose: 'digest', mail }, transaction);
        await user.update({ digestSentAt: now }, { transaction });
      }
      dealtWith.push(...wanted.map((row) => row.id));
      queued += wanted.length;
    }
    if (dealtWith.length > 0) {
      await models.Notification.update({ mailedAt: now }, { where: { id: { [Op.in]: dealtWith } }, transaction });
    }
    return queued;
  });
}
