// The web server's side of the scaled mode: it claims queued samples fairly (the same rule and limits as the
// embedded runner: fair-order.ts, SPLITFIELD_MAX_JOBS samples in flight), adds each run's plan job to the queue,
// follows its shards' progress and records the outcome in SQLite, of which it stays the only writer. Workers do
// the processing (queue-worker.ts). A restart of the web server finds the runs still in the queue and follows
// them again; runs the queue no longer knows are requeued by the usual rule.
import { mkdir } from 'node:fs/promises';
import type { Job, Queue } from 'bullmq';
import type IORedis from 'ioredis';
import { db } from '@/lib/db/connection';
import type { PipelineProgress } from '@/lib/ingest/pipeline/sink';
import { sampleError, type JobErrorReport } from '@/lib/jobs/failure';
import { progressView } from '@/lib/jobs/progress';
import { logStartUp, recordDone, recordEnded, recordInput, recordProgress, requeueInterrupted } from '@/lib/jobs/sample-states';
import { uploadKey, workPrefix } from '@/lib/objects/keys';
import { objectStore } from '@/lib/objects/config';
import { type ObjectStore, removePrefix } from '@/lib/objects/object-store';
import type { SampleConfig } from '@/lib/samples/config';
import { tablesFolderOf } from '@/lib/samples/sharing';
import { removeSampleFiles, removeUpload, type SampleStorage, sweepUnowned } from '@/lib/samples/storage';
import { raiseUpload, storedUploadNames } from '@/lib/samples/upload-files';
import type { Sample } from '@/models/sample';
import type { QueueSettings } from './config';
import { fractionOf, jobView, type ProcessingOverview } from './overview';
import {
  cancelKey,
  jobIds,
  KEEP_JOBS,
  type MergeResult,
  type PlanJobData,
  processingQueue,
  redisConnection,
  reportOfReason,
  type RunRef,
  runName,
} from './queue';
import { claimWhileRoom, WakeLoop } from '@/lib/jobs/wake-loop';

/** How often running samples are looked at in the queue. */
const FOLLOW_MS = 1000;
/** Queued samples are also looked for this often, in case a wake-up was missed. */
const POLL_MS = 5000;
/** Cancel marks outlive any run. */
const CANCEL_MARK_SECONDS = 24 * 3600;
/** Work objects a cancelled shard may still be writing are removed again after this. */
const LATE_CLEANUP_MS = 30_000;

interface Run extends RunRef {
  sample: Sample;
  startedAt: number;
  /** Its plan job is in the queue (until then there is nothing to look at). */
  enqueued: boolean;
  concluding: boolean;
}

function logFailure(what: string, error: unknown): void {
  console.error(`[queue] ${what}:`, error);
}

export class QueueRunner {
  private readonly running = new Map<number, Run>();
  private readonly connection: IORedis;
  readonly queue: Queue;
  private readonly store: ObjectStore;
  private readonly filling = new WakeLoop(
    () => this.fill(),
    (error) => logFailure('cannot queue samples', error),
  );
  private following = false;

  constructor(
    private readonly config: SampleConfig,
    private readonly storage: SampleStorage,
    private readonly settings: QueueSettings,
  ) {
    this.connection = redisConnection(settings.redisUrl);
    this.connection.on('error', (error) => logFailure('Redis', error.message));
    this.queue = processingQueue(this.connection);
    this.store = storage.remote ?? objectStore();
  }

  async start(): Promise<void> {
    await mkdir(this.storage.uploadsDir, { recursive: true });
    const models = db().models;
    const carryOn = new Set<number>();
    for (const sample of await models.Sample.findAll({ where: { state: 'running' } })) {
      const ref = { sampleId: sample.id, attempt: sample.attempts };
      if (await this.queue.getJob(jobIds.plan(ref))) {
        carryOn.add(sample.id);
        this.running.set(sample.id, { ...ref, sample, startedAt: sample.startedAt?.getTime() ?? Date.now(), enqueued: true, concluding: false });
      }
    }
    const uploads = await storedUploadNames(this.storage);
    const unfinished = await requeueInterrupted((name) => uploads.has(name), carryOn);
    const done = await models.Sample.findAll({ where: { state: 'done' }, attributes: ['id', 'tablesId'] });
    const keepWork = new Set([...this.running.values()].map((run) => workPrefix(run.sampleId, run.attempt)));
    const removed = await sweepUnowned(this.storage, unfinished.waitingUploads, new Set(done.map(tablesFolderOf)), keepWork);
    if (carryOn.size > 0) console.log(`[queue] following samples still in the queue: ${[...carryOn].join(', ')}`);
    logStartUp('queue', unfinished, removed);
    setInterval(() => this.follow(), FOLLOW_MS).unref();
    this.filling.start(POLL_MS);
  }

  wake(): void {
    this.filling.wake();
  }

