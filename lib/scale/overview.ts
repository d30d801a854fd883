// The processing overview of the admin page: the queue's length, the jobs under way and the failed ones (the
// scaled mode), or the samples this server's threads work on (the embedded mode). Types are shared with the page.
import type { Job } from 'bullmq';

export interface OverviewJob {
  id: string;
  kind: string;
  sampleId: number | null;
  /** 0-based shard of a shard job. */
  shard: number | null;
  /** Tries made so far (1 on the first). */
  attempts: number;
  startedAt: string | null;
}

export interface ProcessingOverview {
  mode: 'embedded' | 'queue';
  /** Where files live: the storage folder or the bucket. */
  store: string;
  counts: { waiting: number; running: number; delayed: number; failed: number };
  running: Array<OverviewJob & { worker: string | null; fraction: number | null }>;
  failed: Array<OverviewJob & { reason: string }>;
}

export function jobView(job: Job): OverviewJob {
  const data = job.data as { sampleId?: number; index?: number };
  return {
    id: job.id ?? '',
    kind: job.name,
    sampleId: data.sampleId ?? null,
    shard: job.name === 'shard' ? (data.index ?? null) : null,
    attempts: Math.max(1, job.attemptsMade + (job.finishedOn ? 0 : 1)),
    startedAt: job.processedOn ? new Date(job.processedOn).toISOString() : null,
  };
}

/** The fraction of its bytes a shard job has read (null for other jobs). */
export function fractionOf(job: Job): number | null {
  const progress = job.progress as { bytesRead?: number; bytesTotal?: number | null } | number;
  if (typeof progress !== 'object' || !progress.bytesTotal) return null;
  return Math.min(1, (progress.bytesRead ?? 0) / progress.bytesTotal);
}
