// One processing run into a sample's column folder, shared by the server's job thread (job-worker.ts) and the
// scaled mode's shards (lib/scale/shard-job.ts): the pipeline into SampleSink, with its counts and planes.
import { runPipeline } from '@/lib/ingest/pipeline/run';
import type { PipelineProgress } from '@/lib/ingest/pipeline/sink';
import type { ParticleReader } from '@/lib/ingest/reader';
import type { SampleCounts, SampleInput, SampleSettings } from '@/models/sample-fields';
import type { FinishedPlane } from './messages';
import { SampleSink } from './sample-sink';

/** The one-document form and single lines are read whole: kept well below the server's memory budget. */
export const MAX_DOCUMENT_CHARS = 64 * 1024 * 1024;
export const PROGRESS_INTERVAL_MS = 500;

export interface ProcessRun {
  reader: ParticleReader;
  /** Where the columns are committed; the folder appears only when processing succeeded. */
  sampleDir: string;
  settings: SampleSettings;
  threads: number;
  maxRecords: number;
  signal: AbortSignal;
  onInput(input: SampleInput): void;
  onProgress(progress: PipelineProgress): void;
}

export interface ProcessOutcome {
  counts: SampleCounts;
  /** The last progress report (the pipeline always reports its final progress before it ends). */
  progress: PipelineProgress;
  planes: FinishedPlane[];
}

export async function processUpload(run: ProcessRun): Promise<ProcessOutcome> {
  const sink = new SampleSink(run.sampleDir, run.onInput, run.maxRecords);
  let last: PipelineProgress | null = null;
  const summary = await runPipeline({
    reader: run.reader,
    settings: run.settings,
    sink,
    threads: run.threads,
    signal: run.signal,
    progressIntervalMs: PROGRESS_INTERVAL_MS,
    onProgress: (progress) => {
      last = progress;
      run.onProgress(progress);
    },
  });
  const { records, particles, jets, rejected, primarySplittings, allSplittings, particlesRemoved, flavours } = summary;
  return {
    counts: { records, particles, jets, jetsRejected: rejected, primarySplittings, allSplittings, particlesRemoved, flavours },
    progress: last!,
    planes: sink.finishedPlanes(),
  };
}