  private fill(): Promise<void> {
    return claimWhileRoom(
      () => this.running.size < this.config.maxJobs,
      async (sample) => {
        const run: Run = { sampleId: sample.id, attempt: sample.attempts, sample, startedAt: Date.now(), enqueued: false, concluding: false };
        this.running.set(sample.id, run);
        try {
          await this.enqueue(run);
          run.enqueued = true;
        } catch (error) {
          const message = `the job could not be queued: ${(error as Error).message}`;
          await this.conclude(run, { kind: 'failed', error: { code: 'internal', message, line: null } });
        }
      },
    );
  }

  private async enqueue(run: Run): Promise<void> {
    const { sample } = run;
    const uploadFile = sample.uploadFile ?? '';
    await raiseUpload(this.storage, uploadFile);
    const data: PlanJobData = {
      sampleId: run.sampleId,
      attempt: run.attempt,
      uploadKey: uploadKey(uploadFile),
      fileSize: sample.fileSize ?? 0,
      settings: sample.settings,
      limits: { maxRecords: this.config.maxRecords, maxTextBytes: this.config.maxDecompressedBytes },
    };
    await this.queue.add('plan', data, {
      jobId: jobIds.plan(run),
      attempts: this.settings.attempts,
      backoff: { type: 'exponential', delay: this.settings.retryDelayMs },
      ...KEEP_JOBS,
    });
  }

  /** Looks at every running sample's jobs: records progress, and the outcome once there is one. */
  private follow(): void {
    if (this.following) return;
    this.following = true;
    Promise.all([...this.running.values()].map((run) => this.look(run).catch((error) => logFailure(`sample ${run.sampleId}`, error))))
      .catch(() => undefined)
      .finally(() => {
        this.following = false;
      });
  }

  private async look(run: Run): Promise<void> {
    if (run.concluding || !run.enqueued) return;
    const plan = await this.queue.getJob(jobIds.plan(run));
    if (!plan) {
      return this.conclude(run, { kind: 'failed', error: { code: 'interrupted', message: 'the queue no longer holds this job (was Redis emptied?)', line: null } });
    }
    const planState = await plan.getState();
    if (planState === 'failed') return this.conclude(run, { kind: 'failed', error: reportOfReason(plan.failedReason) });
    if (planState !== 'completed') return;
    const shards = (plan.returnvalue as { shards: number }).shards;
    const merge = await this.queue.getJob(jobIds.merge(run));
    if (!merge) return;
    const state = await merge.getState();
    if (state === 'completed') return this.conclude(run, { kind: 'done', result: merge.returnvalue as MergeResult });
    if (state === 'failed') return this.conclude(run, { kind: 'failed', error: await this.firstShardFailure(run, shards, merge) });
    await this.recordShardProgress(run, shards);
  }

  private async shardJobs(run: Run, shards: number): Promise<Array<Job | undefined>> {
    return Promise.all(Array.from({ length: shards }, (_, k) => this.queue.getJob(jobIds.shard(run, k))));
  }

  /** The report of the first shard that failed, or the merge's own. */
  private async firstShardFailure(run: Run, shards: number, merge: Job): Promise<JobErrorReport> {
    for (const job of await this.shardJobs(run, shards)) {
      if (job && (await job.getState()) === 'failed') return reportOfReason(job.failedReason);
    }
    return reportOfReason(merge.failedReason);
  }

  private async recordShardProgress(run: Run, shards: number): Promise<void> {
    const total: PipelineProgress = {
      ...emptyProgress(),
      bytesTotal: run.sample.fileSize ?? 0,
      elapsedMs: Date.now() - run.startedAt,
    };
    for (const job of await this.shardJobs(run, shards)) {
      const part = job?.progress as Partial<PipelineProgress> | number | undefined;
      if (!part || typeof part !== 'object') continue;
      total.bytesRead += part.bytesRead ?? 0;
      total.records += part.records ?? 0;
      total.jets += part.jets ?? 0;
      total.primarySplittings += part.primarySplittings ?? 0;
      total.allSplittings += part.allSplittings ?? 0;
    }
    total.bytesRead = Math.min(total.bytesRead, total.bytesTotal ?? total.bytesRead);
    await recordProgress(run.sampleId, progressView(total, run.sample.fileSize ?? 0, run.sample.settings.fullTree));
  }

  /** Records the outcome once the run's files are settled: a sample that reads as ended has nothing in progress left. */
  private async conclude(run: Run, outcome: { kind: 'done'; result: MergeResult } | { kind: 'failed'; error: JobErrorReport }): Promise<void> {
    run.concluding = true;
    const { sample } = run;
    const processingMs = Date.now() - run.startedAt;
    try {
      await this.retire(run, outcome.kind === 'done');
      if (outcome.kind === 'done') {
        const { counts, input, planes } = outcome.result;
        await recordInput(sample.id, input);
        const fileSize = sample.fileSize ?? 0;
        const progress = progressView(
          { ...emptyProgress(), ...countsProgress(counts), bytesRead: fileSize, bytesTotal: fileSize, elapsedMs: processingMs, done: true },
          fileSize,
          sample.settings.fullTree,
        );
        const finished = planes.map((plane) => ({ horizontal: plane.horizontal, bytes: new Uint8Array(Buffer.from(plane.base64, 'base64')) }));
        if (!(await recordDone(sample.id, { counts, planes: finished, progress, processingMs }))) await removeSampleFiles(this.storage, sample.id);
      } else {
        const state = outcome.error.code === 'cancelled' ? 'cancelled' : 'failed';
        await recordEnded(sample.id, state, state === 'failed' ? sampleError(outcome.error) : null, processingMs);
      }
    } finally {
      this.running.delete(run.sampleId);
      this.wake();
    }
  }

