// Deleting samples: a job still to finish is cancelled first, then the row goes, then the files.
import { db } from '@/lib/db/connection';
import { jobRunner } from '@/lib/jobs/runner';
import type { Sample } from '@/models/sample';
import { UNFINISHED_SAMPLE_STATES } from '@/models/vocabulary';
import { removeSampleFiles, removeUpload, sampleStorage } from './storage';

export function isUnfinished(sample: Sample): boolean {
  return (UNFINISHED_SAMPLE_STATES as readonly string[]).includes(sample.state);
}

/** Takes the sample out of the queue or stops its job; resolves once it is recorded and cleaned up. */
export async function cancelSample(sample: Sample): Promise<void> {
  if (isUnfinished(sample)) await (await jobRunner()).cancel(sample);
}

async function removeFiles(sample: Sample): Promise<void> {
  const storage = sampleStorage();
  await removeSampleFiles(storage, sample.id);
  await removeUpload(storage, sample.uploadFile);
}

export async function deleteSample(sample: Sample): Promise<void> {
  await cancelSample(sample);
  await db().write((transaction) => db().models.Sample.destroy({ where: { id: sample.id }, transaction }));
  await removeFiles(sample);
}

/**
 * Runs `deleteStudy` (whose foreign keys delete the study's sample rows) with the samples' jobs cancelled
 * before and their files removed after.
 */
export async function deleteStudyWithSamples(studyId: number, deleteStudy: () => Promise<void>): Promise<void> {
  const samples = await db().models.Sample.findAll({ where: { studyId } });
  for (const sample of samples) await cancelSample(sample);
  await deleteStudy();
  for (const sample of samples) await removeFiles(sample);
}
