import { Op } from 'sequelize';
import { z } from 'zod';
import { notFound } from '@/lib/api/errors';
import { noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** Revokes a pending invitation: its link stops working. */
export const DELETE = signedInRoute(
  { params: z.object({ studyId: idParam, invitationId: idParam }) },
  async ({ params, user }) => {
    const { study } = await studyAccess(user, params.studyId, 'owner');
    const removed = await db().write((transaction) =>
      db().models.Invitation.destroy({
        where: { id: params.invitationId, studyId: study.id, acceptedAt: { [Op.is]: null } },
        transaction,
      }),
    );
    if (removed === 0) throw notFound(`No pending invitation ${params.invitationId} in this study.`);
    return noContent();
  },
);
