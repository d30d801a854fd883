// Deleting samples: a job still to finish is cancelled first, then the row goes, then the files, except tables
// that another sample still uses (sharing.ts).
import type { Transaction } from 'sequelize';
import { db } from '@/lib/db/connection';
import { jobRunner } from '@/lib/jobs/runner';
import type { Sample } from '@/models/sample';
import { UNFINISHED_SAMPLE_STATES } from '@/models/vocabulary';
import { removeTablesFolders, tablesFolderOf, unusedTablesFolders } from './sharing';
import { removeUpload, sampleStorage } from './storage';

export function isUnfinished(sample: Sample): boolean {
  return (UNFINISHED_SAMPLE_STATES as readonly string[]).includes(sample.state);
}

/** Takes the sample out of the queue or stops its job; resolves once it is recorded and cleaned up. */
export async function cancelSample(sample: Sample): Promise<void> {
  if (isUnfinished(sample)) await (await jobRunner()).cancel(sample);
}

async function removeFiles(samples: Sample[], unusedFolders: number[]): Promise<void> {
  const storage = sampleStorage();
  await removeTablesFolders(storage, unusedFolders);
  for (const sample of samples) await removeUpload(storage, sample.uploadFile);
}

export async function deleteSample(sample: Sample): Promise<void> {
  await cancelSample(sample);
  const unused = await db().write(async (transaction) => {
    await db().models.Sample.destroy({ where: { id: sample.id }, transaction });
    return unusedTablesFolders([tablesFolderOf(sample)], transaction);
  });
  await removeFiles([sample], unused);
}

/**
 * Runs `deleteStudy` (whose foreign keys delete the study's sample rows, inside the transaction it is given)
 * with the samples' jobs cancelled before and their files removed after.
 */
export async function deleteStudyWithSamples(
  studyId: number,
  deleteStudy: (transaction: Transaction) => Promise<void>,
): Promise<void> {
  const samples = await db().models.Sample.findAll({ where: { studyId } });
  for (const sample of samples) await cancelSample(sample);
  const unused = await db().write(async (transaction) => {
    await deleteStudy(transaction);
    return unusedTablesFolders(samples.map(tablesFolderOf), transaction);
  });
  await removeFiles(samples, unused);
}
