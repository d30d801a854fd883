import { json, signedInRoute } from '@/lib/api/route-handlers';
import { acceptUpload } from '@/lib/samples/upload';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/**
 * Streams a multipart upload to storage and queues it (202), offers the same file already stored where the caller
 * can see it (200), or makes a done sample on the tables of the same file processed elsewhere (201).
 */
export const POST = signedInRoute({}, async ({ request, user }) => {
  const outcome = await acceptUpload(user, request);
  if ('queued' in outcome) return json({ sample: outcome.queued }, 202);
  if ('shared' in outcome) return json({ sample: outcome.shared }, 201);
  return json({ duplicateOf: outcome.duplicateOf });
});
