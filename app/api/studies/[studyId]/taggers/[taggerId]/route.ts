import { z } from 'zod';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readQuery } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import { findTagger, storedDocument, taggerView } from '@/lib/separations/taggers';
import { touchStudy } from '@/lib/studies/queries';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam, taggerId: idParam });
const query = z.strictObject({ download: z.enum(['1'], { error: 'download must be 1' }).optional() });

/** The tagger and its document; ?download=1 answers the document as a file (the export). */
export const GET = signedInRoute({ params }, async ({ request, params, user }) => {
  const { download } = readQuery(request, query);
  const { study } = await studyAccess(user, params.studyId, 'viewer');
  const tagger = await findTagger(study.id, params.taggerId);
  const document = storedDocument(tagger);
  if (!download) return json({ tagger: taggerView(tagger), document });
  const fileName = `tagger-${tagger.id}.splitfield-tagger.json`;
  return new Response(`${JSON.stringify(document, null, 1)}\n`, {
    headers: { 'Content-Type': 'application/json; charset=utf-8', 'Content-Disposition': `attachment; filename="${fileName}"`, 'Cache-Control': 'no-store' },
  });
});

export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  await db().write(async (transaction) => {
    const tagger = await findTagger(study.id, params.taggerId, transaction);
    await tagger.destroy({ transaction });
    await touchStudy(study.id, transaction);
  });
  return noContent();
});
