import { z } from 'zod';
import { conflict, forbidden } from '@/lib/api/errors';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import { editComment } from '@/lib/regions/comments';
import { commentChangeSchema } from '@/lib/regions/input';
import { regionComment, studyRegion } from '@/lib/regions/queries';
import { mayDeleteComment, mayEditComment } from '@/lib/regions/rules';
import { commentView } from '@/lib/regions/views';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam, regionId: idParam, commentId: idParam });

/** Changes one's own comment; the change is marked, and the members it newly mentions are told. */
export const PATCH = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study, myRole } = await studyAccess(user, params.studyId, 'commenter');
  const { body } = await readJsonBody(request, commentChangeSchema, BODY_LIMITS.standard);
  const comment = await db().write(async (transaction) => {
    const region = await studyRegion(study.id, params.regionId, transaction);
    const found = await regionComment(region.id, params.commentId, transaction);
    if (!mayEditComment({ id: user.id, siteRole: user.siteRole, myRole }, found.authorId)) throw forbidden('Only its author may edit a comment.');
    if (found.deletedAt) throw conflict('deleted', 'This comment was deleted.');
    await editComment(region, user, found, body, transaction);
    return commentView(await regionComment(region.id, found.id, transaction));
  });
  return json({ comment });
});

/** Deletes one's own comment (an owner may delete any): its text goes, its place in the thread stays. */
export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { study, myRole } = await studyAccess(user, params.studyId, 'commenter');
  await db().write(async (transaction) => {
    const region = await studyRegion(study.id, params.regionId, transaction);
    const found = await regionComment(region.id, params.commentId, transaction);
    if (!mayDeleteComment({ id: user.id, siteRole: user.siteRole, myRole }, found.authorId)) throw forbidden('Only its author or a study owner may delete a comment.');
    if (!found.deletedAt) await found.update({ body: '', deletedAt: new Date() }, { transaction });
  });
  return noContent();
});
