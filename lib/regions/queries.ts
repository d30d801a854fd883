// Regions and comments of one study, as the routes read them. Anything of another study answers 404 like
// something that does not exist.
import { Op, type Transaction } from 'sequelize';
import { badRequest, notFound } from '@/lib/api/errors';
import { studyAccess } from '@/lib/auth/study-access';
import { db } from '@/lib/db/connection';
import type { User } from '@/models/user';
import type { StudyRole } from '@/models/vocabulary';
import type { RegionView } from './shapes';
import { categoryView, commentView, regionView } from './views';

function regionIncludes() {
  const { RegionCategory, User } = db().models;
  return [
    { model: RegionCategory, as: 'category' },
    { model: User, as: 'createdBy' },
    { model: User, as: 'stateChangedBy' },
  ];
}

/** Counts of the live comments of each region, and the time of the latest. */
async function commentCounts(regionIds: number[], transaction?: Transaction) {
  const counts = new Map<number, { count: number; last: Date | null }>();
  if (regionIds.length === 0) return counts;
  const rows = (await db().models.RegionComment.findAll({
    attributes: ['regionId', [db().sequelize.fn('COUNT', db().sequelize.col('id')), 'count'], [db().sequelize.fn('MAX', db().sequelize.col('created_at')), 'last']],
    where: { regionId: { [Op.in]: regionIds }, deletedAt: null },
    group: ['regionId'],
    raw: true,
    transaction,
  })) as unknown as Array<{ regionId: number; count: number; last: string | null }>;
  for (const row of rows) counts.set(row.regionId, { count: Number(row.count), last: row.last ? new Date(row.last) : null });
  return counts;
}

export async function studyRegions(studyId: number, transaction?: Transaction): Promise<RegionView[]> {
  const regions = await db().models.Region.findAll({ where: { studyId }, include: regionIncludes(), order: [['id', 'ASC']], transaction });
  const counts = await commentCounts(regions.map((r) => r.id), transaction);
  return regions.map((region) => regionView(region, counts.get(region.id) ?? { count: 0, last: null }));
}

/** The region row, when it belongs to the study; else 404. */
export async function studyRegion(studyId: number, regionId: number, transaction?: Transaction) {
  const region = await db().models.Region.findOne({ where: { id: regionId, studyId }, transaction });
  if (!region) throw notFound(`No region ${regionId} in this study.`);
  return region;
}

export async function regionWithDetails(regionId: number, transaction?: Transaction): Promise<RegionView> {
  const region = await db().models.Region.findByPk(regionId, { include: regionIncludes(), rejectOnEmpty: true, transaction });
  const counts = await commentCounts([regionId], transaction);
  return regionView(region, counts.get(regionId) ?? { count: 0, last: null });
}

export async function regionComments(regionId: number, transaction?: Transaction) {
  const comments = await db().models.RegionComment.findAll({
    where: { regionId },
    include: [{ model: db().models.User, as: 'author' }],
    order: [['id', 'ASC']],
    transaction,
  });
  return comments.map(commentView);
}

export async function regionComment(regionId: number, commentId: number, transaction?: Transaction) {
  const comment = await db().models.RegionComment.findOne({ where: { id: commentId, regionId }, include: [{ model: db().models.User, as: 'author' }], transaction });
  if (!comment) throw notFound(`No comment ${commentId} on this region.`);
  return comment;
}

export async function studyCategories(studyId: number, transaction?: Transaction) {
  const categories = await db().models.RegionCategory.findAll({ where: { studyId }, order: [['name', 'ASC']], transaction });
  return categories.map(categoryView);
}

/** A category id given in a body must name a category of this study (400 naming the field otherwise). */
export async function requireStudyCategory(studyId: number, categoryId: number | null | undefined, transaction: Transaction): Promise<void> {
  if (categoryId === null || categoryId === undefined) return;
  const found = await db().models.RegionCategory.count({ where: { id: categoryId, studyId }, transaction });
  if (!found) throw badRequest(`Invalid request body: categoryId: no category ${categoryId} in this study`, [{ path: 'categoryId', message: `No category ${categoryId} in this study` }]);
}

/** An entry id given in a body must name an entry of this study. */
export async function requireStudyEntry(studyId: number, entryId: number | null | undefined, transaction: Transaction): Promise<void> {
  if (entryId === null || entryId === undefined) return;
  const found = await db().models.Entry.count({ where: { id: entryId, studyId }, transaction });
  if (!found) throw badRequest(`Invalid request body: entryId: no entry ${entryId} in this study`, [{ path: 'entryId', message: `No entry ${entryId} in this study` }]);
}

/** The study access of `user` (at least `minimum`) and the region, which must be in that study. */
export async function regionAccess(user: User, ids: { studyId: number; regionId: number }, minimum: StudyRole) {
  const access = await studyAccess(user, ids.studyId, minimum);
  return { ...access, region: await studyRegion(access.study.id, ids.regionId) };
}
