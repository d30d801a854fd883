import type { Transaction } from 'sequelize';
import { z } from 'zod';
import type { StudyRole } from '@/models/vocabulary';
import { conflict, notFound } from '@/lib/api/errors';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam, studyRoleSchema } from '@/lib/api/schemas';
import { touchStudy } from '@/lib/studies/queries';
import { readJsonBody } from '@/lib/api/validation';
import { memberView } from '@/lib/api/views';
import { ownersAfterChange } from '@/lib/auth/roles';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam, userId: idParam });
const roleChangeSchema = z.strictObject({ role: studyRoleSchema });

/**
 * Loads the membership about to change and refuses a change that would leave the study without an owner.
 * `nextRole` null means the member is removed.
 */
async function changeableMembership(
  studyId: number,
  userId: number,
  nextRole: StudyRole | null,
  transaction: Transaction,
) {
  const { Membership, User } = db().models;
  const membership = await Membership.findOne({
    where: { studyId, userId },
    include: [{ model: User, as: 'user', required: true }],
    transaction,
  });
  if (!membership) throw notFound(`User ${userId} is not a member of this study.`);
  const owners = await Membership.count({ where: { studyId, role: 'owner' }, transaction });
  if (ownersAfterChange(owners, membership.role, nextRole) < 1) {
    throw conflict('last_owner', 'A study keeps at least one owner; make someone else owner first.');
  }
  return membership as typeof membership & { user: NonNullable<typeof membership.user> };
}

export const PATCH = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'owner');
  const { role } = await readJsonBody(request, roleChangeSchema);
  const member = await db().write(async (transaction) => {
    const membership = await changeableMembership(study.id, params.userId, role, transaction);
    await membership.update({ role }, { transaction });
    await touchStudy(study.id, transaction);
    return memberView(membership);
  });
  return json({ member });
});

export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'owner');
  await db().write(async (transaction) => {
    const membership = await changeableMembership(study.id, params.userId, null, transaction);
    await membership.destroy({ transaction });
    await touchStudy(study.id, transaction);
  });
  return noContent();
});
