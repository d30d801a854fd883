import { z } from 'zod';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { takeAllowance } from '@/lib/auth/throttle';
import { db } from '@/lib/db/connection';
import { addComment } from '@/lib/regions/comments';
import { newRegionSchema } from '@/lib/regions/input';
import { regionWithDetails, requireStudyCategory, requireStudyEntry, studyCategories, studyRegions } from '@/lib/regions/queries';
import { touchStudy } from '@/lib/studies/queries';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam });

/** Every region of the study (views pick those of their axes) and the study's categories. */
export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'viewer');
  return json({ regions: await studyRegions(study.id), categories: await studyCategories(study.id) });
});

/** A new region with its first comment (which counts against the comment limit). */
export const POST = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'commenter');
  const input = await readJsonBody(request, newRegionSchema, BODY_LIMITS.standard);
  await takeAllowance('comment', String(user.id), 'comments');
  const region = await db().write(async (transaction) => {
    await requireStudyCategory(study.id, input.categoryId, transaction);
    await requireStudyEntry(study.id, input.entryId, transaction);
    const created = await db().models.Region.create(
      { studyId: study.id, entryId: input.entryId ?? null, categoryId: input.categoryId ?? null, title: input.title, geometry: input.geometry, createdById: user.id },
      { transaction },
    );
    await addComment({ region: created, author: user, body: input.comment }, transaction);
    await touchStudy(study.id, transaction);
    return regionWithDetails(created.id, transaction);
  });
  return json({ region }, 201);
});
