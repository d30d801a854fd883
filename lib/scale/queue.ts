// The scaled mode's queue on Redis (BullMQ): what its jobs carry and return, their ids and the cancel marks.
// One run of a sample's job is a plan job (cuts the upload into shards), then a flow: one shard job a shard and a
// merge job that starts once every shard is done. Ids name the sample and the attempt, so a retried step never
// adds a second copy and a requeued sample never meets an earlier run's jobs.
import { type ConnectionOptions, Queue } from 'bullmq';
import IORedis from 'ioredis';
import type { FinishedPlane } from '@/lib/jobs/messages';
import type { SampleCounts, SampleInput, SampleSettings } from '@/models/sample-fields';
import type { RowGroupShard } from './row-group-plan';
import type { LineShard, ShardPlan } from './shard-plan';

export const QUEUE_NAME = 'splitfield-processing';

/** One run of one sample's job. */
export interface RunRef {
  sampleId: number;
  attempt: number;
}

export interface PlanJobData extends RunRef {
  uploadKey: string;
  fileSize: number;
  settings: SampleSettings;
  limits: { maxRecords: number; maxTextBytes: number };
}

/** What a shard reads: the whole upload, a byte range of it after the header, or some row groups of a Parquet file. */
export type ShardSource =
  | { kind: 'whole' }
  | { kind: 'lines'; headerEnd: number; footer: string; shard: LineShard }
  | { kind: 'rowGroups'; footerStart: number; shard: RowGroupShard };

export interface ShardJobData extends PlanJobData {
  index: number;
  source: ShardSource;
}

export interface MergeJobData extends RunRef {
  shards: number;
  settings: SampleSettings;
  maxRecords: number;
}

export interface ShardResult {
  index: number;
  /** Where this shard's columns were published. */
  prefix: string;
  counts: SampleCounts;
  input: SampleInput;
}

export interface MergeResult {
  counts: SampleCounts;
  input: SampleInput;
  /** PlaneHistogram bytes in base64 (job results are JSON). */
  planes: Array<{ horizontal: FinishedPlane['horizontal']; base64: string }>;
  shards: number;
}

export function runName({ sampleId, attempt }: RunRef): string {
  return `sample-${sampleId}-attempt-${attempt}`;
}

export const jobIds = {
  plan: (ref: RunRef) => `${runName(ref)}-plan`,
  shard: (ref: RunRef, index: number) => `${runName(ref)}-shard-${index}`,
  merge: (ref: RunRef) => `${runName(ref)}-merge`,
};

/** How long finished jobs stay in Redis: failed ones are shown on the admin page. */
export const KEEP_JOBS = { removeOnComplete: { age: 3600 }, removeOnFail: { age: 7 * 24 * 3600 } };

/** Set when a run has ended (done, failed or cancelled); workers look for it while they work and after publishing. */
export function cancelKey(ref: RunRef): string {
  return `splitfield:cancelled:${runName(ref)}`;
}

/** The shards of a plan as the shard jobs read them. */
export function shardSources(plan: ShardPlan): ShardSource[] {
  if (plan.kind === 'whole') return [{ kind: 'whole' }];
  if (plan.kind === 'rowGroups') return plan.shards.map((shard) => ({ kind: 'rowGroups', footerStart: plan.footerStart, shard }));
  return plan.shards.map((shard) => ({ kind: 'lines', headerEnd: plan.headerEnd, footer: plan.footer, shard }));
}

/** A Redis connection as BullMQ wants it: commands wait for a reconnection rather than fail (a Redis restart). */
export function redisConnection(url: string): IORedis {
  return new IORedis(url, { maxRetriesPerRequest: null, enableOfflineQueue: true });
}

export function processingQueue(connection: ConnectionOptions): Queue {
  return new Queue(QUEUE_NAME, { connection });
}

/** Error reports travel as the failed job's reason: JSON of a JobErrorReport (plain text from elsewhere). */
export function reportOfReason(reason: string | undefined): { code: string; message: string; line: number | null } {
  try {
    const parsed = JSON.parse(reason ?? '') as { code?: unknown; message?: unknown; line?: unknown };
    if (typeof parsed.code === 'string' && typeof parsed.message === 'string') {
      return { code: parsed.code, message: parsed.message, line: typeof parsed.line === 'number' ? parsed.line : null };
    }
  } catch {
    // not a report: the text itself
  }
  return { code: 'internal', message: reason || 'the job failed without a reason', line: null };
}
