import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { clientAddress } from '@/lib/api/client-address';
import { atLeastOneField, passwordSchema, userNameSchema } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { userView } from '@/lib/api/views';
import { changeProfile } from '@/lib/auth/profile-change';
import { requestSessionKey } from '@/lib/auth/session';
import { countAttempt, requireNotThrottled, throttleConfig } from '@/lib/auth/throttle';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const profileChangeSchema = atLeastOneField({
  name: userNameSchema.optional(),
  currentPassword: z.string().optional(),
  newPassword: passwordSchema.optional(),
  keepApiTokens: z.boolean({ error: 'keepApiTokens must be true or false' }).optional(),
}).refine((change) => (change.currentPassword === undefined) === (change.newPassword === undefined), {
  message: 'Give both currentPassword and newPassword to change the password',
  path: ['newPassword'],
});

export const GET = signedInRoute({}, async ({ user }) => json({ user: userView(user) }));

/** Changes the name and/or the password; a new password ends every other session (and the API tokens, unless kept). */
export const PATCH = signedInRoute({}, async ({ request, user }) => {
  const change = await readJsonBody(request, profileChangeSchema, BODY_LIMITS.account);
  const throttleKeys: Array<['accountFailure' | 'addressFailure', string]> = [
    ['accountFailure', user.email],
    ['addressFailure', clientAddress(request, throttleConfig().trustProxy)],
  ];
  if (change.newPassword !== undefined) await requireNotThrottled('wrong current passwords', throttleKeys);
  const outcome = await changeProfile(user, await requestSessionKey(request), change, async () => {
    for (const [kind, key] of throttleKeys) await countAttempt(kind, key);
  });
  return json({ user: userView(outcome.user), endedSessions: outcome.endedSessions, revokedTokens: outcome.revokedTokens });
});
