import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { siteSettings } from '@/lib/admin/site-settings';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const settingsSchema = z.strictObject({
  openSignup: z.boolean({ error: 'openSignup must be true or false' }),
});

export const GET = signedInRoute({ adminOnly: true }, async () => {
  const settings = await siteSettings();
  return json({ openSignup: settings.openSignup });
});

export const PATCH = signedInRoute({ adminOnly: true }, async ({ request }) => {
  const change = await readJsonBody(request, settingsSchema, BODY_LIMITS.account);
  const settings = await siteSettings();
  await db().write((transaction) => settings.update(change, { transaction }));
  return json({ openSignup: settings.openSignup });
});
