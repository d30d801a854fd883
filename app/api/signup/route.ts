import { z } from 'zod';
import { conflict, forbidden } from '@/lib/api/errors';
import { json, publicRoute } from '@/lib/api/route-handlers';
import { emailSchema, passwordSchema, userNameSchema } from '@/lib/api/schemas';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { userView } from '@/lib/api/views';
import { siteSettings } from '@/lib/admin/site-settings';
import { clientAddress } from '@/lib/api/client-address';
import { hashPassword } from '@/lib/auth/password';
import { countAttempt, requireNotThrottled, throttleConfig } from '@/lib/auth/throttle';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const signupSchema = z.strictObject({ name: userNameSchema, email: emailSchema, password: passwordSchema });

async function openSignup(): Promise<boolean> {
  return (await siteSettings()).openSignup;
}

/** Whether anyone may create an account here, for the sign-up page. */
export const GET = publicRoute(async () => json({ openSignup: await openSignup() }));

export const POST = publicRoute(async (request) => {
  const address = clientAddress(request, throttleConfig().trustProxy);
  await requireNotThrottled('sign-up attempts from your address', [['signup', address]]);
  await countAttempt('signup', address);
  const input = await readJsonBody(request, signupSchema, BODY_LIMITS.account);
  if (!(await openSignup())) throw forbidden('Sign-up is closed on this server; ask an admin for an account.');
  const passwordHash = await hashPassword(input.password);
  const { models, write } = db();
  const user = await write(async (transaction) => {
    if (await models.User.findOne({ where: { email: input.email }, transaction })) {
      throw conflict('email_taken', `An account with the e-mail ${input.email} already exists.`);
    }
    return models.User.create({ name: input.name, email: input.email, passwordHash }, { transaction });
  });
  return json({ user: userView(user) }, 201);
});
