import { getToken, type JWT } from 'next-auth/jwt';
import { cookies, headers } from 'next/headers';
import type { NextRequest } from 'next/server';
import type { User } from '@/models/user';
import { bearerSecret, userForTokenSecret } from './api-tokens';
import { authSecret } from './secret';
import { db } from '../db/connection';

/**
 * The user a session token speaks for, read afresh from the database: null once the account is disabled,
 * gone, or its sessions were revoked (sessionVersion raised) after the token was issued.
 */
export async function activeUserForToken(token: JWT | null): Promise<User | null> {
  const id = Number(token?.sub);
  if (!token || !Number.isSafeInteger(id)) return null;
  const user = await db().models.User.findByPk(id);
  if (!user || user.disabled || user.sessionVersion !== token.sessionVersion) return null;
  return user;
}

/**
 * The signed-in user of an API request, or null: from a personal API token (`Authorization: Bearer`) when the
 * request carries one, which then decides alone, else from the session cookie.
 */
export async function requestUser(request: NextRequest): Promise<User | null> {
  const secret = bearerSecret(request);
  if (secret !== null) return userForTokenSecret(secret);
  return activeUserForToken(await getToken({ req: request, secret: authSecret() }));
}

/** The signed-in user while rendering a page or layout on the server, or null. */
export async function currentUser(): Promise<User | null> {
  const carrier = { cookies: await cookies(), headers: await headers() };
  // getToken only reads cookies.getAll() and headers.get(), which both of these have.
  return activeUserForToken(await getToken({ req: carrier as unknown as NextRequest, secret: authSecret() }));
}
