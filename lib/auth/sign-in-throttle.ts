// Sign-in attempts through next-auth's credentials callback, throttled: failed attempts are counted per account
// (e-mail) and per client address; over either limit the attempt is answered 429 before the password is even
// checked, with the wait in the Retry-After header and in the error code the sign-in form reads
// ("TooManyAttempts:<seconds>"). A successful sign-in forgets the account's failures.
import { NextRequest } from 'next/server';
import { readLimitedText } from '../api/body';
import { BODY_LIMITS } from '../api/body-limits';
import { clientAddress } from '../api/client-address';
import { ApiError } from '../api/errors';
import { SIGN_IN_PATH } from './paths';
import { countAttempt, forgetAttempts, requireNotThrottled, throttleConfig, TooManyAttempts } from './throttle';

export const TOO_MANY_ATTEMPTS = 'TooManyAttempts';

type AuthHandler = (request: NextRequest) => Promise<Response>;

function isCredentialsCallback(request: NextRequest): boolean {
  return request.method === 'POST' && request.nextUrl.pathname.endsWith('/callback/credentials');
}

/** The e-mail of the sign-in form, as accounts are keyed (trimmed, lower case). */
function formEmail(request: NextRequest, text: string): string {
  const json = (request.headers.get('content-type') ?? '').includes('application/json');
  let email: unknown;
  try {
    email = json ? (JSON.parse(text) as Record<string, unknown>)?.email : new URLSearchParams(text).get('email');
  } catch {
    email = undefined;
  }
  return typeof email === 'string' ? email.trim().toLowerCase() : '';
}

/** The error code of next-auth's answer: in `{url}` (json: true) or in the redirect's address. */
async function signInError(response: Response): Promise<string | null> {
  let target = response.headers.get('location');
  if (!target) {
    const body = (await response.clone().json().catch(() => null)) as { url?: unknown } | null;
    target = typeof body?.url === 'string' ? body.url : null;
  }
  if (!target) return null;
  try {
    return new URL(target, 'http://localhost').searchParams.get('error');
  } catch {
    return null;
  }
}

function throttledAnswer(request: NextRequest, error: TooManyAttempts): Response {
  const url = new URL(SIGN_IN_PATH, request.nextUrl.origin);
  url.searchParams.set('error', `${TOO_MANY_ATTEMPTS}:${error.retryAfterSeconds}`);
  const body = { url: url.toString(), error: { code: error.code, message: error.message, details: error.details } };
  return Response.json(body, {
    status: 429,
    headers: { 'Retry-After': String(error.retryAfterSeconds), 'Cache-Control': 'no-store' },
  });
}

export async function throttledAuth(request: NextRequest, handle: AuthHandler): Promise<Response> {
  if (!isCredentialsCallback(request)) return handle(request);
  let text: string;
  try {
    text = await readLimitedText(request, BODY_LIMITS.account);
  } catch (error) {
    if (error instanceof ApiError) return error.toResponse();
    throw error;
  }
  const email = formEmail(request, text);
  const address = clientAddress(request, throttleConfig().trustProxy);
  try {
    await requireNotThrottled('failed sign-in attempts', [
      ['accountFailure', email],
      ['addressFailure', address],
    ]);
  } catch (error) {
    if (error instanceof TooManyAttempts) return throttledAnswer(request, error);
    throw error;
  }
  const response = await handle(new NextRequest(request.url, { method: 'POST', headers: request.headers, body: text }));
  const error = await signInError(response);
  if (error === 'CredentialsSignin') {
    await countAttempt('accountFailure', email);
    await countAttempt('addressFailure', address);
  } else if (error === null && response.status < 400) {
    await forgetAttempts('accountFailure', email);
  }
  return response;
}
