import { z } from 'zod';
import { notFound } from '@/lib/api/errors';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { db } from '@/lib/db/connection';
import { receivedMailView } from '@/lib/mail/outbox';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** One message the local mail server received: text part, sanitised HTML part. */
export const GET = signedInRoute({ adminOnly: true, params: z.object({ mailId: idParam }) }, async ({ params }) => {
  const mail = await db().models.ReceivedMail.findByPk(params.mailId);
  if (!mail) throw notFound(`No received mail ${params.mailId}.`);
  return json({ mail: receivedMailView(mail) });
});
