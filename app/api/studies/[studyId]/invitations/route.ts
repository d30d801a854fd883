import { Op } from 'sequelize';
import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { emailSchema, idParam, studyRoleSchema } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { countAttempt, requireNotThrottled } from '@/lib/auth/throttle';
import { db } from '@/lib/db/connection';
import { invitationView, inviteToStudy } from '@/lib/invitations/invitations';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam });
const invitationSchema = z.strictObject({ email: emailSchema, role: studyRoleSchema });

/** The study's pending invitations (not yet accepted; expired ones too, marked, until revoked). */
export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'owner');
  const { models } = db();
  const invitations = await models.Invitation.findAll({
    where: { studyId: study.id, acceptedAt: { [Op.is]: null } },
    include: [{ model: models.User, as: 'invitedBy', required: false }],
    order: [['id', 'ASC']],
  });
  return json({ invitations: invitations.map(invitationView) });
});

export const POST = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'owner');
  const input = await readJsonBody(request, invitationSchema);
  await requireNotThrottled('invitations sent', [['invitation', String(user.id)]]);
  const invitation = await db().write((transaction) => inviteToStudy({ study, inviter: user, ...input }, transaction));
  await countAttempt('invitation', String(user.id));
  return json({ invitation: invitationView(invitation) }, 201);
});
