// Personal API tokens: scripts send `Authorization: Bearer <secret>` instead of a session cookie. The secret is
// shown once when made; the database keeps only its SHA-256, so a copy of the database cannot be used to sign in.
import { createHash, randomBytes } from 'node:crypto';
import type { User } from '@/models/user';
import { db } from '../db/connection';

const SECRET_PREFIX = 'sft_';
/** Characters of the secret shown in token lists to tell tokens apart. */
const SHOWN_PREFIX_LENGTH = SECRET_PREFIX.length + 6;
/** A token's last use is written at most this often, so reading with a token does not write every time. */
const LAST_USED_RESOLUTION_MS = 60_000;

function secretHash(secret: string): string {
  return createHash('sha256').update(secret).digest('hex');
}

export function newTokenSecret(): { secret: string; prefix: string; secretHash: string } {
  const secret = `${SECRET_PREFIX}${randomBytes(32).toString('base64url')}`;
  return { secret, prefix: secret.slice(0, SHOWN_PREFIX_LENGTH), secretHash: secretHash(secret) };
}

/** The secret of an `Authorization: Bearer` header, or null when the request has none. */
export function bearerSecret(request: Request): string | null {
  const match = /^Bearer\s+(\S+)\s*$/i.exec(request.headers.get('authorization') ?? '');
  return match ? match[1] : null;
}

/** The enabled user a token secret belongs to; null for a revoked or unknown token or a disabled account. */
export async function userForTokenSecret(secret: string): Promise<User | null> {
  const { models, write } = db();
  const token = await models.ApiToken.findOne({
    where: { secretHash: secretHash(secret) },
    include: [{ model: models.User, as: 'user', required: true }],
  });
  if (!token?.user || token.user.disabled) return null;
  const now = new Date();
  if (!token.lastUsedAt || now.getTime() - token.lastUsedAt.getTime() > LAST_USED_RESOLUTION_MS) {
    await write((transaction) => token.update({ lastUsedAt: now }, { transaction }));
  }
  return token.user;
}
