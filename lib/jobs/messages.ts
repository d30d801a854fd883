// What the server and a job's worker thread (dist/engine/job-worker.js) tell each other.
import type { PipelineProgress } from '@/lib/ingest/pipeline/sink';
import type { HorizontalCoordinate } from '@/lib/physics/density';
import type { SampleCounts, SampleInput, SampleSettings } from '@/models/sample-fields';
import type { JobErrorReport } from './failure';

/** The worker's workerData. */
export interface JobWorkerInput {
  /** The uploaded file. */
  uploadPath: string;
  /** Where the sample's columns go; it appears only when processing succeeded. */
  sampleDir: string;
  settings: SampleSettings;
  threads: number;
  /** Most records a sample may hold, and most bytes of text its file may hold once decompressed. */
  limits: { maxRecords: number; maxTextBytes: number };
  /**
   * The upload is still arriving: its file is read as it grows, until an `uploaded` message gives its size
   * (an early job, started before its sample exists; see runner.ts).
   */
  growing?: boolean;
}

export interface FinishedPlane {
  horizontal: HorizontalCoordinate;
  /** PlaneHistogram.toBytes(). */
  bytes: Uint8Array;
}

/** Worker → server. Exactly one of done, failed and cancelled ends every run. */
export type JobWorkerMessage =
  | { type: 'input'; input: SampleInput }
  | { type: 'progress'; progress: PipelineProgress }
  | { type: 'done'; counts: SampleCounts; progress: PipelineProgress; planes: FinishedPlane[] }
  | { type: 'failed'; error: JobErrorReport }
  | { type: 'cancelled' };

/** Server → worker. `uploaded`: the growing upload is complete, with this many bytes. */
export type JobControlMessage = { type: 'cancel' } | { type: 'uploaded'; size: number };
