import { z } from 'zod';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { conflict } from '@/lib/api/errors';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import { newCategorySchema } from '@/lib/regions/input';
import { studyCategories } from '@/lib/regions/queries';
import { categoryView } from '@/lib/regions/views';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam });

export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'viewer');
  return json({ categories: await studyCategories(study.id) });
});

export const POST = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  const input = await readJsonBody(request, newCategorySchema, BODY_LIMITS.standard);
  const category = await db().write(async (transaction) => {
    const taken = await db().models.RegionCategory.count({ where: { studyId: study.id, name: input.name }, transaction });
    if (taken) throw conflict('category_exists', `The study already has a category named “${input.name}”.`);
    return db().models.RegionCategory.create({ studyId: study.id, ...input }, { transaction });
  });
  return json({ category: categoryView(category) }, 201);
});
