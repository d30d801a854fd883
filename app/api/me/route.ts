import { z } from 'zod';
import { badRequest } from '@/lib/api/errors';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { atLeastOneField, passwordSchema, userNameSchema } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { userView } from '@/lib/api/views';
import { hashPassword, passwordMatches } from '@/lib/auth/password';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const profileChangeSchema = atLeastOneField({
  name: userNameSchema.optional(),
  currentPassword: z.string().optional(),
  newPassword: passwordSchema.optional(),
}).refine((change) => (change.currentPassword === undefined) === (change.newPassword === undefined), {
  message: 'Give both currentPassword and newPassword to change the password',
  path: ['newPassword'],
});

export const GET = signedInRoute({}, async ({ user }) => json({ user: userView(user) }));

export const PATCH = signedInRoute({}, async ({ request, user }) => {
  const change = await readJsonBody(request, profileChangeSchema);
  if (change.newPassword !== undefined) {
    if (!(await passwordMatches(change.currentPassword ?? '', user.passwordHash))) {
      throw badRequest('The current password is wrong.', [
        { path: 'currentPassword', message: 'does not match the password of this account' },
      ]);
    }
    user.passwordHash = await hashPassword(change.newPassword);
  }
  if (change.name !== undefined) user.name = change.name;
  await db().write((transaction) => user.save({ transaction }));
  return json({ user: userView(user) });
});
