// A Map or Contrast entry may show only samples of its own study: every member who can read the entry can then
// read its samples too.
import type { Transaction } from 'sequelize';
import { Op } from 'sequelize';
import { badRequest } from '@/lib/api/errors';
import { db } from '@/lib/db/connection';

export async function requireStudySamples(studyId: number, ids: number[], path: string, transaction?: Transaction): Promise<void> {
  const found = await db().models.Sample.findAll({ where: { id: { [Op.in]: ids }, studyId }, attributes: ['id'], transaction });
  const known = new Set(found.map((sample) => sample.id));
  const missing = ids.filter((id) => !known.has(id));
  if (missing.length > 0) {
    const message = `No sample ${missing.join(', ')} in this study: a view shows only the study's own samples`;
    throw badRequest(`Invalid request body: ${path}: ${message}`, [{ path, message }]);
  }
}
