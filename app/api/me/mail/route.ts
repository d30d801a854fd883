import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { atLeastOneField } from '@/lib/api/schemas';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { db } from '@/lib/db/connection';
import { changeMailChoices, mailChoicesOf } from '@/lib/mail/choices';
import { NOTIFICATION_KINDS } from '@/models/vocabulary';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const kindsSchema = z.partialRecord(z.enum(NOTIFICATION_KINDS, { error: `Kind must be one of: ${NOTIFICATION_KINDS.join(', ')}` }), z.boolean({ error: 'must be true or false' }));
const changeSchema = atLeastOneField({ kinds: kindsSchema.optional(), digest: z.boolean({ error: 'Digest must be true or false' }).optional() });

/** The caller's mail choices: which notification kinds are mailed, and whether as one daily digest. */
export const GET = signedInRoute({}, async ({ user }) => json({ choices: mailChoicesOf(user) }));

export const PATCH = signedInRoute({}, async ({ request, user }) => {
  const change = await readJsonBody(request, changeSchema, BODY_LIMITS.account);
  const choices = await db().write((transaction) => changeMailChoices(user, change, transaction));
  return json({ choices });
});
