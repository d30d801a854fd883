import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { signedTokenSchema } from '@/lib/api/schemas';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { db } from '@/lib/db/connection';
import { acceptInvitation, usableInvitation } from '@/lib/invitations/invitations';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** The signed-in person (holding the invited address) joins the study of the invitation. */
export const POST = signedInRoute({}, async ({ request, user }) => {
  const { token } = await readJsonBody(request, z.strictObject({ token: signedTokenSchema }), BODY_LIMITS.account);
  const joined = await db().write(async (transaction) => {
    const invitation = await usableInvitation(token, transaction);
    return { studyId: invitation.studyId, role: await acceptInvitation(invitation, user, transaction) };
  });
  return json(joined);
});
