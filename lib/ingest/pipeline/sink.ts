// What the pipeline hands to its consumers (the export writer here, the server's column writer later).

import type { ProcessSettings, RecordResult, RemovedParticles } from '../../physics/types';
import type { JetLineStyle } from '../types';
import type { IngestHeader } from '../header';

/** A record as the sinks see it (its particles are not kept). */
export interface RecordMeta {
  line: number;
  id: string | number;
  weight: number;
  /** Number of input particles of the record. */
  nParticles: number;
}

/** What a batch of records added to a run's counts (PipelineCounts less the skipped records). */
export type BatchCounts = Omit<PipelineCounts, 'skipped'>;

export interface PipelineCounts {
  records: number;
  particles: number;
  jets: number;
  primarySplittings: number;
  allSplittings: number;
  /** Bad records skipped (only with skipBad). */
  skipped: number;
  /** Jets found but dropped by the selection, by the first cut that failed (e+e-: "pt" is the energy cut). */
  rejected: { pt: number; y: number; rank: number };
  /** Particles removed by the constituent selection, by rule (null without a selection). */
  particlesRemoved: RemovedParticles | null;
  /** Kept jets by flavour tag (null without flavour tags). */
  flavours: JetFlavourCounts | null;
}

export interface JetFlavourCounts {
  b: number;
  c: number;
  light: number;
}

export interface PipelineProgress extends PipelineCounts {
  bytesRead: number;
  bytesTotal: number | null;
  elapsedMs: number;
  done: boolean;
}

/**
 * Where a run's time went, in seconds (PipelineOptions.timings). The main thread's own stages (read, dispatch,
 * wait, delivery) add up to its wall time; parse, physics and format are summed over the threads that ran them
 * (this one for threads = 1, else the workers), so that a stage that stays in one thread shows as such.
 */
export interface StageTimes {
  /** Main thread: waiting for input and cutting it into batches. */
  read: number;
  /** Parsing and validating records. */
  parse: number;
  /** processParticles: jet finding, re-clustering, declustering, observables. */
  physics: number;
  /** Formatting results for the sink (the export text), where the sink lets the workers do it. */
  format: number;
  /** Main thread: handing batches to the worker threads (threads > 1). */
  dispatch: number;
  /** Main thread: waiting for the worker threads' results (threads > 1). */
  wait: number;
  /** Main thread: in-order delivery to the sink, its writes included. */
  delivery: number;
}

export function noStageTimes(): StageTimes {
  return { read: 0, parse: 0, physics: 0, format: 0, dispatch: 0, wait: 0, delivery: 0 };
}

export interface PipelineSummary extends PipelineCounts {
  header: IngestHeader;
  settings: ProcessSettings;
  threads: number;
  bytesRead: number;
  bytesTotal: number | null;
  elapsedMs: number;
  /** Messages of the first skipped records. */
  skippedErrors: string[];
  /** Stage times, when asked for (PipelineOptions.timings). */
  stages: StageTimes | null;
}

/**
 * A sink whose text the worker threads may write for it (the export): the pipeline then hands write() the bytes
 * made where the batch was processed, so that formatting scales with the threads.
 */
export interface WorkerFormat {
  kind: 'export';
  style: JetLineStyle;
}

export interface ResultSink {
  /** Called once, before any record, with the input's header and the effective settings. */
  begin(header: IngestHeader, settings: ProcessSettings): void | Promise<void>;
  /** The formatting worker threads may do for this sink (set by begin()), if any. */
  readonly workerFormat?: WorkerFormat | null;
  /** Called with consecutive records and their results, in input order. */
  write(records: RecordMeta[], results: RecordResult[]): void | Promise<void>;
  /**
   * With a workerFormat, called instead of write() with the text (UTF-8) of consecutive records that the thread
   * which processed them made, and their counts.
   */
  writeFormatted?(bytes: Uint8Array, counts: BatchCounts): void | Promise<void>;
  /** Called once after the last record when everything succeeded. */
  end(summary: PipelineSummary): void | Promise<void>;
  /** Called instead of end() when the run failed or was cancelled. */
  abort?(error: unknown): void | Promise<void>;
}
