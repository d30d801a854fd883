// The scaled mode's settings, from the environment (README "Running on many machines"): the queue is on when
// SPLITFIELD_REDIS_URL is set.
import { z } from 'zod';
import { checkedEnvironment, type Environment, wholeNumberVariable } from '@/lib/config/environment';

export interface QueueSettings {
  /** redis://[user:password@]host:port[/db] (SPLITFIELD_REDIS_URL). */
  redisUrl: string;
  /** Plain-text uploads larger than this are cut into shards of about this size (SPLITFIELD_SHARD_BYTES, 64 MiB). */
  shardBytes: number;
  /** Tries of one shard before its sample fails (SPLITFIELD_SHARD_ATTEMPTS, 3). */
  attempts: number;
  /** First wait before a retry, doubled each time (SPLITFIELD_RETRY_DELAY_MS, 2000). */
  retryDelayMs: number;
  /** A worker that has not renewed a job's lock for this long is taken for dead (SPLITFIELD_QUEUE_LOCK_MS, 30000). */
  lockMs: number;
}

const environmentSchema = z.object({
  SPLITFIELD_REDIS_URL: z.url({ protocol: /^rediss?$/ }).optional(),
  SPLITFIELD_SHARD_BYTES: wholeNumberVariable(1024).optional(),
  SPLITFIELD_SHARD_ATTEMPTS: wholeNumberVariable(1).optional(),
  SPLITFIELD_RETRY_DELAY_MS: wholeNumberVariable(0).optional(),
  SPLITFIELD_QUEUE_LOCK_MS: wholeNumberVariable(1000).optional(),
});

/** The queue's settings, or null in the embedded mode (no SPLITFIELD_REDIS_URL). */
export function readQueueSettings(env: Environment = process.env): QueueSettings | null {
  const values = checkedEnvironment(environmentSchema, env);
  if (!values.SPLITFIELD_REDIS_URL) return null;
  return {
    redisUrl: values.SPLITFIELD_REDIS_URL,
    shardBytes: values.SPLITFIELD_SHARD_BYTES ?? 64 * 1024 * 1024,
    attempts: values.SPLITFIELD_SHARD_ATTEMPTS ?? 3,
    retryDelayMs: values.SPLITFIELD_RETRY_DELAY_MS ?? 2000,
    lockMs: values.SPLITFIELD_QUEUE_LOCK_MS ?? 30_000,
  };
}
