import { z } from 'zod';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { conflict, notFound } from '@/lib/api/errors';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import { categoryChangeSchema } from '@/lib/regions/input';
import { categoryView } from '@/lib/regions/views';
import { Op, type Transaction } from 'sequelize';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam, categoryId: idParam });

async function studyCategory(studyId: number, categoryId: number, transaction: Transaction) {
  const category = await db().models.RegionCategory.findOne({ where: { id: categoryId, studyId }, transaction });
  if (!category) throw notFound(`No region category ${categoryId} in this study.`);
  return category;
}

export const PATCH = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  const input = await readJsonBody(request, categoryChangeSchema, BODY_LIMITS.standard);
  const category = await db().write(async (transaction) => {
    const found = await studyCategory(study.id, params.categoryId, transaction);
    if (input.name !== undefined) {
      const taken = await db().models.RegionCategory.count({ where: { studyId: study.id, name: input.name, id: { [Op.ne]: found.id } }, transaction });
      if (taken) throw conflict('category_exists', `The study already has a category named “${input.name}”.`);
    }
    return found.update(input, { transaction });
  });
  return json({ category: categoryView(category) });
});

/** Removes the category; its regions stay, without a category. */
export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  await db().write(async (transaction) => {
    const found = await studyCategory(study.id, params.categoryId, transaction);
    await found.destroy({ transaction });
  });
  return noContent();
});
