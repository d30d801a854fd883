import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { newEntrySchema, requireEntrySamples } from '@/lib/studies/entry-input';
import { entryWithAuthors, studyEntries, touchStudy } from '@/lib/studies/queries';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam });

export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'viewer');
  return json({ entries: await studyEntries(study.id) });
});

/** Adds the entry at the end of the study's list. */
export const POST = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  const input = await readJsonBody(request, newEntrySchema, BODY_LIMITS.note);
  const { models, write } = db();
  const entry = await write(async (transaction) => {
    if (input.kind !== 'note') await requireEntrySamples(study.id, input.kind, input.settings, transaction);
    const position = await models.Entry.count({ where: { studyId: study.id }, transaction });
    const created = await models.Entry.create(
      { ...input, studyId: study.id, position, createdById: user.id, updatedById: user.id },
      { transaction },
    );
    await touchStudy(study.id, transaction);
    return entryWithAuthors(created.id, transaction);
  });
  return json({ entry }, 201);
});
