// Limits of sign-in, sign-up, password, token, password-reset and invitation attempts and of comments, read from the
// environment (README "Configuration").
import { z } from 'zod';
import { checkedEnvironment, type Environment } from '../config/environment';

export interface ThrottleConfig {
  /** Failed sign-ins (and wrong current passwords) of one account per window. */
  accountFailures: number;
  /** Failed sign-ins, wrong passwords and unknown API tokens from one client address per window. */
  addressFailures: number;
  /** Sign-up attempts from one client address per window. */
  signupsPerAddress: number;
  /** API tokens one user may make per window. */
  tokensPerUser: number;
  /** Password reset requests from one client address per window (429 past it). */
  resetsPerAddress: number;
  /** Reset mails to one account per window (past it, requests are answered alike but send nothing). */
  resetsPerAccount: number;
  /** Invitations one user may send per window. */
  invitationsPerUser: number;
  /** Comments one person may post per minute (over all studies). */
  commentsPerMinute: number;
  windowSeconds: number;
  /** Take the client address from X-Forwarded-For (behind a reverse proxy that sets it). */
  trustProxy: boolean;
}

/** A whole number of at least 1; empty means unset (the default). */
const count = z
  .string()
  .trim()
  .transform((text) => (text === '' ? undefined : text))
  .pipe(z.string().regex(/^\d+$/, 'must be a whole number').transform(Number).refine((n) => n >= 1, 'must be at least 1').optional());

const environmentSchema = z.object({
  SPLITFIELD_SIGNIN_ACCOUNT_FAILURES: count.optional(),
  SPLITFIELD_SIGNIN_ADDRESS_FAILURES: count.optional(),
  SPLITFIELD_SIGNUPS_PER_ADDRESS: count.optional(),
  SPLITFIELD_TOKENS_PER_USER: count.optional(),
  SPLITFIELD_RESETS_PER_ADDRESS: count.optional(),
  SPLITFIELD_RESETS_PER_ACCOUNT: count.optional(),
  SPLITFIELD_INVITATIONS_PER_USER: count.optional(),
  SPLITFIELD_COMMENTS_PER_MINUTE: count.optional(),
  SPLITFIELD_THROTTLE_WINDOW_SECONDS: count.optional(),
  SPLITFIELD_TRUST_PROXY: z.enum(['0', '1', 'false', 'true', '']).optional(),
});

export function readThrottleConfig(env: Environment = process.env): ThrottleConfig {
  const values = checkedEnvironment(environmentSchema, env);
  return {
    accountFailures: values.SPLITFIELD_SIGNIN_ACCOUNT_FAILURES ?? 10,
    addressFailures: values.SPLITFIELD_SIGNIN_ADDRESS_FAILURES ?? 50,
    signupsPerAddress: values.SPLITFIELD_SIGNUPS_PER_ADDRESS ?? 20,
    tokensPerUser: values.SPLITFIELD_TOKENS_PER_USER ?? 30,
    resetsPerAddress: values.SPLITFIELD_RESETS_PER_ADDRESS ?? 10,
    resetsPerAccount: values.SPLITFIELD_RESETS_PER_ACCOUNT ?? 3,
    invitationsPerUser: values.SPLITFIELD_INVITATIONS_PER_USER ?? 50,
    commentsPerMinute: values.SPLITFIELD_COMMENTS_PER_MINUTE ?? 20,
    windowSeconds: values.SPLITFIELD_THROTTLE_WINDOW_SECONDS ?? 900,
    trustProxy: values.SPLITFIELD_TRUST_PROXY === '1' || values.SPLITFIELD_TRUST_PROXY === 'true',
  };
}
