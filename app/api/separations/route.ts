import { json, signedInRoute } from '@/lib/api/route-handlers';
import { readQuery } from '@/lib/api/validation';
import { viewSamples } from '@/lib/maps/view-samples';
import { computeSeparation } from '@/lib/separations/compute';
import { separationQuery } from '@/lib/separations/query';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** A Separation of two samples: ?signal=A&background=B&view=<JSON>&minEntries=N. */
export const GET = signedInRoute({}, async ({ request, user }) => {
  const query = readQuery(request, separationQuery);
  const [signal, background] = await viewSamples(user, [query.signal, query.background]);
  return json(await computeSeparation(signal, background, query.view, query.minEntries));
});
