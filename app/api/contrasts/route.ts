import { signedInRoute } from '@/lib/api/route-handlers';
import { readQuery } from '@/lib/api/validation';
import { contrastAnswer } from '@/lib/maps/answers';
import { contrastQuery } from '@/lib/maps/queries';
import { viewSamples } from '@/lib/maps/view-samples';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** A Contrast of two or more samples: ?samples=A,B[,…]&view=<JSON>&mode=ratio|difference|pull&minEntries&format. */
export const GET = signedInRoute({}, async ({ request, user }) => {
  const query = readQuery(request, contrastQuery);
  return contrastAnswer(await viewSamples(user, query.samples), query);
});
