import { json, signedInRoute } from '@/lib/api/route-handlers';
import { mailerStatus } from '@/lib/mail/mailer';
import { outboxLists } from '@/lib/mail/outbox';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** The Outbox: where mail goes, the outgoing queue with failures, and what the local mail server received. */
export const GET = signedInRoute({ adminOnly: true }, async () => json({ mailer: await mailerStatus(), ...(await outboxLists()) }));
