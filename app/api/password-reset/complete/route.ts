import { z } from 'zod';
import { json, publicRoute } from '@/lib/api/route-handlers';
import { passwordSchema, signedTokenSchema } from '@/lib/api/schemas';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { completePasswordReset } from '@/lib/auth/password-reset';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** Sets a new password through a reset link; every session and API token of the account ends. */
export const POST = publicRoute(async (request) => {
  const input = await readJsonBody(request, z.strictObject({ token: signedTokenSchema, password: passwordSchema }), BODY_LIMITS.account);
  const { user, endedSessions, revokedTokens } = await completePasswordReset(input.token, input.password);
  return json({ email: user.email, endedSessions, revokedTokens });
});
