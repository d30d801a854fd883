// Processing in a pool of worker threads (threads > 1): batches are dispatched as they are read, at most
// 2 × threads of them in flight, and their results are delivered strictly in input order. Typed arrays are
// transferred, not copied. A worker that fails (or cannot start) fails the run at once.

import { existsSync } from 'node:fs';
import path from 'node:path';
import type { Piscina } from 'piscina';
import { packTask, resultRecords, lineBuffers, taskBuffers, unpackMeta, unpackResults, type LinesTask, type WorkerResult, type WorkerTask } from '../codec';
import { IngestError } from '../errors';
import type { ParticleRecord } from '../types';
import { addStage, checkAbort, processingError, recordMeta, type BatchRun } from './batches';
import type { RecordMeta, WorkerFormat } from './sink';

/** Where the bundled worker is: next to the running bundle, else dist/engine under the working directory. */
export function findWorkerFile(): string {
  const candidates: string[] = [];
  if (process.env.SPLITFIELD_ENGINE_WORKER) candidates.push(process.env.SPLITFIELD_ENGINE_WORKER);
  if (typeof __dirname !== 'undefined') candidates.push(path.join(__dirname, 'worker.js'));
  candidates.push(path.resolve(process.cwd(), 'dist/engine/worker.js'));
  for (const c of candidates) if (existsSync(c)) return c;
  throw new Error(`the engine worker is not built (looked for ${candidates.join(', ')}); run: npm run build:engine`);
}

interface InFlight {
  /** The records of a packed task (null for a raw-text task, whose records the worker parsed). */
  records: ParticleRecord[] | null;
  promise: Promise<WorkerResult>;
  settled: boolean;
}

export class WorkerPoolProcessing {
  private readonly inFlight: InFlight[] = [];
  private poolError: unknown = null;
  private failPool: (e: unknown) => void = () => {};
  /** Rejects when the pool reports an error: raced against every wait so that the run never hangs. */
  private readonly poolFailed = new Promise<never>((_, reject) => {
    this.failPool = reject;
  });
  private readonly onPoolError = (e: unknown) => {
    if (this.poolError) return;
    this.poolError = new Error(`a worker thread failed: ${e instanceof Error ? e.message : String(e)}`, { cause: e });
    this.failPool(this.poolError);
  };

  private constructor(
    private readonly pool: Piscina,
    private readonly ownPool: boolean,
    private readonly maxInFlight: number,
  ) {
    this.poolFailed.catch(() => {});
    // Piscina reports a worker that cannot start (or a stray message) as an 'error' event on the pool, and
    // then leaves later tasks pending for ever: fail the run at once instead of waiting.
    pool.on('error', this.onPoolError);
  }

  /** Uses the given pool, or starts one of `threads` workers (destroyed by shutdown()). */
  static async open(threads: number, pool: Piscina | undefined, workerFile: string | undefined): Promise<WorkerPoolProcessing> {
    if (pool) return new WorkerPoolProcessing(pool, false, 2 * threads);
    // Loaded only when threads are used (saves its start-up time for threads = 1).
    const { Piscina: PiscinaClass } = await import('piscina');
    const own = new PiscinaClass({
      filename: workerFile ?? findWorkerFile(),
      minThreads: threads,
      maxThreads: threads,
      idleTimeout: 500,
      // 'sync' atomics keep the worker inside Atomics.wait between tasks, so V8 never installs the code its
      // concurrent compiler optimised: measured 2.5x slower here. Plain messages instead.
      atomics: 'disabled',
      // A larger young generation: fewer scavenges of the parsed records and results (measured: 8 % less CPU
      // with two threads on the events benchmark file).
      resourceLimits: { maxYoungGenerationSizeMb: 64 },
    });
    return new WorkerPoolProcessing(own, true, 2 * threads);
  }

