// The work of a `splitfield worker` on each kind of job: plan (cut the upload, add the flow of shards and merge),
// shard (process a part into columns under work/), merge (join the shards' columns into the sample's, in record
// order, and fill its planes). Jobs read and write only the object store; the web server records the outcome.
import { randomUUID } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { FlowProducer, type Job, type Queue, UnrecoverableError } from 'bullmq';
import type IORedis from 'ioredis';
import { mergeColumnFolders } from '@/lib/ingest/column-merge';
import { openParquetFile } from '@/lib/ingest/columnar/parquet-reader';
import { ColumnReader } from '@/lib/ingest/columns';
import { IngestAbortError, IngestError } from '@/lib/ingest/errors';
import { LineSource } from '@/lib/ingest/lines';
import { openFromSource, openParticleFile, type ParticleReader } from '@/lib/ingest/reader';
import { planesFromColumns } from '@/lib/jobs/column-planes';
import { jobErrorReport, type JobErrorReport } from '@/lib/jobs/failure';
import { MAX_DOCUMENT_CHARS, processUpload } from '@/lib/jobs/process-upload';
import { samplePrefix, workPrefix } from '@/lib/objects/keys';
import { type ObjectStore, removePrefix } from '@/lib/objects/object-store';
import { fetchColumnFolder, publishColumnFolder } from '@/lib/samples/column-files';
import type { QueueSettings } from './config';
import { sumCounts } from './counts';
import {
  cancelKey,
  jobIds,
  KEEP_JOBS,
  type MergeJobData,
  type MergeResult,
  type PlanJobData,
  QUEUE_NAME,
  type RunRef,
  type ShardJobData,
  type ShardResult,
  shardSources,
} from './queue';
import { planShards } from './shard-plan';

export interface WorkerContext {
  store: ObjectStore;
  connection: IORedis;
  queue: Queue;
  settings: QueueSettings;
  /** Pipeline threads of one shard. */
  threads: number;
  /** This worker's scratch folder. */
  scratch: string;
}

/** A failure that retrying cannot mend (bad input, a limit, a cancel): the run fails at once with this report. */
function final(report: JobErrorReport): UnrecoverableError {
  return new UnrecoverableError(JSON.stringify(report));
}

