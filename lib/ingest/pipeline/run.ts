// The processing pipeline, shared by the command line and the server's processing job:
// reader → batches of records → processParticles (in this thread for threads = 1, a piscina pool of worker
// threads otherwise; typed arrays are transferred) → results in input order → sink.
// Memory stays bounded: the reader is pulled batch by batch, at most 2 × threads batches are in flight,
// and the sink's backpressure (awaited write) holds the reader back.
//
// The steps, each in its own file: batches.ts (what a run reads and how it names failures), in-thread.ts and
// worker-pool.ts (the two ways of processing batches), delivery.ts (ordered delivery to the sink, counts and
// progress). This file starts the run, picks the way, and ends or aborts the sink.

import { availableParallelism } from 'node:os';
import type { Piscina } from 'piscina';
import type { ProcessSettings } from '../../physics/types';
import { IngestAbortError } from '../errors';
import type { ParticleReader } from '../types';
import { checkAbort, type BatchRun } from './batches';
import { ResultDelivery } from './delivery';
import { processInThisThread } from './in-thread';
import { noStageTimes, type PipelineProgress, type PipelineSummary, type ResultSink } from './sink';
import { WorkerPoolProcessing } from './worker-pool';

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
  /** Measure where the time goes (PipelineSummary.stages). */
  timings?: boolean;
}

export function defaultThreads(): number {
  return Math.max(1, availableParallelism());
}

export async function runPipeline(opts: PipelineOptions): Promise<PipelineSummary> {
  const { reader, sink, signal } = opts;
  const t0 = performance.now();
  const threads = Math.max(1, Math.floor(opts.threads ?? defaultThreads()));
  const settings: ProcessSettings = { ...opts.settings, content: reader.header.content };
  const run: BatchRun = {
    reader,
    settings,
    delivery: new ResultDelivery(reader, sink, t0, opts.onProgress, opts.progressIntervalMs ?? 250),
    where: reader.header.layout === 'document' ? 'record' : reader.header.layout.includes('-') ? 'row' : 'line',
    batchParticles: opts.batchParticles ?? (threads > 1 ? 16384 : 32768),
    batchRecords: opts.batchRecords ?? 2048,
    batchChars: opts.batchChars ?? 1 << 20,
    signal,
    stages: opts.timings ? noStageTimes() : null,
  };
  let pool: WorkerPoolProcessing | null = null;
  try {
    checkAbort(run);
    await sink.begin(reader.header, settings);
    const sinkFormat = sink.workerFormat ?? null;
    if (threads === 1 && !opts.pool) {
      await processInThisThread(run, sinkFormat);
    } else {
      pool = await WorkerPoolProcessing.open(threads, opts.pool, opts.workerFile);
      await pool.process(run, sinkFormat);
    }
    checkAbort(run);
    const summary = run.delivery.summary(settings, threads, run.stages);
    run.delivery.progress(true);
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
    await pool?.shutdown();
  }
}
