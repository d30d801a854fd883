import { z } from 'zod';
import { forbidden } from '@/lib/api/errors';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import { regionChangeSchema } from '@/lib/regions/input';
import { regionAccess, regionComments, regionWithDetails, requireStudyCategory, studyRegion } from '@/lib/regions/queries';
import { mayChangeRegion } from '@/lib/regions/rules';
import { touchStudy } from '@/lib/studies/queries';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam, regionId: idParam });

/** The region with its whole thread. */
export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { region } = await regionAccess(user, params, 'viewer');
  return json({ region: await regionWithDetails(region.id), comments: await regionComments(region.id) });
});

/** Resolve or reopen (any commenter); change title, category or geometry (its author or an editor). */
export const PATCH = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study, myRole } = await studyAccess(user, params.studyId, 'commenter');
  const { state, ...content } = await readJsonBody(request, regionChangeSchema, BODY_LIMITS.standard);
  const updated = await db().write(async (transaction) => {
    const region = await studyRegion(study.id, params.regionId, transaction);
    const changesContent = Object.values(content).some((value) => value !== undefined);
    if (changesContent && !mayChangeRegion({ id: user.id, siteRole: user.siteRole, myRole }, region.createdById)) {
      throw forbidden('Only the region’s author or an editor may change its title, category or shape.');
    }
    await requireStudyCategory(study.id, content.categoryId, transaction);
    const stateChange = state !== undefined && state !== region.state ? { state, stateChangedById: user.id, stateChangedAt: new Date() } : {};
    await region.update({ ...content, ...stateChange }, { transaction });
    await touchStudy(study.id, transaction);
    return regionWithDetails(region.id, transaction);
  });
  return json({ region: updated });
});

/** Removes the region and its thread (its author or an editor). */
export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { study, myRole } = await studyAccess(user, params.studyId, 'commenter');
  await db().write(async (transaction) => {
    const region = await studyRegion(study.id, params.regionId, transaction);
    if (!mayChangeRegion({ id: user.id, siteRole: user.siteRole, myRole }, region.createdById)) {
      throw forbidden('Only the region’s author or an editor may delete it.');
    }
    await region.destroy({ transaction });
    await touchStudy(study.id, transaction);
  });
  return noContent();
});
