// Password reset by mail. A request names an address and is always answered alike, whether an account has it or
// not; an enabled account gets a signed, single-use link that expires within the hour. Using it sets the new
// password and ends every session and API token of the account, in one transaction.
import type { Transaction } from 'sequelize';
import { ApiError } from '../api/errors';
import { db } from '../db/connection';
import { readMailConfig } from '../mail/config';
import { passwordResetMail } from '../mail/messages';
import { enqueueMail } from '../mail/queue';
import type { User } from '@/models/user';
import { linkExpired, linkInvalid, linkUsed } from './link-errors';
import { hashPassword } from './password';
import { endUserSessions } from './server-sessions';
import { newSignedToken, signedTokenHash } from './signed-links';
import { countAttempt, secondsBlocked } from './throttle';

export const RESET_LINK_MINUTES = 60;

/** Queues a reset mail for the enabled account of `email`, unless that account had its share of them lately. */
export async function requestPasswordReset(email: string): Promise<void> {
  const { models, write } = db();
  const user = await models.User.findOne({ where: { email, disabled: false } });
  if (!user || (await secondsBlocked('resetAccount', String(user.id))) > 0) return;
  await countAttempt('resetAccount', String(user.id));
  const { token, secretHash } = newSignedToken('password-reset');
  const expiresAt = new Date(Date.now() + RESET_LINK_MINUTES * 60 * 1000);
  const url = `${readMailConfig().publicUrl}/reset-password/${token}`;
  await write(async (transaction) => {
    await models.PasswordReset.create({ userId: user.id, secretHash, expiresAt }, { transaction });
    await enqueueMail({ to: user.email, userId: user.id, purpose: 'password-reset', mail: passwordResetMail({ email, url, expiresAt }) }, transaction);
  });
}

async function usableReset(token: string, transaction?: Transaction) {
  const secretHash = signedTokenHash('password-reset', token);
  const reset = secretHash && (await db().models.PasswordReset.findOne({ where: { secretHash }, transaction }));
  if (!reset) throw linkInvalid('password reset');
  if (reset.usedAt) throw linkUsed('password reset');
  if (reset.expiresAt.getTime() <= Date.now()) throw linkExpired('password reset', reset.expiresAt);
  return reset;
}

export interface ResetOutcome {
  user: User;
  endedSessions: number;
  revokedTokens: number;
}

/** Sets the new password through the link; every other reset link of the account is spent too. */
export async function completePasswordReset(token: string, newPassword: string): Promise<ResetOutcome> {
  const passwordHash = await hashPassword(newPassword);
  const { models, write } = db();
  return write(async (transaction) => {
    const reset = await usableReset(token, transaction);
    const user = await models.User.findByPk(reset.userId, { transaction, rejectOnEmpty: true });
    if (user.disabled) throw linkInvalid('password reset');
    await models.PasswordReset.update({ usedAt: new Date() }, { where: { userId: user.id, usedAt: null }, transaction });
    await user.update({ passwordHash }, { transaction });
    const endedSessions = await endUserSessions(user.id, null, transaction);
    const revokedTokens = await models.ApiToken.destroy({ where: { userId: user.id }, transaction });
    return { user, endedSessions, revokedTokens };
  });
}

/** Whether a reset link may still be used, for its page: null when it may, else the reason. */
export async function resetLinkProblem(token: string): Promise<string | null> {
  try {
    await usableReset(token);
    return null;
  } catch (error) {
    if (error instanceof ApiError) return error.message;
    throw error;
  }
}
