import { z } from 'zod';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { atLeastOneField, idParam, studyDescriptionSchema, studyTitleSchema } from '@/lib/api/schemas';
import { studyEntries, studyMembers } from '@/lib/studies/queries';
import { readJsonBody } from '@/lib/api/validation';
import { studyView } from '@/lib/api/views';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import { deleteStudyWithSamples } from '@/lib/samples/removal';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam });

const studyChangeSchema = atLeastOneField({
  title: studyTitleSchema.optional(),
  description: studyDescriptionSchema.optional(),
});

export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { study, myRole } = await studyAccess(user, params.studyId, 'viewer');
  const [entries, members] = await Promise.all([studyEntries(study.id), studyMembers(study.id)]);
  return json({ study: studyView(study), myRole, entries, members });
});

export const PATCH = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  const change = await readJsonBody(request, studyChangeSchema);
  await db().write((transaction) => study.update(change, { transaction }));
  return json({ study: studyView(study) });
});

/** Deletes the study with its members, entries and samples (the foreign keys cascade; sample files follow). */
export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'owner');
  await deleteStudyWithSamples(study.id, (transaction) => study.destroy({ transaction }));
  return noContent();
});
