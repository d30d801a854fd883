import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readQuery } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { viewSamples } from '@/lib/maps/view-samples';
import { applyTagger, jetScoreLines } from '@/lib/separations/tagger-apply';
import { findTagger, storedDocument } from '@/lib/separations/taggers';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam, taggerId: idParam });
const query = z.strictObject({
  sample: z.string({ error: 'sample is required: a sample id' }).regex(/^[1-9]\d{0,14}$/, 'sample must be a sample id').transform(Number),
  format: z.enum(['jets'], { error: 'format must be jets' }).optional(),
});

/**
 * The tagger applied to a sample the caller can see (in any study): ?sample=ID gives the score distribution and the
 * efficiency at the working points; &format=jets every selected jet's score as JSON Lines.
 */
export const GET = signedInRoute({ params }, async ({ request, params, user }) => {
  const input = readQuery(request, query);
  const { study } = await studyAccess(user, params.studyId, 'viewer');
  const document = storedDocument(await findTagger(study.id, params.taggerId));
  const [sample] = await viewSamples(user, [input.sample]);
  if (input.format !== 'jets') return json({ tagger: { id: params.taggerId, name: document.name }, ...(await applyTagger(document, sample)) });
  return new Response(await jetScoreLines(document, sample), {
    headers: { 'Content-Type': 'application/x-ndjson; charset=utf-8', 'Content-Disposition': `attachment; filename="tagger-${params.taggerId}-sample-${sample.id}-scores.jsonl"`, 'Cache-Control': 'no-store' },
  });
});
