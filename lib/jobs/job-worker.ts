// Worker-thread entry of one processing job (bundled to dist/engine/job-worker.js by scripts/build-engine.mjs):
// reads the uploaded file, runs the pipeline (with its own pool of worker threads when threads > 1), writes the
// sample's columns and plane histograms, and reports to the server. It never touches the database: the server
// records the outcome, so that a job killed at any point leaves nothing the server would take for finished.
import { parentPort, workerData } from 'node:worker_threads';
import { IngestAbortError, IngestError } from '@/lib/ingest/errors';
import { runPipeline } from '@/lib/ingest/pipeline/run';
import type { PipelineProgress } from '@/lib/ingest/pipeline/sink';
import { openParticleFile } from '@/lib/ingest/reader';
import type { JobErrorReport } from './failure';
import type { JobControlMessage, JobWorkerInput, JobWorkerMessage } from './messages';
import { SampleSink } from './sample-sink';

/** The one-document form and single lines are read whole: kept well below the server's memory budget. */
const MAX_DOCUMENT_CHARS = 64 * 1024 * 1024;
const PROGRESS_INTERVAL_MS = 500;

const input = workerData as JobWorkerInput;
const port = parentPort!;
const cancel = new AbortController();
port.on('message', (message: JobControlMessage) => {
  if (message.type === 'cancel') cancel.abort();
});

function post(message: JobWorkerMessage, transfer: ArrayBuffer[] = []): void {
  port.postMessage(message, transfer);
}

function report(error: unknown): JobErrorReport {
  if (error instanceof IngestError) return { code: error.code, message: error.message, line: error.line };
  return { code: 'internal', message: error instanceof Error ? error.message : String(error), line: null };
}

async function run(): Promise<void> {
  const reader = await openParticleFile(input.uploadPath, {
    maxDocumentLength: MAX_DOCUMENT_CHARS,
    maxTextBytes: input.limits.maxTextBytes,
  });
  const sink = new SampleSink(input.sampleDir, (header) => post({ type: 'input', input: header }), input.limits.maxRecords);
  let last: PipelineProgress | null = null;
  const summary = await runPipeline({
    reader,
    settings: input.settings,
    sink,
    threads: input.threads,
    signal: cancel.signal,
    progressIntervalMs: PROGRESS_INTERVAL_MS,
    onProgress: (progress) => {
      last = progress;
      post({ type: 'progress', progress });
    },
  });
  const planes = sink.finishedPlanes();
  const { records, particles, jets, rejected, primarySplittings, allSplittings, particlesRemoved, flavours } = summary;
  post(
    {
      type: 'done',
      counts: { records, particles, jets, jetsRejected: rejected, primarySplittings, allSplittings, particlesRemoved, flavours },
      // The pipeline always reports its final progress before it ends.
      progress: last!,
      planes,
    },
    planes.map((plane) => plane.bytes.buffer as ArrayBuffer),
  );
}

run().then(
  () => port.close(),
  (error: unknown) => {
    post(error instanceof IngestAbortError || cancel.signal.aborted ? { type: 'cancelled' } : { type: 'failed', error: report(error) });
    port.close();
  },
);
