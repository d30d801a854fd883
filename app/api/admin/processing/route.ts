import { json, signedInRoute } from '@/lib/api/route-handlers';
import { jobRunner } from '@/lib/jobs/runner';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** The processing overview of the admin page: queue length, jobs under way, failed shards. */
export const GET = signedInRoute({ adminOnly: true }, async () => json(await (await jobRunner()).overview()));
