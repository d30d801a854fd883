import { z } from 'zod';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { sampleAccess } from '@/lib/samples/access';
import { deleteSample } from '@/lib/samples/removal';
import { sampleDetail } from '@/lib/samples/views';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ sampleId: idParam });

export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { sample, myRole } = await sampleAccess(user, params.sampleId, 'viewer');
  return json({ sample: sampleDetail(sample, myRole) });
});

/** Deletes the sample with its files; a job still to finish is cancelled first. */
export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { sample } = await sampleAccess(user, params.sampleId, 'editor');
  await deleteSample(sample);
  return noContent();
});
