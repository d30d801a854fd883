import { z } from 'zod';
import { noContent, signedInRoute } from '@/lib/api/route-handlers';
import { notFound } from '@/lib/api/errors';
import { idParam } from '@/lib/api/schemas';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ tokenId: idParam });

/** Revokes one of the caller's own tokens: it stops working at once. */
export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const removed = await db().write((transaction) =>
    db().models.ApiToken.destroy({ where: { id: params.tokenId, userId: user.id }, transaction }),
  );
  if (removed === 0) throw notFound(`No token with id ${params.tokenId}.`);
  return noContent();
});
