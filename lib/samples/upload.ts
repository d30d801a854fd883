// POST /api/samples/upload: receive the file (streamed to storage/uploads/, hashed on the way), check the fields
// and the caller's role in the study, then either offer an existing sample of the same file and settings or
// queue a new one for processing. A refused upload leaves neither a row nor a file. When the runner has room, the
// job starts while the file arrives (an early job, lib/jobs/runner.ts): the new sample adopts it, created running;
// any other outcome drops it.
import { mkdir } from 'node:fs/promises';
import { Op, type Transaction } from 'sequelize';
import { ApiError, badRequest } from '@/lib/api/errors';
import { checkedInput } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import { jobRunner, type EarlyJob } from '@/lib/jobs/runner';
import type { Sample } from '@/models/sample';
import type { SampleSettings } from '@/models/sample-fields';
import type { User } from '@/models/user';
import { UNFINISHED_SAMPLE_STATES } from '@/models/vocabulary';
import { sampleIncludes, visibleStudyIds, type LoadedSample } from './access';
import { readSampleConfig } from './config';
import { fileNameProblem } from './file-name';
import { receiveUpload, type ReceivedFile } from './multipart-upload';
import { settingsInputSchema, settingsKey } from '../ingest/settings';
import { createSharingSample } from './sharing';
import { sampleStorage } from './storage';
import { uploadFieldsSchema, type UploadFields } from './upload-fields';
import { sampleSummary } from './views';
import type { SampleSummary } from './shapes';

export const UPLOAD_FILE_FIELD = 'file';

/**
 * queued: a new sample waits for processing; duplicateOf: the caller can already see a sample of this file and
 * settings; shared: a new, done sample that uses the tables of the same file processed for a study the caller
 * cannot see (which is never named).
 */
export type UploadOutcome = { queued: SampleSummary } | { duplicateOf: SampleSummary } | { shared: SampleSummary };

function checkFileName(name: string): void {
  const problem = fileNameProblem(name);
  if (problem) throw badRequest(`Invalid upload: ${problem}.`, [{ path: UPLOAD_FILE_FIELD, message: problem }]);
}

/** 429 when the user already has as many samples queued or running as one person may. */
async function requireQueueRoom(user: User, maxJobs: number, transaction?: Transaction): Promise<void> {
  const waiting = await db().models.Sample.count({
    where: { uploadedById: user.id, state: { [Op.in]: [...UNFINISHED_SAMPLE_STATES] } },
    transaction,
  });
  if (waiting >= maxJobs) {
    throw new ApiError(
      429,
      'too_many_jobs',
      `You have ${waiting} samples queued or being processed, the most one person may have at once on this server; ` +
        'wait for one to finish, or cancel one, then upload again.',
    );
  }
}

/**
 * The fields sent before the file, checked as far as they go, and the study role when the study is known; returns
 * the settings these fields give (the defaults when none came), for an early job.
 */
async function checkEarly(user: User, fieldsSoFar: Record<string, unknown>, fileName: string, maxJobs: number): Promise<SampleSettings> {
  checkFileName(fileName);
  await requireQueueRoom(user, maxJobs);
  const known = checkedInput(uploadFieldsSchema.partial(), fieldsSoFar, 'upload', '(form)');
  if (known.studyId !== undefined) await studyAccess(user, known.studyId, 'editor');
  return known.settings ?? settingsInputSchema.parse({});
}

/** A sample of the same bytes and settings that the user can see and that is not failed or cancelled. */
async function findDuplicate(user: User, file: ReceivedFile, fields: UploadFields, transaction: Transaction) {
  const visible = await visibleStudyIds(user, transaction);
  const candidates = (await db().models.Sample.findAll({
    where: {
      fileHash: file.sha256,
      settingsKey: settingsKey(fields.settings),
      state: { [Op.in]: ['queued', 'running', 'done'] },
      ...(visible === 'all' ? {} : { studyId: { [Op.in]: visible } }),
    },
    include: sampleIncludes(),
    order: [['id', 'DESC']],
    transaction,
  })) as LoadedSample[];
  return candidates.find((sample) => sample.studyId === fields.studyId) ?? candidates[0] ?? null;
}

