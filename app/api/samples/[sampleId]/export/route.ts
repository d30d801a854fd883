import { z } from 'zod';
import { signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readQuery } from '@/lib/api/validation';
import { sampleAccess } from '@/lib/samples/access';
import { openSampleColumns } from '@/lib/samples/done-sample';
import { exportLines, exportQuery } from '@/lib/samples/export-columns';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ sampleId: idParam });

/** The sample's jets and splittings as splitfield-declusterings JSON Lines, streamed: ?all=1 adds every splitting. */
export const GET = signedInRoute({ params }, async ({ request, params, user }) => {
  const { sample } = await sampleAccess(user, params.sampleId, 'viewer');
  const { all } = readQuery(request, exportQuery);
  const lines = exportLines(sample, await openSampleColumns(sample), all);
  // The header line comes first so that a refusal (no full tree) is still answered as an error, not a stream.
  const header = await lines.next();
  const encoder = new TextEncoder();
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      if (!header.done) controller.enqueue(encoder.encode(header.value));
    },
    async pull(controller) {
      const next = await lines.next();
      if (next.done) controller.close();
      else controller.enqueue(encoder.encode(next.value));
    },
    async cancel() {
      await lines.return(undefined);
    },
  });
  return new Response(body, {
    headers: {
      'Content-Type': 'application/x-ndjson; charset=utf-8',
      'Content-Disposition': `attachment; filename="sample-${sample.id}-declusterings.jsonl"`,
      'Cache-Control': 'no-store',
    },
  });
});
