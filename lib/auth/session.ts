import { getToken, type JWT } from 'next-auth/jwt';
import { cookies, headers } from 'next/headers';
import type { NextRequest } from 'next/server';
import type { User } from '@/models/user';
import { clientAddress } from '../api/client-address';
import { bearerSecret, userForTokenSecret } from './api-tokens';
import { countAttempt, requireNotThrottled, throttleConfig } from './throttle';
import { authSecret } from './secret';
import { serverSessionIsOpen } from './server-sessions';
import { db } from '../db/connection';

/**
 * The user a session token speaks for, read afresh from the database: null once the account is disabled or
 * gone, its sessions were revoked (sessionVersion raised) after the token was issued, or this session was
 * ended on the server (its row is gone: signed out, password changed elsewhere, signed out everywhere).
 */
export async function activeUserForToken(token: JWT | null): Promise<User | null> {
  const id = Number(token?.sub);
  if (!token || !Number.isSafeInteger(id)) return null;
  const user = await db().models.User.findByPk(id);
  if (!user || user.disabled || user.sessionVersion !== token.sessionVersion) return null;
  if (!(await serverSessionIsOpen(user.id, token.sid))) return null;
  return user;
}

/** The key of the request's session cookie (null for a bearer token or no session). */
export async function requestSessionKey(request: NextRequest): Promise<string | null> {
  if (bearerSecret(request) !== null) return null;
  const token = await getToken({ req: request, secret: authSecret() });
  return typeof token?.sid === 'string' ? token.sid : null;
}

/**
 * The signed-in user of an API request, or null: from a personal API token (`Authorization: Bearer`) when the
 * request carries one, which then decides alone, else from the session cookie.
 */
export async function requestUser(request: NextRequest): Promise<User | null> {
  const secret = bearerSecret(request);
  if (secret !== null) {
    // Guessing tokens is throttled like guessing passwords: unknown tokens count against the client address.
    const address = clientAddress(request, throttleConfig().trustProxy);
    await requireNotThrottled('requests with an unknown or revoked API token', [['addressFailure', address]]);
    const user = await userForTokenSecret(secret);
    if (!user) await countAttempt('addressFailure', address);
    return user;
  }
  return activeUserForToken(await getToken({ req: request, secret: authSecret() }));
}

/** The signed-in user while rendering a page or layout on the server, or null. */
export async function currentUser(): Promise<User | null> {
  const carrier = { cookies: await cookies(), headers: await headers() };
  // getToken only reads cookies.getAll() and headers.get(), which both of these have.
  return activeUserForToken(await getToken({ req: carrier as unknown as NextRequest, secret: authSecret() }));
}
