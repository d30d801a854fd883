import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { plainName } from '@/lib/api/schemas';
import { newTokenSecret } from '@/lib/auth/api-tokens';
import { countAttempt, requireNotThrottled } from '@/lib/auth/throttle';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { apiTokenView } from '@/lib/api/views';
import { db } from '@/lib/db/connection';
import { API_TOKEN_NAME_MAX } from '@/models/vocabulary';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const newTokenSchema = z.strictObject({
  name: plainName(
    z
      .string({ error: 'name is required: what the token is for' })
      .trim()
      .min(1, 'name must not be empty')
      .max(API_TOKEN_NAME_MAX, `name must be at most ${API_TOKEN_NAME_MAX} characters`),
    'name',
  ),
});

/** The caller's own tokens, newest first (never their secrets). */
export const GET = signedInRoute({}, async ({ user }) => {
  const tokens = await db().models.ApiToken.findAll({ where: { userId: user.id }, order: [['id', 'DESC']] });
  return json({ tokens: tokens.map(apiTokenView) });
});

/** Makes a token; its secret is in this answer only. */
export const POST = signedInRoute({}, async ({ request, user }) => {
  const { name } = await readJsonBody(request, newTokenSchema, BODY_LIMITS.account);
  await requireNotThrottled('new API tokens', [['newToken', String(user.id)]]);
  await countAttempt('newToken', String(user.id));
  const { secret, prefix, secretHash } = newTokenSecret();
  const token = await db().write((transaction) =>
    db().models.ApiToken.create({ userId: user.id, name, prefix, secretHash }, { transaction }),
  );
  return json({ token: apiTokenView(token), secret }, 201);
});
