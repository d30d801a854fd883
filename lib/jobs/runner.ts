// The server's processing queue: takes queued samples fairly between the people who queued them (fair-order.ts), runs at most SPLITFIELD_MAX_JOBS at once,
// each in its own worker thread (dist/engine/job-worker.js), records progress (throttled) and the outcome, and
// removes every file of a job that did not finish. One runner per process, started by instrumentation.ts; at
// start it requeues the jobs a stop of the server cut short and sweeps storage of what no sample owns.
//
// Early jobs: when there is room and nothing waits in the queue, an upload's job starts while the file is still
// arriving (startEarly; the worker reads the growing file), into a folder of its own under samples/. Once the
// upload is accepted as a new sample, the sample is created running and adopts the job (its folder becomes the
// sample's when the job is done); a refused or duplicate upload drops it. So the processing overlaps the upload.
// An early job whose file is still arriving gives its place up as soon as a sample waits in the queue (a slow
// upload must not hold the queue up); its upload then becomes a queued sample like any other.
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import { mkdir, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { db } from '@/lib/db/connection';
import type { PipelineProgress } from '@/lib/ingest/pipeline/sink';
import { readSampleConfig, type SampleConfig } from '@/lib/samples/config';
import { publishColumnFolder } from '@/lib/samples/column-files';
import {
  cachedSampleDir,
  removeSampleFiles,
  removeUpload,
  sampleDir,
  sampleStorage,
  sweepUnowned,
  uploadPath,
  type SampleStorage,
} from '@/lib/samples/storage';
import { fetchUpload, storedUploadNames } from '@/lib/samples/upload-files';
import { samplePrefix } from '@/lib/objects/keys';
import { tablesFolderOf } from '@/lib/samples/sharing';
import { readQueueSettings } from '@/lib/scale/config';
import type { ProcessingOverview } from '@/lib/scale/overview';
import { QueueRunner } from '@/lib/scale/queue-runner';
import type { Sample } from '@/models/sample';
import type { SampleInput, SampleSettings } from '@/models/sample-fields';
import { sampleError, type JobErrorReport } from './failure';
import type { JobControlMessage, JobWorkerInput, JobWorkerMessage } from './messages';
import { progressView } from './progress';
import { logStartUp, recordDone, recordEnded, recordInput, recordProgress, requeueInterrupted } from './sample-states';
import { claimWhileRoom, WakeLoop } from './wake-loop';

/** Progress reaches the database at most this often per job. */
const PROGRESS_WRITE_MS = 1000;
/** Queued samples are also looked for this often, in case a wake-up was missed. */
const POLL_MS = 5000;
/** A cancelled job that has not stopped by then is terminated. */
const CANCEL_GRACE_MS = 10_000;

type Ending = Extract<JobWorkerMessage, { type: 'done' | 'failed' | 'cancelled' }>;

/** A job's worker thread and what it has said (before a sample owns it, for an early job). */
interface JobThread {
  worker: Worker;
  /** performance.now() when the job was launched: processing time is measured on this monotonic clock. */
  launchedAt: number;
  /** When it was launched, for the sample's startedAt. */
  startedAt: Date;
  ending: Ending | null;
  crash: Error | null;
  /** The input's header, until a sample owns the job. */
  input: SampleInput | null;
  /** Settles with the exit code when the thread has stopped. */
  exited: Promise<number>;
  /** Settles when the thread says it is done (everything written) or stops, whichever comes first. */
  settled: Promise<void>;
  /** Set once a sample owns the job: where its messages go. */
  owner: ((message: JobWorkerMessage) => void) | null;
}

interface RunningJob {
  sample: Sample;
  thread: JobThread;
  cancelRequested: boolean;
  /** Settles once the outcome is recorded and the job's files are cleaned up. */
  finished: Promise<void>;
}

/** An upload's job started while the upload arrives (see the top of this file). */
export interface EarlyJob {
  /** The settings it runs with: the sample adopts it only when its own are the same. */
  readonly settings: SampleSettings;
  /** When it started (the sample's startedAt). */
  readonly startedAt: Date;
  /**
   * The upload is complete, with this many bytes: true when the job goes on, false when it gave its place up to a
   * queued sample while the file arrived (the upload is then queued as usual).
   */
  uploaded(size: number): boolean;
  /** The upload became this sample, created running: the job is now the sample's. */
  adopt(sample: Sample): void;
  /** The upload was refused, failed or is a duplicate: stops the job and removes what it wrote. */
  drop(): Promise<void>;
}

function jobWorkerFile(): string {
  return process.env.SPLITFIELD_JOB_WORKER ?? path.resolve(/*turbopackIgnore: true*/ process.cwd(), 'dist/engine/job-worker.js');
}

function queuedCount(): Promise<number> {
  return db().models.Sample.count({ where: { state: 'queued' } });
}

function logFailure(what: string, error: unknown): void {
  console.error(`[jobs] ${what}:`, error);
}

export class JobRunner implements ProcessingRunner {
  private readonly running = new Map<number, RunningJob>();
  /** Early jobs not yet adopted (they hold a place among the maxJobs). */
  private early = 0;
  /** How to stop each early job whose upload is still arriving (when a queued sample needs its place). */
  private readonly receiving = new Set<() => Promise<void>>();
  /** Queued samples being claimed (fill): an early start then waits for the next upload. */
  private claiming = 0;
  private readonly filling = new WakeLoop(
    () => this.fill(),
    (error) => logFailure('cannot start queued jobs', error),
  );

  constructor(
    private readonly config: SampleConfig,
    private readonly storage: SampleStorage,
    private readonly workerFile: string,
  ) {}

  /** Requeues interrupted jobs, removes unowned files, then starts taking queued samples. */
  async start(): Promise<void> {
    await mkdir(this.storage.uploadsDir, { recursive: true });
    await mkdir(this.storage.samplesDir, { recursive: true });
    const uploads = await storedUploadNames(this.storage);
    const unfinished = await requeueInterrupted((name) => uploads.has(name));
    const done = await db().models.Sample.findAll({ where: { state: 'done' }, attributes: ['id', 'tablesId'] });
    const removed = await sweepUnowned(this.storage, unfinished.waitingUploads, new Set(done.map(tablesFolderOf)));
    logStartUp('jobs', unfinished, removed);
    this.filling.start(POLL_MS);
  }

  /** Looks for queued samples now (after an upload). */
  wake(): void {
    this.filling.wake();
  }

  private hasRoom(): boolean {
    return this.running.size + this.early < this.config.maxJobs;
  }

  private async fill(): Promise<void> {
    this.claiming++;
    try {
      if (!this.hasRoom() && this.receiving.size > 0 && (await queuedCount()) > 0) {
        await Promise.all([...this.receiving].map((giveUp) => giveUp()));
      }
      await claimWhileRoom(() => this.hasRoom(), (sample) => this.launch(sample));
    } finally {
      this.claiming--;
    }
  }

  /**
   * Starts the job of an upload whose file (`uploadFile` under uploads/) is still arriving, when there is room and
   * no sample waits in the queue (it would be overtaken); null otherwise, and with a bucket (the upload goes there).
   */
  async startEarly(uploadFile: string, settings: SampleSettings): Promise<EarlyJob | null> {
    if (this.storage.remote || !this.hasRoom() || this.claiming > 0) return null;
    this.early++; // the place is held from now on, so that two uploads at once cannot both take the last one
    const folder = path.join(this.storage.samplesDir, `early-${randomUUID()}`);
    let started: JobThread | null = null;
    try {
      if ((await queuedCount()) === 0) started = this.startThread({ ...this.jobInput(uploadPath(this.storage, uploadFile), folder, settings), growing: true });
    } finally {
      if (!started) this.early--;
    }
    if (!started) return null;
    const thread = started;
    let state: 'receiving' | 'received' | 'adopted' | 'ended' = 'receiving';
    // Stops the job, frees its place and removes its folder (once, whoever asks first).
    let ending: Promise<void> | null = null;
    const end = () => {
      ending ??= (async () => {
        this.receiving.delete(end);
        this.early--;
        state = 'ended';
        await this.stopThread(thread);
        await rm(folder, { recursive: true, force: true });
        this.wake();
      })();
      return ending;
    };
    this.receiving.add(end);
    return {
      settings,
      startedAt: thread.startedAt,
      uploaded: (size) => {
        if (state !== 'receiving') return false;
        this.receiving.delete(end);
        state = 'received';
        thread.worker.postMessage({ type: 'uploaded', size } satisfies JobControlMessage);
        return true;
      },
      adopt: (sample) => {
        if (state !== 'received') throw new Error(`an early job ${state} cannot be adopted`);
        state = 'adopted';
        this.early--;
        this.attach(thread, sample, folder);
      },
      drop: () => (state === 'adopted' ? Promise.resolve() : end()),
    };
  }

  /**
   * Stops the sample's job if it runs, or takes it out of the queue; resolves once it is recorded as cancelled
   * and its files are gone. A sample that already ended stays as it is.
   */
  async cancel(sample: Sample): Promise<void> {
    const job = this.running.get(sample.id);
    if (job) return this.stop(job);
    if (await recordEnded(sample.id, 'cancelled', null)) await removeUpload(this.storage, sample.uploadFile);
    // Claimed between the look-up and the update: the job started, so stop it.
    const late = this.running.get(sample.id);
    if (late) await this.stop(late);
  }

  async overview(): Promise<ProcessingOverview> {
    const waiting = await db().models.Sample.count({ where: { state: 'queued' } });
    const running = [...this.running.values()].map(({ sample }) => ({
      id: `sample-${sample.id}`,
      kind: 'sample',
      sampleId: sample.id,
      shard: null,
      attempts: sample.attempts,
      startedAt: sample.startedAt?.toISOString() ?? null,
      worker: 'this server',
      fraction: null,
    }));
    const store = this.storage.remote?.description ?? path.dirname(this.storage.uploadsDir);
    return { mode: 'embedded', store, counts: { waiting, running: running.length, delayed: 0, failed: 0 }, running, failed: [] };
  }

  private async stop(job: RunningJob): Promise<void> {
    job.cancelRequested = true;
    await this.stopThread(job.thread);
    await job.finished;
  }

  /** Asks the job to stop; terminates it when it has not stopped after CANCEL_GRACE_MS. */
  private async stopThread(thread: JobThread): Promise<void> {
    thread.worker.postMessage({ type: 'cancel' } satisfies JobControlMessage);
    const force = setTimeout(() => void thread.worker.terminate(), CANCEL_GRACE_MS);
    await thread.exited;
    clearTimeout(force);
  }

  private jobInput(file: string, folder: string, settings: SampleSettings): JobWorkerInput {
    const limits = { maxRecords: this.config.maxRecords, maxTextBytes: this.config.maxDecompressedBytes };
    return { uploadPath: file, sampleDir: folder, settings, threads: this.config.jobThreads, limits };
  }

  /**
   * Starts the sample's worker. With a bucket, the upload is fetched first and the columns are committed into the
   * cache folder, from which conclude() publishes them.
   */
  private async launch(sample: Sample): Promise<void> {
    const remote = this.storage.remote;
    const folder = remote ? cachedSampleDir(this.storage, sample.id) : sampleDir(this.storage, sample.id);
    const input = this.jobInput(uploadPath(this.storage, sample.uploadFile ?? ''), folder, sample.settings);
    if (remote) {
      const unreadable = await fetchUpload(this.storage, sample.uploadFile ?? '').then(
        () => null,
        (error: Error) => error,
      );
      if (unreadable) {
        const message = `the uploaded file cannot be read from ${remote.description}: ${unreadable.message}`;
        const ending: Ending = { type: 'failed', error: { code: 'internal', message, line: null } };
        await this.conclude(sample, performance.now(), ending, null).catch((error) => logFailure(`sample ${sample.id}: recording the outcome`, error));
        return;
      }
    }
    this.attach(this.startThread(input), sample, null);
  }

  /** Starts a job's worker thread; its messages wait for an owner (attach). */
  private startThread(input: JobWorkerInput): JobThread {
    const worker = new Worker(this.workerFile, { workerData: input });
    const exited = new Promise<number>((resolve) => worker.once('exit', resolve));
    let saidDone = () => {};
    const said = new Promise<void>((resolve) => (saidDone = resolve));
    const thread: JobThread = {
      worker, launchedAt: performance.now(), startedAt: new Date(), ending: null, crash: null, input: null, owner: null, exited,
      settled: Promise.race([said, exited.then(() => undefined)]),
    };
    worker.on('message', (message: JobWorkerMessage) => {
      if (message.type === 'done' || message.type === 'failed' || message.type === 'cancelled') thread.ending = message;
      if (message.type === 'done') saidDone();
      if (thread.owner) thread.owner(message);
      else if (message.type === 'input') thread.input = message.input;
    });
    worker.on('error', (error) => {
      thread.crash ??= error;
    });
    return thread;
  }

  /**
   * Makes the thread the sample's running job: records its input and progress, and its outcome when it ends.
   * `early`: the folder an early job writes instead of the sample's own (moved into place when it is done).
   */
  private attach(thread: JobThread, sample: Sample, early: string | null): void {
    const job: RunningJob = { sample, thread, cancelRequested: false, finished: Promise.resolve() };
    const failed = (what: string) => (error: unknown) => logFailure(`sample ${sample.id}: ${what}`, error);
    let lastWrite = 0;
    thread.owner = (message) => {
      if (message.type === 'input') {
        recordInput(sample.id, message.input).catch(failed('input'));
      } else if (message.type === 'progress') {
        if (Date.now() - lastWrite < PROGRESS_WRITE_MS) return;
        lastWrite = Date.now();
        recordProgress(sample.id, this.progressOf(sample, message.progress)).catch(failed('progress'));
      }
    };
    if (thread.input) recordInput(sample.id, thread.input).catch(failed('input'));
    // A job that is done has written everything: its outcome is recorded while its thread winds down (tens of ms).
    // Any other ending waits for the thread to stop, so that nothing writes while its files are removed. The job's
    // place is given back once the thread has stopped.
    const ending = async (): Promise<Ending> =>
      thread.ending?.type === 'done' ? thread.ending : thread.exited.then((exitCode) => thread.ending ?? this.unexplainedEnd(job, exitCode));
    job.finished = thread.settled
      .then(async () => this.conclude(sample, thread.launchedAt, await ending(), early))
      .catch((error) => logFailure(`sample ${sample.id}: recording the outcome`, error))
      .then(() => thread.exited)
      .then(() => {
        this.running.delete(sample.id);
        this.wake();
      });
    this.running.set(sample.id, job);
  }

  private progressOf(sample: Sample, progress: PipelineProgress) {
    return progressView(progress, sample.fileSize, sample.settings.fullTree);
  }

  /** The ending of a worker that stopped without saying how (terminated, crashed, or not even started). */
  private unexplainedEnd(job: RunningJob, exitCode: number): Ending {
    if (job.cancelRequested) return { type: 'cancelled' };
    const crash = job.thread.crash;
    const missing = !existsSync(this.workerFile);
    const message = missing
      ? `the processing engine is not built (${this.workerFile} is missing); run: npm run build:engine`
      : `the processing job stopped unexpectedly (${crash ? crash.message : `exit code ${exitCode}`})`;
    return { type: 'failed', error: { code: 'internal', message, line: null } satisfies JobErrorReport };
  }

  /** Removes what a job that did not finish wrote: the sample's files, and an early job's own folder. */
  private async removeJobFiles(sample: Sample, early: string | null): Promise<void> {
    await removeSampleFiles(this.storage, sample.id);
    if (early) await rm(early, { recursive: true, force: true });
  }

  /** Records the outcome; `early`: the folder an early job wrote, which becomes the sample's when it is done. */
  private async conclude(sample: Sample, launchedAt: number, ending: Ending, early: string | null): Promise<void> {
    const processingMs = Math.round(performance.now() - launchedAt);
    try {
      if (ending.type === 'done') {
        const { counts, planes } = ending;
        const progress = this.progressOf(sample, ending.progress);
        if (early) await rename(early, sampleDir(this.storage, sample.id));
        if (this.storage.remote) await publishColumnFolder(this.storage.remote, cachedSampleDir(this.storage, sample.id), samplePrefix(sample.id));
        if (!(await recordDone(sample.id, { counts, planes, progress, processingMs }))) {
          await removeSampleFiles(this.storage, sample.id);
        }
        return;
      }
      // Files first: once the sample reads as failed or cancelled, nothing of it is left on disk.
      await this.removeJobFiles(sample, early);
      await recordEnded(sample.id, ending.type, ending.type === 'failed' ? sampleError(ending.error) : null, processingMs);
    } catch (error) {
      await this.removeJobFiles(sample, early);
      const internal = sampleError({ code: 'internal', message: String(error), line: null });
      await recordEnded(sample.id, 'failed', internal, processingMs);
      throw error;
    } finally {
      await removeUpload(this.storage, sample.uploadFile);
    }
  }
}

/** What the rest of the server asks of the runner, in either mode. */
export interface ProcessingRunner {
  /** Looks for queued samples now (after an upload). */
  wake(): void;
  /** Starts the job of an upload still arriving, when this runner can (see JobRunner.startEarly). */
  startEarly?(uploadFile: string, settings: SampleSettings): Promise<EarlyJob | null>;
  /** Stops the sample's job or takes it out of the queue; resolves once it is recorded and cleaned up. */
  cancel(sample: Sample): Promise<void>;
  /** The admin page's view of the processing. */
  overview(): Promise<ProcessingOverview>;
}

const processWideKey = Symbol.for('splitfield.jobRunner');
type ProcessWide = typeof globalThis & { [processWideKey]?: Promise<ProcessingRunner> };

/**
 * The process's job runner (the queue's with SPLITFIELD_REDIS_URL, else worker threads here), started on first use (instrumentation.ts uses it at server start). Kept on globalThis
 * because the bundler may load this module once per route bundle.
 */
export function jobRunner(): Promise<ProcessingRunner> {
  const holder = globalThis as ProcessWide;
  holder[processWideKey] ??= (async () => {
    const queue = readQueueSettings();
    const runner = queue ? new QueueRunner(readSampleConfig(), sampleStorage(), queue) : new JobRunner(readSampleConfig(), sampleStorage(), jobWorkerFile());
    await runner.start();
    return runner;
  })().catch((error: unknown) => {
    // Not kept: the next use tries again.
    delete holder[processWideKey];
    throw error;
  });
  return holder[processWideKey];
}
