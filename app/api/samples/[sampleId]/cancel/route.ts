import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { sampleAccess } from '@/lib/samples/access';
import { cancelSample } from '@/lib/samples/removal';
import { sampleDetail } from '@/lib/samples/views';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ sampleId: idParam });

/**
 * Stops the sample's job (or takes it out of the queue) and answers once it is cancelled and its files are gone.
 * A sample that already ended is left as it is and answered as it stands.
 */
export const POST = signedInRoute({ params }, async ({ params, user }) => {
  const { sample } = await sampleAccess(user, params.sampleId, 'editor');
  await cancelSample(sample);
  const { sample: current, myRole } = await sampleAccess(user, params.sampleId, 'editor');
  return json({ sample: sampleDetail(current, myRole) });
});
