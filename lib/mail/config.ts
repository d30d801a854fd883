// Mail settings from the environment (README "Mail"). Without SPLITFIELD_SMTP_HOST the server starts its own
// local stand-in mail server on 127.0.0.1 and every mail lands in the database, readable on the admins' Outbox.
import { z } from 'zod';
import { checkedEnvironment, type Environment } from '../config/environment';

export interface MailConfig {
  /** A real SMTP server, or null for the local stand-in. */
  smtp: { host: string; port: number; secure: boolean; user: string | null; password: string | null } | null;
  /** Port of the local stand-in (0: any free port). */
  localPort: number;
  from: string;
  /** The address people use in a browser: links in mails start with it. */
  publicUrl: string;
  /** Seconds before the first retry of a failed mail; each further retry waits twice as long (at most an hour). */
  retrySeconds: number;
  /** Attempts before a mail is given up as failed. */
  maxAttempts: number;
  /** How often the mailer looks for due mails and new notifications. */
  pollSeconds: number;
  /** Time between two digests of one person (a day). */
  digestSeconds: number;
}

const wholeNumber = (min: number) =>
  z
    .string()
    .trim()
    .regex(/^\d+$/, 'must be a whole number')
    .transform(Number)
    .refine((n) => n >= min, `must be at least ${min}`);

const environmentSchema = z.object({
  SPLITFIELD_SMTP_HOST: z.string().trim().optional(),
  SPLITFIELD_SMTP_PORT: wholeNumber(1).refine((n) => n <= 65535, 'must be at most 65535').optional(),
  SPLITFIELD_SMTP_SECURE: z.enum(['0', '1', 'false', 'true', '']).optional(),
  SPLITFIELD_SMTP_USER: z.string().optional(),
  SPLITFIELD_SMTP_PASSWORD: z.string().optional(),
  SPLITFIELD_LOCAL_SMTP_PORT: wholeNumber(0).refine((n) => n <= 65535, 'must be at most 65535').optional(),
  SPLITFIELD_MAIL_FROM: z.string().trim().min(3).optional(),
  SPLITFIELD_MAIL_RETRY_SECONDS: wholeNumber(1).optional(),
  SPLITFIELD_MAIL_MAX_ATTEMPTS: wholeNumber(1).optional(),
  SPLITFIELD_MAIL_POLL_SECONDS: wholeNumber(1).optional(),
  SPLITFIELD_DIGEST_SECONDS: wholeNumber(1).optional(),
  NEXTAUTH_URL: z.url({ error: 'must be a URL such as https://splitfield.example.org' }).optional(),
});

export function readMailConfig(env: Environment = process.env): MailConfig {
  const values = checkedEnvironment(environmentSchema, env);
  const secure = values.SPLITFIELD_SMTP_SECURE === '1' || values.SPLITFIELD_SMTP_SECURE === 'true';
  const host = values.SPLITFIELD_SMTP_HOST || null;
  return {
    smtp: host
      ? {
          host,
          port: values.SPLITFIELD_SMTP_PORT ?? (secure ? 465 : 587),
          secure,
          user: values.SPLITFIELD_SMTP_USER || null,
          password: values.SPLITFIELD_SMTP_PASSWORD || null,
        }
      : null,
    localPort: values.SPLITFIELD_LOCAL_SMTP_PORT ?? 0,
    from: values.SPLITFIELD_MAIL_FROM ?? 'Splitfield <splitfield@localhost>',
    publicUrl: (values.NEXTAUTH_URL ?? 'http://127.0.0.1:3000').replace(/\/+$/, ''),
    retrySeconds: values.SPLITFIELD_MAIL_RETRY_SECONDS ?? 30,
    maxAttempts: values.SPLITFIELD_MAIL_MAX_ATTEMPTS ?? 8,
    pollSeconds: values.SPLITFIELD_MAIL_POLL_SECONDS ?? 2,
    digestSeconds: values.SPLITFIELD_DIGEST_SECONDS ?? 24 * 60 * 60,
  };
}

/** Wait before the next attempt after `attempts` failed ones: retrySeconds · 2^(attempts−1), at most an hour. */
export function retryDelayMs(config: Pick<MailConfig, 'retrySeconds'>, attempts: number): number {
  return Math.min(config.retrySeconds * 2 ** Math.max(0, attempts - 1), 3600) * 1000;
}