async function withScratch<T>(context: WorkerContext, work: (dir: string) => Promise<T>): Promise<T> {
  const dir = path.join(context.scratch, randomUUID());
  await mkdir(dir, { recursive: true });
  try {
    return await work(dir);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

async function plan(job: Job<PlanJobData>, context: WorkerContext): Promise<{ shards: number }> {
  const data = job.data;
  const shardPlan = await planShards(context.store, data.uploadKey, data.fileSize, context.settings.shardBytes);
  if (shardPlan.kind === 'lines' && data.fileSize > data.limits.maxTextBytes) {
    throw final({ code: 'limit', message: `the file holds more than ${data.limits.maxTextBytes} bytes of text, the most this server reads`, line: null });
  }
  const sources = shardSources(shardPlan);
  const merge = jobIds.merge(data);
  // A retried plan finds the flow it added before.
  if (!(await context.queue.getJob(merge))) {
    const retries = { attempts: context.settings.attempts, backoff: { type: 'exponential', delay: context.settings.retryDelayMs }, ...KEEP_JOBS };
    const flows = new FlowProducer({ connection: context.connection });
    try {
      await flows.add({
        name: 'merge',
        queueName: QUEUE_NAME,
        data: { sampleId: data.sampleId, attempt: data.attempt, shards: sources.length, settings: data.settings, maxRecords: data.limits.maxRecords } satisfies MergeJobData,
        opts: { jobId: merge, ...retries },
        children: sources.map((source, index) => ({
          name: 'shard',
          queueName: QUEUE_NAME,
          data: { ...data, index, source } satisfies ShardJobData,
          opts: { jobId: jobIds.shard(data, index), failParentOnFailure: true, ...retries },
        })),
      });
    } finally {
      await flows.close();
    }
  }
  return { shards: sources.length };
}

/** Writes bytes [start, end) of the upload at the same place of `file` (a sparse copy: the rest reads as zeros). */
async function copyRange(context: WorkerContext, data: ShardJobData, file: string, start: number, end: number, flags: 'w' | 'r+'): Promise<void> {
  await pipeline(await context.store.read(data.uploadKey, { start, end }), createWriteStream(file, { flags, start }));
}

/**
 * The shard's bytes as the readers take them: the whole file; the header, the shard's range and the footer; or a
 * Parquet file's footer and the shard's row groups, at their places in a sparse copy, so rows and row groups keep
 * the whole file's numbers.
 */
async function openShard(data: ShardJobData, context: WorkerContext, dir: string): Promise<ParticleReader> {
  const options = { maxDocumentLength: MAX_DOCUMENT_CHARS, maxTextBytes: data.limits.maxTextBytes };
  const { source } = data;
  const file = path.join(dir, 'upload');
  if (source.kind === 'whole') {
    await pipeline(await context.store.read(data.uploadKey), createWriteStream(file));
    return openParticleFile(file, options);
  }
  if (source.kind === 'rowGroups') {
    const { shard } = source;
    await copyRange(context, data, file, source.footerStart, data.fileSize, 'w');
    await copyRange(context, data, file, shard.start, shard.end, 'r+');
    return openParquetFile(file, options, { first: shard.firstGroup, end: shard.endGroup });
  }
  const { store } = context;
  const parts = async function* () {
    yield* await store.read(data.uploadKey, { start: 0, end: source.headerEnd });
    yield* await store.read(data.uploadKey, { start: source.shard.start, end: source.shard.end });
    if (source.footer) yield Buffer.from(source.footer);
  };
  const bytes = source.headerEnd + source.shard.end - source.shard.start + source.footer.length;
  const lines = new LineSource(Readable.from(parts()), { bytesTotal: bytes, maxLineLength: MAX_DOCUMENT_CHARS, maxTextBytes: data.limits.maxTextBytes });
  const reader = await openFromSource(lines, options);
  lines.continueAtLine(source.shard.firstLine);
  return reader;
}

/**
 * The web server marks a run that ended (cancelled or failed) before it removes the run's objects: what was
 * published before the mark is removed by the server, what was published after is removed here.
 */
async function dropIfEnded(context: WorkerContext, ref: RunRef, prefix: string): Promise<void> {
  if (!(await context.connection.exists(cancelKey(ref)))) return;
  await removePrefix(context.store, prefix);
  throw final({ code: 'cancelled', message: 'cancelled', line: null });
}

async function shard(job: Job<ShardJobData>, context: WorkerContext): Promise<ShardResult> {
  const data = job.data;
  const cancel = new AbortController();
  return withScratch(context, async (dir) => {
    let input: ShardResult['input'] | null = null;
    try {
      const reader = await openShard(data, context, dir);
      const columns = path.join(dir, 'columns');
      const { counts } = await processUpload({
        reader,
        sampleDir: columns,
        settings: data.settings,
        threads: context.threads,
        maxRecords: data.limits.maxRecords,
        signal: cancel.signal,
        onInput: (header) => (input = header),
        onProgress: (progress) => {
          job.updateProgress({ ...progress }).catch(() => undefined);
          context.connection.exists(cancelKey(data)).then(
            (marked) => marked && cancel.abort(),
            () => undefined,
          );
        },
      });
      // Each run of a shard writes its own copy: a copy still running after its lock ran out (a stall) never
      // overwrites what the merge reads, which is exactly the copy whose completion the queue recorded.
      const prefix = `${workPrefix(data.sampleId, data.attempt)}shard-${data.index}-${randomUUID()}/`;
      await publishColumnFolder(context.store, columns, prefix);
      await dropIfEnded(context, data, prefix);
      return { index: data.index, prefix, counts, input: input! };
    } catch (error) {
      // A shard whose run ended meanwhile (another shard failed, or a cancel) may fail because the run's objects are
      // gone: that is the end's doing, not a failure of its own.
      const ended = cancel.signal.aborted || (await context.connection.exists(cancelKey(data)).catch(() => 0)) > 0;
      if (error instanceof IngestAbortError || ended) throw final({ code: 'cancelled', message: 'cancelled', line: null });
      if (error instanceof IngestError) throw final(jobErrorReport(error));
      throw error;
    }
  });
}

async function merge(job: Job<MergeJobData>, context: WorkerContext): Promise<MergeResult> {
  const data = job.data;
  const results = Object.values(await job.getChildrenValues<ShardResult>()).sort((a, b) => a.index - b.index);
  if (results.length !== data.shards || results.some((result, k) => result.index !== k)) {
    throw new Error(`the merge found ${results.length} shard results of ${data.shards}`);
  }
  const counts = sumCounts(results.map((result) => result.counts));
  if (counts.records > data.maxRecords) {
    throw final({ code: 'limit', message: `the file has more than ${data.maxRecords} records, the most one sample may hold on this server`, line: null });
  }
  const work = workPrefix(data.sampleId, data.attempt);
  return withScratch(context, async (dir) => {
    const parts = results.map((result) => path.join(dir, `shard-${result.index}`));
    // One shard at a time (each fetches a few files at once): hundreds of requests at once overwhelm small servers.
    for (let k = 0; k < parts.length; k++) await fetchColumnFolder(context.store, results[k].prefix, parts[k]);
    const merged = path.join(dir, 'merged');
    await mergeColumnFolders(parts, merged);
    const planes = await planesFromColumns(await ColumnReader.open(merged), data.settings.jet.R);
    await publishColumnFolder(context.store, merged, samplePrefix(data.sampleId));
    await dropIfEnded(context, data, samplePrefix(data.sampleId));
    await removePrefix(context.store, work);
    return {
      counts,
      input: results[0].input,
      planes: planes.map((plane) => ({ horizontal: plane.horizontal, base64: Buffer.from(plane.bytes).toString('base64') })),
      shards: results.length,
    };
  });
}

export function runJob(job: Job, context: WorkerContext): Promise<unknown> {
  switch (job.name) {
    case 'plan':
      return plan(job as Job<PlanJobData>, context);
    case 'shard':
      return shard(job as Job<ShardJobData>, context);
    case 'merge':
      return merge(job as Job<MergeJobData>, context);
    default:
      throw final({ code: 'internal', message: `unknown job kind "${job.name}"`, line: null });
  }
}

export function scratchFolder(name: string): string {
  return path.join(os.tmpdir(), `splitfield-worker-${name}-${process.pid}`);
}
