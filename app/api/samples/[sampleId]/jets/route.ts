import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readQuery } from '@/lib/api/validation';
import { sampleAccess } from '@/lib/samples/access';
import { openSampleColumns } from '@/lib/samples/done-sample';
import { jetPageQuery, jetTablePage } from '@/lib/samples/jet-table';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ sampleId: idParam });

/** A page of the jet table: ?offset=&limit=(at most 200)&sort=pt|y|…&order=asc|desc. */
export const GET = signedInRoute({ params }, async ({ request, params, user }) => {
  const { sample } = await sampleAccess(user, params.sampleId, 'viewer');
  const query = readQuery(request, jetPageQuery);
  return json(await jetTablePage(await openSampleColumns(sample), query));
});
