import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { notFound } from '@/lib/api/errors';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { moveInOrder } from '@/lib/studies/entry-order';
import { atLeastOneField, entryTitleSchema, idParam, noteBodySchema } from '@/lib/api/schemas';
import { entryOrder, entryWithAuthors, renumberEntries, touchStudy } from '@/lib/studies/queries';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { readJsonBody } from '@/lib/api/validation';
import { checkedSettings, requireEntrySamples } from '@/lib/studies/entry-input';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ studyId: idParam, entryId: idParam });

const entryChangeSchema = atLeastOneField({
  title: entryTitleSchema.optional(),
  body: noteBodySchema.optional(),
  position: z
    .number({ error: 'Position must be a number' })
    .int('Position must be a whole number')
    .min(0, 'Position counts from 0')
    .optional(),
  /** A Map's or Contrast's settings, checked against the entry's kind. */
  settings: z.unknown().optional(),
});

async function studyEntry(studyId: number, entryId: number, transaction: Transaction) {
  const entry = await db().models.Entry.findOne({ where: { id: entryId, studyId }, transaction });
  if (!entry) throw notFound(`No entry ${entryId} in this study.`);
  return entry;
}

export const PATCH = signedInRoute({ params }, async ({ request, params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  const { position, settings, ...content } = await readJsonBody(request, entryChangeSchema, BODY_LIMITS.note);
  const updated = await db().write(async (transaction) => {
    const entry = await studyEntry(study.id, params.entryId, transaction);
    const checked = settings === undefined ? undefined : checkedSettings(entry.kind, settings);
    if (checked) await requireEntrySamples(study.id, entry.kind, checked, transaction);
    await entry.update({ ...content, ...(checked ? { settings: checked } : {}), updatedById: user.id }, { transaction });
    if (position !== undefined) {
      const order = moveInOrder(await entryOrder(study.id, transaction), entry.id, position);
      await renumberEntries(study.id, order, transaction);
    }
    await touchStudy(study.id, transaction);
    return entryWithAuthors(entry.id, transaction);
  });
  return json({ entry: updated });
});

/** Removes the entry and closes the gap it leaves in the list. */
export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { study } = await studyAccess(user, params.studyId, 'editor');
  await db().write(async (transaction) => {
    const entry = await studyEntry(study.id, params.entryId, transaction);
    await entry.destroy({ transaction });
    await renumberEntries(study.id, await entryOrder(study.id, transaction), transaction);
    await touchStudy(study.id, transaction);
  });
  return noContent();
});
