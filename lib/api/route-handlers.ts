// Wraps route handlers: session check, path parameters, and one error format for every failure.
import type { NextRequest } from 'next/server';
import { UniqueConstraintError } from 'sequelize';
import type { z } from 'zod';
import type { User } from '@/models/user';
import { ApiError, conflict, unauthenticated } from './errors';
import { requireSameOrigin } from './request-origin';
import { readRouteParams } from './validation';
import { bearerSecret } from '../auth/api-tokens';
import { requestUser } from '../auth/session';
import { requireSiteAdmin } from '../auth/study-access';

interface NextRouteContext {
  params: Promise<Record<string, string | string[]>>;
}
export type RouteHandler = (request: NextRequest, context: NextRouteContext) => Promise<Response>;

export interface SignedInContext<P> {
  request: NextRequest;
  params: P;
  /** Read from the database for this request: enabled, with a session that was not revoked. */
  user: User;
}

interface SignedInOptions<P> {
  params?: z.ZodType<P>;
  adminOnly?: boolean;
}

const NO_STORE = { 'Cache-Control': 'no-store' };

export function json(body: unknown, status = 200): Response {
  return Response.json(body, { status, headers: NO_STORE });
}

export function noContent(): Response {
  return new Response(null, { status: 204, headers: NO_STORE });
}

async function answer(work: () => Promise<Response>): Promise<Response> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof ApiError) return error.toResponse();
    // Two requests raced past the explicit duplicate check; the unique index kept the data right. (SQLite
    // reports other constraint failures with the same class, but without the offending fields.)
    if (error instanceof UniqueConstraintError && error.errors.length > 0) {
      return conflict('conflict', 'This already exists; reload and try again.').toResponse();
    }
    console.error('[api] unexpected error', error);
    return new ApiError(500, 'internal', 'Something went wrong on the server; the change was not saved.').toResponse();
  }
}

/** A route anyone may call, signed in or not; a data-changing call must come from this site (or no browser). */
export function publicRoute(handler: (request: NextRequest) => Promise<Response>): RouteHandler {
  return (request) =>
    answer(() => {
      requireSameOrigin(request);
      return handler(request);
    });
}

/** A route for signed-in users (401 otherwise), optionally site admins only (403 otherwise). */
export function signedInRoute<P = Record<string, never>>(
  options: SignedInOptions<P>,
  handler: (context: SignedInContext<P>) => Promise<Response>,
): RouteHandler {
  return (request, context) =>
    answer(async () => {
      // A session cookie is sent by the browser whoever asks for it; a bearer token only by who holds it.
      if (bearerSecret(request) === null) requireSameOrigin(request);
      const user = await requestUser(request);
      if (!user) throw unauthenticated();
      if (options.adminOnly) requireSiteAdmin(user);
      const params = options.params ? readRouteParams(await context.params, options.params) : ({} as P);
      return handler({ request, params, user });
    });
}
