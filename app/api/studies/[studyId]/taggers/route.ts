import { z } from 'zod';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { entryTitleSchema, idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import { taggerDocumentSchema } from '@/lib/separations/tagger-document';
import { findTagger, separationEntryDocument, studyTaggers, taggerView } from '@/lib/separations/taggers';
import { touchStudy } from '@/lib/studies/queries';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam });

/** Save a Separation entry of the study as a tagger ({entryId, name}), or import a tagger file ({document}). */
const newTaggerSchema = z
  .strictObject({
    entryId: z.number({ error: 'entryId must be an entry id' }).int('entryId must be an entry id').positive('entryId must be an entry id').optional(),
    name: entryTitleSchema.pipe(z.string().min(1, 'name must not be empty')).optional(),
    document: taggerDocumentSchema.optional(),
  })
  .refine((v) => (v.document === undefined) !== (v.entryId === undefined), 'give {entryId, name} to save a Separation, or {document} to import a tagger file')
  .refine((v) => v.document !== undefined || v.name !== undefined, { error: 'name is required when saving a Separation', path: ['name'] });

export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'viewer');
  return json({ taggers: await studyTaggers(study.id) });
});

export const POST = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  const input = await readJsonBody(request, newTaggerSchema, BODY_LIMITS.tagger);
  const document = input.document ?? (await separationEntryDocument(user, study.id, input.entryId!, input.name!));
  const { models, write } = db();
  const id = await write(async (transaction) => {
    const created = await models.Tagger.create(
      { studyId: study.id, sourceEntryId: input.entryId ?? null, name: document.name, definition: JSON.stringify(document), createdById: user.id },
      { transaction },
    );
    await touchStudy(study.id, transaction);
    return created.id;
  });
  return json({ tagger: taggerView(await findTagger(study.id, id)) }, 201);
});