  /**
   * Marks the run ended for the workers (a shard still under way, e.g. a stalled copy, stops and removes what it
   * publishes later) and removes its upload and work objects. For a run that did not finish, its waiting jobs
   * also leave the queue and its sample's objects go. Each step stands alone: a store that refuses writes may refuse removals too, and the start-up
   * sweep removes what is left.
   */
  private async retire(run: Run, finished: boolean): Promise<void> {
    const step = (what: string, work: () => Promise<unknown>) => work().catch((error) => logFailure(`sample ${run.sampleId}: ${what}`, error));
    await step('marking the run ended', () => this.connection.set(cancelKey(run), '1', 'EX', CANCEL_MARK_SECONDS));
    if (!finished) {
      await step('removing its waiting jobs', async () => {
        const waiting = await this.queue.getJobs(['waiting', 'delayed', 'waiting-children', 'prioritized']);
        const ours = waiting.filter((job) => job.id?.startsWith(`${runName(run)}-`));
        await Promise.all(ours.map((job) => job.remove()));
      });
      await step('removing its objects', () => removeSampleFiles(this.storage, run.sampleId));
      // A shard that was mid-write when the mark appeared may still publish its columns.
      setTimeout(() => {
        void step('late clean-up', () => removePrefix(this.store, workPrefix(run.sampleId, run.attempt)));
        void step('late clean-up', () => removeSampleFiles(this.storage, run.sampleId));
      }, LATE_CLEANUP_MS).unref();
    }
    await step('removing its upload', () => removeUpload(this.storage, run.sample.uploadFile));
    await step('removing its work objects', () => removePrefix(this.store, workPrefix(run.sampleId, run.attempt)));
  }

  /** Stops a sample's run (workers see the mark within a progress interval) or takes it out of the queue. */
  async cancel(sample: Sample): Promise<void> {
    const run = this.running.get(sample.id);
    if (!run) {
      if (await recordEnded(sample.id, 'cancelled', null)) await removeUpload(this.storage, sample.uploadFile);
      return;
    }
    run.concluding = true;
    try {
      await this.retire(run, false);
      await recordEnded(sample.id, 'cancelled', null, Date.now() - run.startedAt);
    } finally {
      this.running.delete(run.sampleId);
      this.wake();
    }
  }

  /** What the admin page shows: the queue's counts, the jobs under way and the failed ones. */
  async overview(): Promise<ProcessingOverview> {
    const counts = await this.queue.getJobCounts('waiting', 'active', 'delayed', 'failed', 'waiting-children', 'prioritized');
    const [active, failed] = await Promise.all([this.queue.getActive(0, 99), this.queue.getFailed(0, 49)]);
    return {
      mode: 'queue',
      store: this.store.description,
      counts: {
        waiting: (counts.waiting ?? 0) + (counts.prioritized ?? 0) + (counts['waiting-children'] ?? 0),
        running: counts.active ?? 0,
        delayed: counts.delayed ?? 0,
        failed: counts.failed ?? 0,
      },
      running: active.map((job) => ({ ...jobView(job), worker: job.processedBy ?? null, fraction: fractionOf(job) })),
      // A merge fails when one of its shards did (BullMQ: "child <key> failed") and the other shards of that run
      // are stopped (cancelled): only the shard that failed is listed, with why.
      failed: failed
        .filter((job) => !/^child \S+ failed$/.test(job.failedReason ?? '') && reportOfReason(job.failedReason).code !== 'cancelled')
        .map((job) => ({ ...jobView(job), reason: reportOfReason(job.failedReason).message })),
    };
  }
}

function emptyProgress(): PipelineProgress {
  return {
    records: 0,
    particles: 0,
    jets: 0,
    rejected: { pt: 0, y: 0, rank: 0 },
    primarySplittings: 0,
    allSplittings: 0,
    skipped: 0,
    particlesRemoved: null,
    flavours: null,
    bytesRead: 0,
    bytesTotal: null,
    elapsedMs: 0,
    done: false,
  };
}

function countsProgress(counts: MergeResult['counts']): Partial<PipelineProgress> {
  return { records: counts.records, jets: counts.jets, primarySplittings: counts.primarySplittings, allSplittings: counts.allSplittings };
}
