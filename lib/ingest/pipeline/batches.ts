// What the two ways of processing (this thread, or a pool of worker threads) share: the batches they read, how
// a failure inside the physics is reported, and how a record is described to the sink.

import { SETTINGS_PROBLEM } from '../../physics/process-record';
import type { ProcessSettings } from '../../physics/types';
import { IngestAbortError, IngestError } from '../errors';
import type { ParticleReader, ParticleRecord } from '../types';
import type { ResultDelivery } from './delivery';
import type { RecordMeta, StageTimes } from './sink';

/** One run's reading and delivery, handed to the step that processes its batches. */
export interface BatchRun {
  reader: ParticleReader;
  settings: ProcessSettings;
  delivery: ResultDelivery;
  /** How errors name a record's place: by line (JSON Lines, HepMC3) or by record (the one-document form). */
  where: 'line' | 'record' | 'row';
  /** Batch sizes: particles and records of parsed batches, characters of raw text batches. */
  batchParticles: number;
  batchRecords: number;
  batchChars: number;
  signal?: AbortSignal;
  /** Stage times accumulated here when the run was asked for them. */
  stages: StageTimes | null;
}

/** Seconds since `t0` (a performance.now() value) added to a stage, when stages are measured. */
export function addStage(run: BatchRun, stage: keyof StageTimes, t0: number): number {
  const now = performance.now();
  if (run.stages) run.stages[stage] += (now - t0) / 1000;
  return now;
}

export function checkAbort(run: BatchRun): void {
  if (run.signal?.aborted) throw new IngestAbortError();
}

export function recordMeta(r: ParticleRecord): RecordMeta {
  return { line: r.line, id: r.id, weight: r.weight, nParticles: r.particles.length >> 2 };
}

export function processingError(line: number, where: 'line' | 'record' | 'row', message: string): IngestError {
  if (message.startsWith(SETTINGS_PROBLEM)) return new IngestError(message, { line, where, code: 'settings' });
  return new IngestError(`processing failed: ${message}`, { line, where, code: 'process' });
}
