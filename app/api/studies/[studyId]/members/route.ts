import { z } from 'zod';
import { conflict, notFound } from '@/lib/api/errors';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { emailSchema, idParam, studyRoleSchema } from '@/lib/api/schemas';
import { touchStudy } from '@/lib/studies/queries';
import { readJsonBody } from '@/lib/api/validation';
import { memberView } from '@/lib/api/views';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const newMemberSchema = z.strictObject({ email: emailSchema, role: studyRoleSchema });

export const POST = signedInRoute(
  { params: z.object({ studyId: idParam }) },
  async ({ request, params, user }) => {
    const { study } = await studyAccess(user, params.studyId, 'owner');
    const input = await readJsonBody(request, newMemberSchema);
    const { models, write } = db();
    const member = await write(async (transaction) => {
      const invited = await models.User.findOne({ where: { email: input.email }, transaction });
      if (!invited) throw notFound(`No user with the e-mail ${input.email}; they need an account first.`);
      const existing = await models.Membership.findOne({
        where: { studyId: study.id, userId: invited.id },
        transaction,
      });
      if (existing) throw conflict('already_member', `${invited.email} is already a ${existing.role} of this study.`);
      const membership = await models.Membership.create(
        { studyId: study.id, userId: invited.id, role: input.role },
        { transaction },
      );
      await touchStudy(study.id, transaction);
      return memberView(Object.assign(membership, { user: invited }));
    });
    return json({ member }, 201);
  },
);