/** A done sample of the same bytes and settings anywhere (the caller may not see it). */
function findProcessed(file: ReceivedFile, fields: UploadFields, transaction: Transaction) {
  return db().models.Sample.findOne({
    where: { fileHash: file.sha256, settingsKey: settingsKey(fields.settings), state: 'done' },
    order: [['id', 'ASC']],
    transaction,
  });
}

export async function acceptUpload(user: User, request: Request): Promise<UploadOutcome> {
  const config = readSampleConfig();
  const storage = sampleStorage();
  await mkdir(storage.uploadsDir, { recursive: true });
  const runner = await jobRunner();
  let earlySettings: SampleSettings | null = null;
  let starting: Promise<EarlyJob | null> = Promise.resolve(null);
  const upload = await receiveUpload(request, {
    storage,
    maxBytes: config.uploadMaxBytes,
    fileField: UPLOAD_FILE_FIELD,
    beforeFile: async (fieldsSoFar, fileName) => {
      earlySettings = await checkEarly(user, fieldsSoFar, fileName, config.maxJobsPerUser);
    },
    onFileOpened: (storedName) => {
      if (!earlySettings || !runner.startEarly) return;
      starting = runner.startEarly(storedName, earlySettings).catch((error: unknown) => {
        console.error('[upload] cannot start the job early (it will be queued):', error);
        return null;
      });
    },
  }).catch(async (error: unknown) => {
    await (await starting)?.drop();
    throw error;
  });
  const started = await starting;
  // Null when the job gave its place up to a queued sample while the file arrived: the upload is queued as usual.
  const early = started && upload.file && started.uploaded(upload.file.size) ? started : null;
  let kept = false;
  // The new sample that takes over the early job (set inside the transaction, adopted once it is committed).
  const adoption: { sample: Sample | null; done: boolean } = { sample: null, done: false };
  try {
    const { file } = upload;
    if (!file) {
      throw badRequest(`Invalid upload: the "${UPLOAD_FILE_FIELD}" field with the file is missing.`, [
        { path: UPLOAD_FILE_FIELD, message: 'required' },
      ]);
    }
    if (file.size === 0) {
      throw badRequest('Invalid upload: the file is empty.', [{ path: UPLOAD_FILE_FIELD, message: 'empty file' }]);
    }
    const fields = checkedInput(uploadFieldsSchema, upload.fields, 'upload', '(form)');
    const { study } = await studyAccess(user, fields.studyId, 'editor');
    const { models, write } = db();
    const outcome = await write(async (transaction) => {
      const duplicate = fields.force ? null : await findDuplicate(user, file, fields, transaction);
      if (duplicate) return { duplicateOf: sampleSummary(duplicate) };
      const own = {
        studyId: study.id,
        uploadedById: user.id,
        name: fields.name,
        label: fields.label,
        description: fields.description,
        tags: fields.tags,
        fileName: file.originalName,
        uploadMs: Math.round(upload.elapsedMs),
      };
      const load = async (id: number) =>
        sampleSummary((await models.Sample.findByPk(id, { include: sampleIncludes(), transaction })) as LoadedSample);
      const processed = fields.force ? null : await findProcessed(file, fields, transaction);
      if (processed) return { shared: await load((await createSharingSample(processed, own, transaction)).id) };
      await requireQueueRoom(user, config.maxJobsPerUser, transaction);
      const adopting = early !== null && settingsKey(early.settings) === settingsKey(fields.settings);
      const sample = await models.Sample.create(
        {
          ...own,
          ...(adopting ? { state: 'running', startedAt: early.startedAt, attempts: 1 } : { state: 'queued' }),
          settings: fields.settings,
          settingsKey: settingsKey(fields.settings),
          fileSize: file.size,
          fileHash: file.sha256,
          uploadFile: file.storedName,
        },
        { transaction },
      );
      if (adopting) adoption.sample = sample;
      return { queued: await load(sample.id) };
    });
    kept = 'queued' in outcome;
    if (kept && early && adoption.sample) {
      early.adopt(adoption.sample);
      adoption.done = true;
    }
    if (kept) runner.wake();
    return outcome;
  } finally {
    if (!kept) await upload.discard();
    // Not adopted (refused, a duplicate, other settings, or the sample's row failed): stopped and removed.
    if (started && !adoption.done) await started.drop();
  }
}
