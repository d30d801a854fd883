import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readQuery } from '@/lib/api/validation';
import { sampleAccess } from '@/lib/samples/access';
import { planeQuery, samplePlane } from '@/lib/samples/plane';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ sampleId: idParam });

/** Per-jet primary-plane density: ?horizontal=lnInvDelta|lnRoverDelta&xmin&xmax&xmerge&ymin&ymax&ymerge. */
export const GET = signedInRoute({ params }, async ({ request, params, user }) => {
  const { sample } = await sampleAccess(user, params.sampleId, 'viewer');
  return json(await samplePlane(sample, readQuery(request, planeQuery)));
});
