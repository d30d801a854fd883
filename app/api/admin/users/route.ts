import { json, signedInRoute } from '@/lib/api/route-handlers';
import { adminUserView } from '@/lib/api/views';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

export const GET = signedInRoute({ adminOnly: true }, async () => {
  const users = await db().models.User.findAll({ order: [['id', 'ASC']] });
  return json({ users: users.map(adminUserView) });
});
