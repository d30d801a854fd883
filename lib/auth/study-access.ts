import type { Transaction } from 'sequelize';
import type { Study } from '@/models/study';
import type { User } from '@/models/user';
import type { StudyRole } from '@/models/vocabulary';
import { forbidden, notFound } from '../api/errors';
import { canSeeStudy, mayActAs } from './roles';
import { db } from '../db/connection';

export interface StudyAccess {
  study: Study;
  /** The user's own role in the study; null for a site admin who is not a member. */
  myRole: StudyRole | null;
}

/**
 * The user's role in a study (null for a site admin who is not a member), checked against `minimum`. Something
 * in a study the user may not see answers 404 with `missing`, exactly like something that does not exist, so
 * ids reveal nothing; a visible one with too low a role answers 403.
 */
export async function requireStudyRole(
  user: User,
  studyId: number | null,
  minimum: StudyRole,
  missing: string,
  transaction?: Transaction,
): Promise<StudyRole | null> {
  const membership =
    studyId === null ? null : await db().models.Membership.findOne({ where: { studyId, userId: user.id }, transaction });
  const myRole = membership?.role ?? null;
  if (studyId === null || !canSeeStudy(user.siteRole, myRole)) throw notFound(missing);
  if (!mayActAs(user.siteRole, myRole, minimum)) {
    throw forbidden(`This needs the ${minimum} role or higher in the study; your role is ${myRole}.`);
  }
  return myRole;
}

/** Loads a study for a user who needs at least `minimum` in it (see requireStudyRole). */
export async function studyAccess(
  user: User,
  studyId: number,
  minimum: StudyRole,
  transaction?: Transaction,
): Promise<StudyAccess> {
  const study = await db().models.Study.findByPk(studyId, { transaction });
  const myRole = await requireStudyRole(user, study?.id ?? null, minimum, `No study with id ${studyId}.`, transaction);
  return { study: study!, myRole };
}

export function requireSiteAdmin(user: User): void {
  if (user.siteRole !== 'admin') throw forbidden('Only site admins may do this.');
}
