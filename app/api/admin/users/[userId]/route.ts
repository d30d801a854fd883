import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { atLeastOneField, idParam } from '@/lib/api/schemas';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { adminUserView } from '@/lib/api/views';
import { changeAccount } from '@/lib/admin/account-change';
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
    const change = await readJsonBody(request, accountChangeSchema, BODY_LIMITS.account);
    return json({ user: adminUserView(await changeAccount(admin.id, params.userId, change)) });
  },
);
