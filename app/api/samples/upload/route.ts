import { json, signedInRoute } from '@/lib/api/route-handlers';
import { acceptUpload } from '@/lib/samples/upload';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** Streams a multipart upload to storage and queues it (202), or offers the same file already stored (200). */
export const POST = signedInRoute({}, async ({ request, user }) => {
  const outcome = await acceptUpload(user, request);
  return 'queued' in outcome ? json({ sample: outcome.queued }, 202) : json({ duplicateOf: outcome.duplicateOf });
});
