import { noContent, signedInRoute } from '@/lib/api/route-handlers';
import { endEverySession } from '@/lib/auth/server-sessions';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** "Sign out everywhere": ends every session of the caller, this one included (API tokens stay). */
export const DELETE = signedInRoute({}, async ({ user }) => {
  await endEverySession(user.id);
  return noContent();
});
