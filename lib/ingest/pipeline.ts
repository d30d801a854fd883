// The processing pipeline, shared by the command line and the server's processing job:
// reader → batches of records → processParticles (in this thread for threads = 1, a piscina pool of worker
// threads otherwise; typed arrays are transferred) → results in input order → sink.
// Memory stays bounded: the reader is pulled batch by batch, at most 2 × threads batches are in flight,
// and the sink's backpressure (awaited write) holds the reader back.

import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import type { Piscina } from 'piscina';
import { processParticles } from '../physics/process';
import { SPLIT_STRIDE, type ProcessSettings, type RecordResult } from '../physics/types';
import { packTask, unpackMeta, unpackResults, type LinesTask, type WorkerResult, type WorkerTask } from './codec';
import { IngestAbortError, IngestError } from './errors';
import { processLineBatch } from './process-lines';
import { ParticleScratch } from './record';
import type { PipelineCounts, PipelineProgress, PipelineSummary, RecordMeta, ResultSink } from './sink';
import type { ParticleReader, ParticleRecord } from './types';

export type { PipelineProgress, PipelineSummary, RecordMeta, ResultSink } from './sink';

/** Settings of a run; `content` comes from the input's header. */
export type PipelineSettings = Omit<ProcessSettings, 'content'>;

export interface PipelineOptions {
  reader: ParticleReader;
  settings: PipelineSettings;
  sink: ResultSink;
  /** Worker threads; 1 processes in this thread. Default: the number of cores. */
  threads?: number;
  signal?: AbortSignal;
  onProgress?: (p: PipelineProgress) => void;
  /** Minimum time between two progress calls (the final call always happens). Default 250 ms. */
  progressIntervalMs?: number;
  /** Batch size, in particles and in records. */
  batchParticles?: number;
  batchRecords?: number;
  /** Batch size of JSON Lines text handed to a worker (characters). */
  batchChars?: number;
  /** The bundled worker (dist/engine/worker.js); found next to this file or under the working directory. */
  workerFile?: string;
  /** Use this pool instead of creating one (it is not destroyed at the end). */
  pool?: Piscina;
}

export function defaultThreads(): number {
  return Math.max(1, availableParallelism());
}

/** Where the bundled worker is: next to the running bundle, else dist/engine under the working directory. */
export function findWorkerFile(): string {
  const candidates: string[] = [];
  if (process.env.SPLITFIELD_ENGINE_WORKER) candidates.push(process.env.SPLITFIELD_ENGINE_WORKER);
  if (typeof __dirname !== 'undefined') candidates.push(path.join(__dirname, 'worker.js'));
  candidates.push(path.resolve(process.cwd(), 'dist/engine/worker.js'));
  for (const c of candidates) if (existsSync(c)) return c;
  throw new Error(`the engine worker is not built (looked for ${candidates.join(', ')}); run: npm run build:engine`);
}

function meta(r: ParticleRecord): RecordMeta {
  return { line: r.line, id: r.id, weight: r.weight, nParticles: r.particles.length >> 2 };
}

function processingError(line: number, where: 'line' | 'record', message: string): IngestError {
  return new IngestError(`processing failed: ${message}`, { line, where, code: 'process' });
}

interface InFlight {
  /** The records of a packed task (null for a JSON Lines task, whose records the worker parsed). */
  records: ParticleRecord[] | null;
  promise: Promise<WorkerResult>;
  settled: boolean;
}

