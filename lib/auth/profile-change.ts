// A user's change of their own profile: the name, and the password, which ends every other session (and, unless
// the user keeps them, their API tokens) in the same transaction.
import { badRequest } from '../api/errors';
import { db } from '../db/connection';
import type { User } from '@/models/user';
import { hashPassword, passwordMatches } from './password';
import { endUserSessions } from './server-sessions';

export interface ProfileChange {
  name?: string;
  currentPassword?: string;
  newPassword?: string;
  /** Keep the API tokens when the password changes (default: they are revoked). */
  keepApiTokens?: boolean;
}

export interface ProfileChangeOutcome {
  user: User;
  /** Sessions other than this one that the password change ended (0 without a password change). */
  endedSessions: number;
  revokedTokens: number;
}

/** Checks the current password (400 naming `currentPassword` when wrong), then applies the change. */
export async function changeProfile(
  user: User,
  sessionKey: string | null,
  change: ProfileChange,
  onWrongPassword: () => Promise<void>,
): Promise<ProfileChangeOutcome> {
  let passwordHash: string | null = null;
  if (change.newPassword !== undefined) {
    if (!(await passwordMatches(change.currentPassword ?? '', user.passwordHash))) {
      await onWrongPassword();
      throw badRequest('The current password is wrong.', [
        { path: 'currentPassword', message: 'does not match the password of this account' },
      ]);
    }
    passwordHash = await hashPassword(change.newPassword);
  }
  return db().write(async (transaction) => {
    let endedSessions = 0;
    let revokedTokens = 0;
    if (passwordHash !== null) {
      user.passwordHash = passwordHash;
      endedSessions = await endUserSessions(user.id, sessionKey, transaction);
      if (!change.keepApiTokens) {
        revokedTokens = await db().models.ApiToken.destroy({ where: { userId: user.id }, transaction });
      }
    }
    if (change.name !== undefined) user.name = change.name;
    await user.save({ transaction });
    return { user, endedSessions, revokedTokens };
  });
}
