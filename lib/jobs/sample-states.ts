// The database side of a sample's job: each change of state is one short write transaction, and each one names
// the state it expects to find, so a late message (progress after a cancel) changes nothing.
import { col, fn, literal, Op, type Transaction } from 'sequelize';
import { SOFTWARE_VERSION } from '@/lib/ingest/export';
import { db } from '@/lib/db/connection';
import { announceJobEnd } from '@/lib/samples/job-ends';
import type { SampleCounts, SampleError, SampleInput, SampleProgress } from '@/models/sample-fields';
import type { Sample } from '@/models/sample';
import { nextFairJob, type OwnerState } from './fair-order';
import { sampleError } from './failure';
import type { FinishedPlane } from './messages';
import { notifySampleOutcome } from './sample-notifications';

/** A job cut short by a server stop this many times is not tried again. */
export const MAX_ATTEMPTS = 2;

/** Who has jobs running and when each person's last job started, for the people in `owners`. */
async function ownerStates(owners: Array<number | null>, transaction: Transaction): Promise<Map<number | null, OwnerState>> {
  const { models } = db();
  const states = new Map<number | null, OwnerState>(owners.map((owner) => [owner, { running: 0, lastStartedAt: null }]));
  const rows = (await models.Sample.findAll({
    attributes: [
      'uploadedById',
      [fn('SUM', literal("CASE WHEN state = 'running' THEN 1 ELSE 0 END")), 'running'],
      [fn('MAX', col('started_at')), 'lastStartedAt'],
    ],
    where: { uploadedById: { [Op.in]: owners.filter((owner) => owner !== null) } },
    group: ['uploadedById'],
    raw: true,
    transaction,
  })) as unknown as Array<{ uploadedById: number; running: number | null; lastStartedAt: string | Date | null }>;
  for (const row of rows) {
    const started = row.lastStartedAt === null ? null : new Date(row.lastStartedAt).getTime();
    states.set(row.uploadedById, { running: Number(row.running ?? 0), lastStartedAt: started });
  }
  return states;
}

/** Takes the next queued sample by the fair rule (fair-order.ts) and marks it running; null when none waits. */
export async function claimNextQueued(): Promise<Sample | null> {
  const { models, write } = db();
  return write(async (transaction) => {
    const queued = await models.Sample.findAll({
      where: { state: 'queued' },
      attributes: ['id', 'uploadedById'],
      order: [['id', 'ASC']],
      transaction,
    });
    const jobs = queued.map((sample) => ({ id: sample.id, owner: sample.uploadedById }));
    const next = nextFairJob(jobs, await ownerStates([...new Set(jobs.map((job) => job.owner))], transaction));
    if (!next) return null;
    const sample = await models.Sample.findByPk(next.id, { transaction, rejectOnEmpty: true });
    await sample.update(
      { state: 'running', startedAt: new Date(), progress: null, attempts: sample.attempts + 1 },
      { transaction },
    );
    return sample;
  });
}

async function updateRunning(sampleId: number, change: Partial<Sample['_creationAttributes']>): Promise<boolean> {
  const { models, write } = db();
  const [updated] = await write((transaction) =>
    models.Sample.update(change, { where: { id: sampleId, state: 'running' }, transaction }),
  );
  return updated > 0;
}

export function recordProgress(sampleId: number, progress: SampleProgress): Promise<boolean> {
  return updateRunning(sampleId, { progress });
}

export function recordInput(sampleId: number, input: SampleInput): Promise<boolean> {
  return updateRunning(sampleId, { input });
}

/**
 * Marks the sample done with its counts and stores its plane histograms, in one transaction. False when the
 * sample is no longer running (deleted meanwhile): then nothing was stored.
 */
