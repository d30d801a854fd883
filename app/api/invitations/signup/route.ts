import { z } from 'zod';
import { conflict } from '@/lib/api/errors';
import { json, publicRoute } from '@/lib/api/route-handlers';
import { passwordSchema, signedTokenSchema, userNameSchema } from '@/lib/api/schemas';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { clientAddress } from '@/lib/api/client-address';
import { readJsonBody } from '@/lib/api/validation';
import { userView } from '@/lib/api/views';
import { hashPassword } from '@/lib/auth/password';
import { countAttempt, requireNotThrottled, throttleConfig } from '@/lib/auth/throttle';
import { db } from '@/lib/db/connection';
import { acceptInvitation, usableInvitation } from '@/lib/invitations/invitations';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const schema = z.strictObject({ token: signedTokenSchema, name: userNameSchema, password: passwordSchema });

/**
 * Creates the account of an invited address and joins the study, in one transaction. Works when open sign-up
 * is closed: the invitation is the permission. Throttled like sign-up.
 */
export const POST = publicRoute(async (request) => {
  const address = clientAddress(request, throttleConfig().trustProxy);
  await requireNotThrottled('sign-up attempts from your address', [['signup', address]]);
  await countAttempt('signup', address);
  const input = await readJsonBody(request, schema, BODY_LIMITS.account);
  const passwordHash = await hashPassword(input.password);
  const { models, write } = db();
  const joined = await write(async (transaction) => {
    const invitation = await usableInvitation(input.token, transaction);
    if (await models.User.findOne({ where: { email: invitation.email }, transaction })) {
      throw conflict('email_taken', `An account with the e-mail ${invitation.email} already exists: sign in, then open the link again.`);
    }
    const user = await models.User.create({ name: input.name, email: invitation.email, passwordHash }, { transaction });
    const role = await acceptInvitation(invitation, user, transaction);
    return { user: userView(user), studyId: invitation.studyId, role };
  });
  return json(joined, 201);
});
