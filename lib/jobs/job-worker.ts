// Worker-thread entry of one processing job (bundled to dist/engine/job-worker.js by scripts/build-engine.mjs):
// reads the uploaded file (while it arrives, for an early job: lib/ingest/growing-file.ts), runs the pipeline
// (with its own pool of worker threads when threads > 1), writes the sample's columns and plane histograms, and
// reports to the server. It never touches the database: the server records the outcome, so that a job killed at
// any point leaves nothing the server would take for finished.
import { parentPort, workerData } from 'node:worker_threads';
import { IngestAbortError } from '@/lib/ingest/errors';
import { GrowingFile } from '@/lib/ingest/growing-file';
import { openParticleFile, openParticleStream, readableWhileWritten, type ParticleReader } from '@/lib/ingest/reader';
import { jobErrorReport } from './failure';
import type { JobControlMessage, JobWorkerInput, JobWorkerMessage } from './messages';
import { MAX_DOCUMENT_CHARS, processUpload } from './process-upload';

const input = workerData as JobWorkerInput;
const port = parentPort!;
const cancel = new AbortController();
const growing = input.growing ? new GrowingFile(input.uploadPath) : null;
port.on('message', (message: JobControlMessage) => {
  if (message.type === 'uploaded') growing?.complete(message.size);
  if (message.type === 'cancel') {
    cancel.abort();
    growing?.fail(new IngestAbortError());
  }
});

function post(message: JobWorkerMessage, transfer: ArrayBuffer[] = []): void {
  port.postMessage(message, transfer);
}

/** The upload's reader: a growing upload of plain text is read as it arrives, anything else once it is complete. */
async function openUpload(): Promise<ParticleReader> {
  const options = { maxDocumentLength: MAX_DOCUMENT_CHARS, maxTextBytes: input.limits.maxTextBytes };
  if (growing) {
    if (readableWhileWritten(await growing.head(8))) return openParticleStream(await growing.open(), { ...options, name: input.uploadPath });
    await growing.completed();
  }
  return openParticleFile(input.uploadPath, options);
}

async function run(): Promise<void> {
  const reader = await openUpload();
  const { counts, progress, planes } = await processUpload({
    reader,
    sampleDir: input.sampleDir,
    settings: input.settings,
    threads: input.threads,
    maxRecords: input.limits.maxRecords,
    signal: cancel.signal,
    onInput: (header) => post({ type: 'input', input: header }),
    onProgress: (progress) => post({ type: 'progress', progress }),
  });
  post({ type: 'done', counts, progress, planes }, planes.map((plane) => plane.bytes.buffer as ArrayBuffer));
}
run().then(
  () => port.close(),
  (error: unknown) => {
    post(error instanceof IngestAbortError || cancel.signal.aborted ? { type: 'cancelled' } : { type: 'failed', error: jobErrorReport(error) });
    port.close();
  },
);
