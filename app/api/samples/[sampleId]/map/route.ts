import { z } from 'zod';
import { signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readQuery } from '@/lib/api/validation';
import { mapAnswer } from '@/lib/maps/answers';
import { mapQuery } from '@/lib/maps/queries';
import { sampleAccess } from '@/lib/samples/access';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ sampleId: idParam });

/** A Map view of one sample: ?view=<JSON view settings>&format=csv|json|yaml|provenance (a file) or none (the view). */
export const GET = signedInRoute({ params }, async ({ request, params, user }) => {
  const { sample } = await sampleAccess(user, params.sampleId, 'viewer');
  return mapAnswer(sample, readQuery(request, mapQuery));
});