  /**
   * Reads every batch, dispatches it, and delivers all results in input order. The workers also make the sink's
   * text when it has a workerFormat.
   */
  async process(run: BatchRun, sinkFormat: WorkerFormat | null): Promise<void> {
    const { reader, settings } = run;
    const raw = reader.raw;
    if (raw) {
      const batches = raw.rawBatches(run.batchChars, run.batchRecords);
      for (;;) {
        const t = performance.now();
        const next = await batches.next();
        addStage(run, 'read', t);
        if (next.done) break;
        const b = next.value;
        const task: LinesTask = {
          kind: 'lines',
          settings,
          batch: b,
          context: raw.context,
          skipBad: raw.skipBad,
          sinkFormat,
          timings: run.stages !== null,
        };
        await this.pump(run, task, null);
      }
    } else {
      for await (const batch of reader.batches(run.batchParticles, run.batchRecords)) {
        await this.pump(run, packTask(batch, settings), batch);
      }
    }
    while (this.inFlight.length > 0) await this.deliverHead(run);
    raw?.finish();
  }

  /** Submits a task, then delivers the finished head of the queue (waiting when too many are in flight). */
  private async pump(run: BatchRun, task: WorkerTask, records: ParticleRecord[] | null): Promise<void> {
    checkAbort(run);
    const t = performance.now();
    this.inFlight.push(this.submit(task, records));
    addStage(run, 'dispatch', t);
    while (this.inFlight.length > 0 && (this.inFlight.length >= this.maxInFlight || this.inFlight[0].settled)) {
      await this.deliverHead(run);
    }
  }

  private submit(task: WorkerTask, records: ParticleRecord[] | null): InFlight {
    const transferList = task.kind === 'packed' ? taskBuffers(task) : lineBuffers(task.batch);
    const item: InFlight = { records, settled: false, promise: null as unknown as InFlight['promise'] };
    item.promise = (this.pool.run(task, { transferList }) as Promise<WorkerResult>).then(
      (w) => {
        item.settled = true;
        return w;
      },
      (e) => {
        item.settled = true;
        throw e;
      },
    );
    item.promise.catch(() => {}); // failures are rethrown when the item is awaited in order
    return item;
  }

  /** Results are interpreted strictly in input order (skipped-record callbacks included). */
  private async deliverHead(run: BatchRun): Promise<void> {
    const head = this.inFlight.shift()!;
    let t = performance.now();
    const w = await Promise.race([head.promise, this.poolFailed]);
    t = addStage(run, 'wait', t);
    checkAbort(run);
    if (run.stages && w.times) {
      run.stages.parse += w.times.parse;
      run.stages.physics += w.times.physics;
      run.stages.format += w.times.format;
    }
    const n = resultRecords(w);
    let metas: RecordMeta[];
    if (head.records) {
      if (w.error) throw processingError(head.records[w.error.index].line, run.where, w.error.message);
      metas = head.records.map(recordMeta);
    } else {
      // Raw text parsed in the worker: bad records come back in order.
      const raw = run.reader.raw!;
      if (w.spent) raw.reuse?.(w.spent);
      for (const pr of w.problems) raw.rejected(IngestError.fromPlain(pr.error));
      if (w.error) throw processingError(w.meta!.lines[w.error.index], run.where, w.error.message);
      if (w.bytes) {
        raw.accepted(w.counts!.records);
        await run.delivery.deliverFormatted(w.bytes, w.counts!);
        addStage(run, 'delivery', t);
        return;
      }
      metas = unpackMeta(w);
      raw.accepted(n);
    }
    await run.delivery.deliver(metas, unpackResults(w, n));
    addStage(run, 'delivery', t);
  }

  /** Lets running tasks finish (cancellation is checked between batches) and stops a pool this run started. */
  async shutdown(): Promise<void> {
    // Running tasks are short and are let finish (terminating a worker in the middle of a task is what piscina
    // would do with a signal, racing with its reply).
    if (this.inFlight.length && !this.poolError) {
      let timer: NodeJS.Timeout | undefined;
      const cap = new Promise<void>((resolve) => {
        timer = setTimeout(resolve, 10_000); // never wait long for a task that will not come back
      });
      await Promise.race([Promise.allSettled(this.inFlight.map((i) => i.promise)), this.poolFailed.catch(() => {}), cap]);
      clearTimeout(timer);
    }
    this.pool.off('error', this.onPoolError);
    if (this.ownPool) {
      this.pool.on('error', () => {}); // late reports from a pool being destroyed must not crash the process
      await this.pool.destroy();
    }
  }
}
