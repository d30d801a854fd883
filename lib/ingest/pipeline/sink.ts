// What the pipeline hands to its consumers (the export writer here, the server's column writer later).

import type { ProcessSettings, RecordResult, RemovedParticles } from '../../physics/types';
import type { IngestHeader } from '../header';

/** A record as the sinks see it (its particles are not kept). */
export interface RecordMeta {
  line: number;
  id: string | number;
  weight: number;
  /** Number of input particles of the record. */
  nParticles: number;
}

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

export interface PipelineSummary extends PipelineCounts {
  header: IngestHeader;
  settings: ProcessSettings;
  threads: number;
  bytesRead: number;
  bytesTotal: number | null;
  elapsedMs: number;
  /** Messages of the first skipped records. */
  skippedErrors: string[];
}

export interface ResultSink {
  /** Called once, before any record, with the input's header and the effective settings. */
  begin(header: IngestHeader, settings: ProcessSettings): void | Promise<void>;
  /** Called with consecutive records and their results, in input order. */
  write(records: RecordMeta[], results: RecordResult[]): void | Promise<void>;
  /** Called once after the last record when everything succeeded. */
  end(summary: PipelineSummary): void | Promise<void>;
  /** Called instead of end() when the run failed or was cancelled. */
  abort?(error: unknown): void | Promise<void>;
}
