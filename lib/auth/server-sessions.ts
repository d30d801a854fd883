// Sessions recorded on the server. A session token (next-auth's JWT cookie) names its row by a random key; the
// token counts only while the row exists and has not expired, so ending a session deletes its row: a sign-out,
// a password change (every other session), "sign out everywhere", disabling the account.
import { randomBytes } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { db } from '../db/connection';

/** Sessions last a working fortnight. */
export const SESSION_MAX_AGE_SECONDS = 14 * 24 * 60 * 60;

/** Records a new session of the user (removing the user's expired ones) and returns its key. */
export async function startServerSession(userId: number): Promise<string> {
  const key = randomBytes(24).toString('base64url');
  const now = Date.now();
  const { models, write } = db();
  await write(async (transaction) => {
    await models.SignInSession.destroy({ where: { userId, expiresAt: { [Op.lt]: new Date(now) } }, transaction });
    await models.SignInSession.create(
      { key, userId, expiresAt: new Date(now + SESSION_MAX_AGE_SECONDS * 1000) },
      { transaction },
    );
  });
  return key;
}

/** Whether the session of this key is open for this user. */
export async function serverSessionIsOpen(userId: number, key: unknown): Promise<boolean> {
  if (typeof key !== 'string' || key === '') return false;
  const session = await db().models.SignInSession.findOne({ where: { key, userId } });
  return session !== null && session.expiresAt.getTime() > Date.now();
}

export async function endServerSession(key: unknown): Promise<void> {
  if (typeof key !== 'string' || key === '') return;
  await db().write((transaction) => db().models.SignInSession.destroy({ where: { key }, transaction }));
}

/** Ends every session of the user except the one of `keepKey` (null: all of them); returns how many ended. */
export function endUserSessions(userId: number, keepKey: string | null, transaction: Transaction): Promise<number> {
  return db().models.SignInSession.destroy({
    where: { userId, ...(keepKey === null ? {} : { key: { [Op.ne]: keepKey } }) },
    transaction,
  });
}

/** Ends every session of the user ("sign out everywhere"). */
export async function endEverySession(userId: number): Promise<void> {
  await db().write((transaction) => endUserSessions(userId, null, transaction));
}
