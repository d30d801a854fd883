import { z } from 'zod';
import { conflict, notFound } from '@/lib/api/errors';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { atLeastOneField, idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { adminUserView } from '@/lib/api/views';
import { db } from '@/lib/db/connection';
import { SITE_ROLES } from '@/models/vocabulary';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const accountChangeSchema = atLeastOneField({
  siteRole: z.enum(SITE_ROLES, { error: `Site role must be one of: ${SITE_ROLES.join(', ')}` }).optional(),
  disabled: z.boolean({ error: 'disabled must be true or false' }).optional(),
});

export const PATCH = signedInRoute(
  { adminOnly: true, params: z.object({ userId: idParam }) },
  async ({ request, params, user: admin }) => {
    const change = await readJsonBody(request, accountChangeSchema);
    const user = await db().models.User.findByPk(params.userId);
    if (!user) throw notFound(`No user with id ${params.userId}.`);
    // Keeps at least one admin able to act: nobody can lock themselves out.
    if (user.id === admin.id && (change.disabled === true || change.siteRole === 'member')) {
      throw conflict('self_lockout', 'Admins cannot disable or demote themselves; ask another admin.');
    }
    if (change.siteRole !== undefined) user.siteRole = change.siteRole;
    if (change.disabled !== undefined && change.disabled !== user.disabled) {
      user.disabled = change.disabled;
      // Ends the sessions issued before, so enabling the account again does not bring them back.
      user.sessionVersion += 1;
    }
    await db().write((transaction) => user.save({ transaction }));
    return json({ user: adminUserView(user) });
  },
);
