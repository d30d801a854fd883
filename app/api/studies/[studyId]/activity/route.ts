import { z } from 'zod';
import { markActivityRead, studyActivity } from '@/lib/activity/feed';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { studyAccess } from '@/lib/auth/study-access';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam });

/** Who added what and when, newest first, each item marked unread or not for the caller. */
export const GET = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'viewer');
  return json(await studyActivity(study.id, user));
});

/** Marks the feed as read up to now for the caller. */
export const POST = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'viewer');
  await markActivityRead(study.id, user.id);
  return noContent();
});
