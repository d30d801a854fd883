import { z } from 'zod';
import { signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { sampleAccess } from '@/lib/samples/access';
import { sampleProvenance } from '@/lib/samples/views';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ sampleId: idParam });

/** The sample's provenance as a JSON file to save. */
export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { sample } = await sampleAccess(user, params.sampleId, 'viewer');
  return new Response(`${JSON.stringify(sampleProvenance(sample), null, 2)}\n`, {
    headers: {
      'Content-Type': 'application/json; charset=utf-8',
      'Content-Disposition': `attachment; filename="sample-${sample.id}-provenance.json"`,
      'Cache-Control': 'no-store',
    },
  });
});
