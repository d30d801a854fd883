// Attaching a processed sample to another study: the uploader of a file that is already processed in a study
// they can see gets a sample of it in their own study, on the same stored tables, without processing it again.
import { conflict } from '@/lib/api/errors';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import type { User } from '@/models/user';
import { sampleAccess, sampleIncludes, type LoadedSample } from './access';
import { requireDone } from './done-sample';
import { createSharingSample } from './sharing';
import { sampleSummary } from './views';
import type { SampleSummary } from './shapes';

export interface AttachInput {
  studyId: number;
  /** Defaults to the original sample's name. */
  name?: string;
}

/** Needs the viewer role on the sample's study and the editor role in the target study. */
export async function attachSample(user: User, sampleId: number, input: AttachInput): Promise<SampleSummary> {
  const { models, write } = db();
  return write(async (transaction) => {
    const { sample } = await sampleAccess(user, sampleId, 'viewer', transaction);
    requireDone(sample);
    const { study } = await studyAccess(user, input.studyId, 'editor', transaction);
    const already = await models.Sample.findOne({
      where: { studyId: study.id, fileHash: sample.fileHash, settingsKey: sample.settingsKey, state: 'done' },
      transaction,
    });
    if (already) {
      throw conflict('already_in_study', `The study already has this file processed with these settings: sample ${already.id}.`);
    }
    const created = await createSharingSample(
      sample,
      {
        studyId: study.id,
        uploadedById: user.id,
        name: input.name ?? sample.name,
        label: sample.label,
        description: sample.description,
        tags: sample.tags,
        fileName: sample.fileName,
        uploadMs: 0,
      },
      transaction,
    );
    const loaded = (await models.Sample.findByPk(created.id, { include: sampleIncludes(), transaction })) as LoadedSample;
    return sampleSummary(loaded);
  });
}
