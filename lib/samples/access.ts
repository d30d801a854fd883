// Loading a sample for a user: visible to whoever may see its study, changeable with the study role asked for.
import type { Transaction } from 'sequelize';
import { requireStudyRole } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import type { Sample } from '@/models/sample';
import type { Study } from '@/models/study';
import type { User } from '@/models/user';
import type { StudyRole } from '@/models/vocabulary';

/** A sample loaded with its study and uploader, as the views need it. */
export type LoadedSample = Sample & { study: Study; uploadedBy: User | null };

export function sampleIncludes() {
  const { Study, User } = db().models;
  return [
    { model: Study, as: 'study', required: true },
    { model: User, as: 'uploadedBy' },
  ];
}

export interface SampleAccess {
  sample: LoadedSample;
  myRole: StudyRole | null;
}

/** 404 for a sample the user may not see (as for one that does not exist), 403 below `minimum`. */
export async function sampleAccess(
  user: User,
  sampleId: number,
  minimum: StudyRole,
  transaction?: Transaction,
): Promise<SampleAccess> {
  const sample = (await db().models.Sample.findByPk(sampleId, { include: sampleIncludes(), transaction })) as LoadedSample | null;
  const myRole = await requireStudyRole(user, sample?.studyId ?? null, minimum, `No sample with id ${sampleId}.`, transaction);
  return { sample: sample!, myRole };
}

/** The studies whose samples the user may see: 'all' for a site admin. */
export async function visibleStudyIds(user: User, transaction?: Transaction): Promise<number[] | 'all'> {
  if (user.siteRole === 'admin') return 'all';
  const memberships = await db().models.Membership.findAll({ where: { userId: user.id }, attributes: ['studyId'], transaction });
  return memberships.map((membership) => membership.studyId);
}
