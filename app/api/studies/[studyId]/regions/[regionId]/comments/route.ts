import { z } from 'zod';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { takeAllowance } from '@/lib/auth/throttle';
import { db } from '@/lib/db/connection';
import { addComment } from '@/lib/regions/comments';
import { newCommentSchema } from '@/lib/regions/input';
import { regionAccess, regionComment, regionComments, studyRegion } from '@/lib/regions/queries';
import { commentView } from '@/lib/regions/views';
import { touchStudy } from '@/lib/studies/queries';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam, regionId: idParam });

/** The thread, oldest first (pages poll this to show new comments without a reload). */
export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { region } = await regionAccess(user, params, 'viewer');
  return json({ comments: await regionComments(region.id) });
});

export const POST = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await regionAccess(user, params, 'commenter');
  const input = await readJsonBody(request, newCommentSchema, BODY_LIMITS.standard);
  await takeAllowance('comment', String(user.id), 'comments');
  const comment = await db().write(async (transaction) => {
    const region = await studyRegion(study.id, params.regionId, transaction);
    const created = await addComment({ region, author: user, body: input.body, replyToId: input.replyToId }, transaction);
    await touchStudy(study.id, transaction);
    return commentView(await regionComment(region.id, created.id, transaction));
  });
  return json({ comment }, 201);
});
