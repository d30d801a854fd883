import { json, signedInRoute } from '@/lib/api/route-handlers';
import { readQuery } from '@/lib/api/validation';
import { sampleListQuery, visibleSamples } from '@/lib/samples/list';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** Samples of the studies the caller can see (every study for a site admin), filtered and sorted. */
export const GET = signedInRoute({}, async ({ request, user }) => {
  return json({ samples: await visibleSamples(user, readQuery(request, sampleListQuery)) });
});