export async function recordDone(
  sampleId: number,
  outcome: { counts: SampleCounts; progress: SampleProgress; planes: FinishedPlane[]; processingMs: number },
): Promise<boolean> {
  const { models, write } = db();
  const recorded = await write(async (transaction) => {
    const [updated] = await models.Sample.update(
      {
        state: 'done',
        counts: outcome.counts,
        progress: outcome.progress,
        finishedAt: new Date(),
        processingMs: outcome.processingMs,
        softwareVersion: SOFTWARE_VERSION,
        uploadFile: null,
      },
      { where: { id: sampleId, state: 'running' }, transaction },
    );
    if (updated === 0) return false;
    await models.SamplePlane.bulkCreate(
      outcome.planes.map(({ horizontal, bytes }) => ({
        sampleId,
        horizontal,
        histogram: Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength),
      })),
      { transaction },
    );
    await notifySampleOutcome(sampleId, 'finished', transaction);
    return true;
  });
  if (recorded) announceJobEnd(sampleId);
  return recorded;
}

/** Marks a queued or running sample failed or cancelled; `processingMs` is null when it never ran. */
export async function recordEnded(
  sampleId: number,
  state: 'failed' | 'cancelled',
  error: SampleError | null,
  processingMs: number | null = null,
) {
  const { models, write } = db();
  const recorded = await write(async (transaction) => {
    const [updated] = await models.Sample.update(
      { state, error, finishedAt: new Date(), processingMs, softwareVersion: SOFTWARE_VERSION, uploadFile: null },
      { where: { id: sampleId, state: { [Op.in]: ['queued', 'running'] } }, transaction },
    );
    if (updated > 0 && state === 'failed') await notifySampleOutcome(sampleId, 'failed', transaction);
    return updated > 0;
  });
  if (recorded) announceJobEnd(sampleId);
  return recorded;
}

export interface UnfinishedAtStart {
  requeued: number[];
  /** Failed now: cut short by server stops MAX_ATTEMPTS times, or their upload is gone. */
  abandoned: number[];
  /** The upload files of the samples that wait for their job. */
  waitingUploads: Set<string>;
}

/** What a runner's start changed, in the server's log (`tag`: the runner's). */
export function logStartUp(tag: string, unfinished: UnfinishedAtStart, removed: string[]): void {
  if (unfinished.requeued.length > 0) console.log(`[${tag}] requeued interrupted samples ${unfinished.requeued.join(', ')}`);
  if (unfinished.abandoned.length > 0) console.log(`[${tag}] marked failed: samples ${unfinished.abandoned.join(', ')}`);
  if (removed.length > 0) console.log(`[${tag}] removed ${removed.length} unowned file(s) from storage: ${removed.join(', ')}`);
}

/**
 * At start no job runs, so a sample marked running was cut short by a stop of the server: it goes back to the
 * queue (from the start of its file), unless that happened MAX_ATTEMPTS times or its upload is missing.
 */
export async function requeueInterrupted(
  uploadExists: (fileName: string) => boolean,
  /** Running samples whose job carries on elsewhere (the scaled mode's queue): left running. */
  carryOn: ReadonlySet<number> = new Set(),
): Promise<UnfinishedAtStart> {
  const { models, write } = db();
  return write(async (transaction) => {
    const unfinished = await models.Sample.findAll({ where: { state: ['queued', 'running'] }, transaction });
    const result: UnfinishedAtStart = { requeued: [], abandoned: [], waitingUploads: new Set() };
    for (const sample of unfinished) {
      if (carryOn.has(sample.id) && sample.state === 'running' && sample.uploadFile) {
        result.waitingUploads.add(sample.uploadFile);
        continue;
      }
      const uploadKept = sample.uploadFile !== null && uploadExists(sample.uploadFile);
      const triesLeft = sample.state === 'queued' || sample.attempts < MAX_ATTEMPTS;
      if (!uploadKept || !triesLeft) {
        const why = uploadKept
          ? `processing was cut short by a stop of the server ${sample.attempts} times`
          : 'the uploaded file is no longer in storage';
        const error = sampleError({ code: 'interrupted', message: `Not processed: ${why}.`, line: null });
        await sample.update(
          { state: 'failed', error, finishedAt: new Date(), uploadFile: null },
          { transaction },
        );
        await notifySampleOutcome(sample.id, 'failed', transaction);
        result.abandoned.push(sample.id);
        continue;
      }
      if (sample.state === 'running') {
        await sample.update({ state: 'queued', progress: null, startedAt: null }, { transaction });
        result.requeued.push(sample.id);
      }
      result.waitingUploads.add(sample.uploadFile!);
    }
    return result;
  });
}
