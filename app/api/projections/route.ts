import { signedInRoute } from '@/lib/api/route-handlers';
import { readQuery } from '@/lib/api/validation';
import { projectionAnswer } from '@/lib/maps/answers';
import { projectionQuery } from '@/lib/maps/queries';
import { viewSamples } from '@/lib/maps/view-samples';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** Projections of one or more samples' planes: ?samples=A[,B…]&view=<JSON>&onto=x|y&from&to&format. */
export const GET = signedInRoute({}, async ({ request, user }) => {
  const query = readQuery(request, projectionQuery);
  return projectionAnswer(await viewSamples(user, query.samples), query);
});
