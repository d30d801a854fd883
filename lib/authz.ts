import type { Transaction } from 'sequelize';
import type { Study } from '@/models/study';
import type { User } from '@/models/user';
import type { StudyRole } from '@/models/vocabulary';
import { forbidden, notFound } from './api-errors';
import { canSeeStudy, mayActAs } from './authz-roles';
import { db } from './db';

export interface StudyAccess {
  study: Study;
  /** The user's own role in the study; null for a site admin who is not a member. */
  myRole: StudyRole | null;
}

/**
 * Loads a study for a user who needs at least `minimum` in it. A study the user may not see answers 404,
 * exactly like one that does not exist, so ids reveal nothing; a visible one with too low a role answers 403.
 */
export async function studyAccess(
  user: User,
  studyId: number,
  minimum: StudyRole,
  transaction?: Transaction,
): Promise<StudyAccess> {
  const { Study, Membership } = db().models;
  const study = await Study.findByPk(studyId, { transaction });
  const membership = study
    ? await Membership.findOne({ where: { studyId, userId: user.id }, transaction })
    : null;
  const myRole = membership?.role ?? null;
  if (!study || !canSeeStudy(user.siteRole, myRole)) throw notFound(`No study with id ${studyId}.`);
  if (!mayActAs(user.siteRole, myRole, minimum)) {
    throw forbidden(`This needs the ${minimum} role or higher in the study; your role is ${myRole}.`);
  }
  return { study, myRole };
}

export function requireSiteAdmin(user: User): void {
  if (user.siteRole !== 'admin') throw forbidden('Only site admins may do this.');
}
