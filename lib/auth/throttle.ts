// Throttling of guessable or costly requests, in memory (one server per storage folder): failed sign-ins per
// account and per client address, sign-ups per address, wrong current passwords, unknown API tokens, new tokens,
// password reset requests (per address and per account), invitations per user, and comments per person (a burst is
// refused; the comments already accepted stay).
// A request over a limit gets 429 with the seconds until it may be tried again (Retry-After).
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { ApiError } from '../api/errors';
import { retryAfterText } from './retry-after';
import { readThrottleConfig, type ThrottleConfig } from './throttle-config';

export type ThrottleKind = 'accountFailure' | 'addressFailure' | 'signup' | 'newToken' | 'resetAddress' | 'resetAccount' | 'invitation' | 'comment';

interface Throttles {
  config: ThrottleConfig;
  limiters: Record<ThrottleKind, RateLimiterMemory>;
}

const processWideKey = Symbol.for('splitfield.throttles');
type ProcessWide = typeof globalThis & { [processWideKey]?: Throttles };

/** The process's limiters; kept on globalThis because the bundler may load this module once per route. */
function throttles(): Throttles {
  const holder = globalThis as ProcessWide;
  if (!holder[processWideKey]) {
    const config = readThrottleConfig();
    const limiter = (points: number, keyPrefix: string, duration = config.windowSeconds) =>
      new RateLimiterMemory({ points, duration, keyPrefix });
    holder[processWideKey] = {
      config,
      limiters: {
        accountFailure: limiter(config.accountFailures, 'account'),
        addressFailure: limiter(config.addressFailures, 'address'),
        signup: limiter(config.signupsPerAddress, 'signup'),
        newToken: limiter(config.tokensPerUser, 'token'),
        resetAddress: limiter(config.resetsPerAddress, 'reset-address'),
        resetAccount: limiter(config.resetsPerAccount, 'reset-account'),
        invitation: limiter(config.invitationsPerUser, 'invitation'),
        comment: limiter(config.commentsPerMinute, 'comment', 60),
      },
    };
  }
  return holder[processWideKey];
}

export function throttleConfig(): ThrottleConfig {
  return throttles().config;
}

/** Seconds until `key` may try again under `kind`, or 0 when it may now. */
export async function secondsBlocked(kind: ThrottleKind, key: string): Promise<number> {
  const limiter = throttles().limiters[kind];
  const state = await limiter.get(key);
  if (!state || state.consumedPoints < limiter.points) return 0;
  return Math.max(1, Math.ceil(state.msBeforeNext / 1000));
}

/** Counts one attempt (or failure) of `key`. */
export async function countAttempt(kind: ThrottleKind, key: string): Promise<void> {
  try {
    await throttles().limiters[kind].consume(key);
  } catch (error) {
    // Over the limit: the next check refuses; the count itself has nothing more to say.
    if (!(error instanceof RateLimiterRes)) throw error;
  }
}

/** Forgets the attempts of `key` (after a successful sign-in, an account's failures no longer count). */
export async function forgetAttempts(kind: ThrottleKind, key: string): Promise<void> {
  await throttles().limiters[kind].delete(key);
}

/** 429 with the time to wait, in the message, in `retryAfterSeconds` and in the Retry-After header. */
export class TooManyAttempts extends ApiError {
  constructor(
    readonly retryAfterSeconds: number,
    what: string,
  ) {
    super(429, 'too_many_attempts', `Too many ${what}. Try again in ${retryAfterText(retryAfterSeconds)}.`, [
      { path: '(request)', message: `retry after ${retryAfterSeconds} seconds` },
    ]);
  }

  override toResponse(): Response {
    const response = super.toResponse();
    response.headers.set('Retry-After', String(this.retryAfterSeconds));
    return response;
  }
}

/** 429 when any of the checks is over its limit (the longest wait is named). */
export async function requireNotThrottled(what: string, checks: Array<[ThrottleKind, string]>): Promise<void> {
  const waits = await Promise.all(checks.map(([kind, key]) => secondsBlocked(kind, key)));
  const wait = Math.max(0, ...waits);
  if (wait > 0) throw new TooManyAttempts(wait, what);
}

/**
 * Uses one of `key`'s allowance under `kind` before the action it pays for; 429 (nothing done) when none is left.
 * Counting first, in one step, keeps requests that arrive together from slipping past the limit.
 */
export async function takeAllowance(kind: ThrottleKind, key: string, what: string): Promise<void> {
  try {
    await throttles().limiters[kind].consume(key);
  } catch (error) {
    if (!(error instanceof RateLimiterRes)) throw error;
    throw new TooManyAttempts(Math.max(1, Math.ceil(error.msBeforeNext / 1000)), what);
  }
}