export async function runPipeline(opts: PipelineOptions): Promise<PipelineSummary> {
  const { reader, sink, signal } = opts;
  const t0 = performance.now();
  const threads = Math.max(1, Math.floor(opts.threads ?? defaultThreads()));
  const settings: ProcessSettings = { ...opts.settings, content: reader.header.content };
  const where = reader.header.layout === 'document' ? 'record' : 'line';
  const counts: PipelineCounts = {
    records: 0,
    particles: 0,
    jets: 0,
    primarySplittings: 0,
    allSplittings: 0,
    skipped: 0,
    rejected: { pt: 0, y: 0, rank: 0 },
  };
  const interval = opts.progressIntervalMs ?? 250;
  let lastProgress = -Infinity;
  const progress = (done: boolean) => {
    if (!opts.onProgress) return;
    const now = performance.now();
    if (!done && now - lastProgress < interval) return;
    lastProgress = now;
    opts.onProgress({
      ...counts,
      rejected: { ...counts.rejected },
      skipped: reader.skipped,
      bytesRead: reader.bytesRead,
      bytesTotal: reader.bytesTotal,
      elapsedMs: now - t0,
      done,
    });
  };
  const checkAbort = () => {
    if (signal?.aborted) throw new IngestAbortError();
  };

  const deliver = async (metas: RecordMeta[], results: RecordResult[]) => {
    for (let i = 0; i < metas.length; i++) {
      const res = results[i];
      counts.records++;
      counts.particles += metas[i].nParticles;
      counts.jets += res.jets.length;
      for (const j of res.jets) {
        counts.primarySplittings += j.primary.length / SPLIT_STRIDE;
        if (j.all) counts.allSplittings += j.all.length / SPLIT_STRIDE;
      }
      counts.rejected.pt += res.rejected.pt;
      counts.rejected.y += res.rejected.y;
      counts.rejected.rank += res.rejected.rank;
    }
    await sink.write(metas, results);
    progress(false);
  };

  let pool: Piscina | null = null;
  const ownPool = threads > 1 && !opts.pool;
  const inFlight: InFlight[] = [];
  let poolError: unknown = null;
  let failPool: (e: unknown) => void = () => {};
  let onPoolError: ((e: unknown) => void) | null = null;
  const poolFailed = new Promise<never>((_, reject) => {
    failPool = reject;
  });
  poolFailed.catch(() => {});
  try {
    checkAbort();
    await sink.begin(reader.header, settings);
    const batchParticles = opts.batchParticles ?? (threads > 1 ? 16384 : 32768);
    const batchRecords = opts.batchRecords ?? 2048;

    if (threads === 1 && !opts.pool) {
      const raw = reader.raw;
      if (raw) {
        // Raw records (JSON Lines, HepMC3): parse into a reused buffer and process at once (the workers' code).
        const scratch = new ParticleScratch();
        for await (const b of raw.rawBatches(opts.batchChars ?? 1 << 20, batchRecords)) {
          checkAbort();
          const o = processLineBatch(raw.kind, b.lines, b.lineNos, raw.context, settings, raw.skipBad, scratch);
          for (const pr of o.problems) raw.rejected(pr.error);
          if (o.error) throw processingError(o.metas[o.error.index].line, where, o.error.message);
          raw.accepted(o.results.length);
          await deliver(o.metas, o.results);
        }
        raw.finish();
      } else {
        for await (const batch of reader.batches(batchParticles, batchRecords)) {
          checkAbort();
          const results: RecordResult[] = new Array(batch.length);
          for (let i = 0; i < batch.length; i++) {
            try {
              results[i] = processParticles(batch[i].particles, settings);
            } catch (e) {
              throw processingError(batch[i].line, where, e instanceof Error ? e.message : String(e));
            }
          }
          await deliver(batch.map(meta), results);
        }
      }
    } else {
      // Loaded only when threads are used (saves its start-up time for threads = 1).
      const PiscinaClass = opts.pool ? null : (await import('piscina')).Piscina;
      pool = opts.pool ?? new PiscinaClass!({
          filename: opts.workerFile ?? findWorkerFile(),
          minThreads: threads,
          maxThreads: threads,
          idleTimeout: 500,
          // 'sync' atomics keep the worker inside Atomics.wait between tasks, so V8 never installs the code its
          // concurrent compiler optimised: measured 2.5x slower here. Plain messages instead.
          atomics: 'disabled',
        });
      const p = pool;
      // Piscina reports a worker that cannot start (or a stray message) as an 'error' event on the pool, and
      // then leaves later tasks pending for ever: fail the run at once instead of waiting.
      onPoolError = (e: unknown) => {
        if (poolError) return;
        poolError = new Error(`a worker thread failed: ${e instanceof Error ? e.message : String(e)}`, { cause: e });
        failPool(poolError);
      };
      p.on('error', onPoolError);
      const maxInFlight = 2 * threads;
      const raw = reader.raw;
      const submit = (task: WorkerTask, records: ParticleRecord[] | null): InFlight => {
        const transferList = (task.kind === 'packed' ? [task.particles.buffer, task.offsets.buffer] : [task.lineNos.buffer]) as ArrayBuffer[];
        const item: InFlight = { records, settled: false, promise: null as unknown as InFlight['promise'] };
        item.promise = (p.run(task, { transferList }) as Promise<WorkerResult>).then(
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
      };
      // Results are interpreted strictly in input order (skipped-record callbacks included).
      const flushHead = async () => {
        const head = inFlight.shift()!;
        const w = await Promise.race([head.promise, poolFailed]);
        checkAbort();
        const n = w.perRecord.length >> 2;
        let metas: RecordMeta[];
        if (head.records) {
          if (w.error) throw processingError(head.records[w.error.index].line, where, w.error.message);
          metas = head.records.map(meta);
        } else {
          // JSON Lines parsed in the worker: bad records come back in order.
          for (const pr of w.problems) raw!.rejected(IngestError.fromPlain(pr.error));
          metas = unpackMeta(w);
          if (w.error) throw processingError(metas[w.error.index].line, where, w.error.message);
          raw!.accepted(n);
        }
        await deliver(metas, unpackResults(w, n));
      };
      const pump = async (task: WorkerTask, records: ParticleRecord[] | null) => {
        checkAbort();
        inFlight.push(submit(task, records));
        while (inFlight.length > 0 && (inFlight.length >= maxInFlight || inFlight[0].settled)) await flushHead();
      };
      if (raw) {
        const ctx = raw.context;
        for await (const b of raw.rawBatches(opts.batchChars ?? 1 << 20, batchRecords)) {
          const task: LinesTask = { kind: 'lines', format: raw.kind, settings, lines: b.lines, lineNos: b.lineNos, context: ctx, skipBad: raw.skipBad };
          await pump(task, null);
        }
      } else {
        for await (const batch of reader.batches(batchParticles, batchRecords)) await pump(packTask(batch, settings), batch);
      }
      while (inFlight.length > 0) await flushHead();
      raw?.finish();
    }
    checkAbort();
    const summary: PipelineSummary = {
      ...counts,
      skipped: reader.skipped,
      header: reader.header,
      settings,
      threads,
      bytesRead: reader.bytesRead,
      bytesTotal: reader.bytesTotal,
      elapsedMs: performance.now() - t0,
      skippedErrors: reader.skippedErrors.map((e) => e.message),
    };
    counts.skipped = reader.skipped;
    progress(true);
    await sink.end(summary);
    return summary;
  } catch (e) {
    const err = signal?.aborted && !(e instanceof IngestAbortError) ? new IngestAbortError() : e;
    try {
      await sink.abort?.(err);
    } catch {
      /* the original error matters more */
    }
    throw err;
  } finally {
    reader.close();
    // Cancellation is checked between batches: running tasks are short and are let finish (terminating a
    // worker in the middle of a task is what piscina would do with a signal, racing with its reply).
    if (inFlight.length && !poolError) {
      let timer: NodeJS.Timeout | undefined;
      const cap = new Promise<void>((resolve) => {
        timer = setTimeout(resolve, 10_000); // never wait long for a task that will not come back
      });
      await Promise.race([Promise.allSettled(inFlight.map((i) => i.promise)), poolFailed.catch(() => {}), cap]);
      clearTimeout(timer);
    }
    if (pool && onPoolError) {
      pool.off('error', onPoolError);
      if (ownPool) pool.on('error', () => {}); // late reports from a pool being destroyed must not crash the process
    }
    if (pool && ownPool) await pool.destroy();
  }
}
