// Adding a comment to a region's thread, and telling people about it (lib/notifications): everyone it mentions who
// is a member of the study ('mention'), and the thread's other participants who are still members ('reply').
// Someone both mentioned and taking part is told once, of the mention. A mention of anyone else records nothing.
// Editing a comment tells the members its new text mentions and its old text did not: nobody hears twice of one
// mention.
import { Op, type Transaction } from 'sequelize';
import { badRequest } from '@/lib/api/errors';
import { db } from '@/lib/db/connection';
import { recordNotifications } from '@/lib/notifications/record';
import type { Region } from '@/models/region';
import type { RegionComment } from '@/models/region-comment';
import type { User } from '@/models/user';
import { regionLink } from './links';
import { mentionedIds } from './mentions';

interface NewComment {
  region: Region;
  author: User;
  body: string;
  replyToId?: number | null;
}

/** Members of the study among `userIds`. */
async function membersAmong(studyId: number, userIds: number[], transaction: Transaction): Promise<number[]> {
  if (userIds.length === 0) return [];
  const rows = await db().models.Membership.findAll({ where: { studyId, userId: { [Op.in]: userIds } }, attributes: ['userId'], transaction });
  const members = new Set(rows.map((row) => row.userId));
  return userIds.filter((id) => members.has(id));
}

async function participants(regionId: number, transaction: Transaction): Promise<number[]> {
  const rows = await db().models.RegionComment.findAll({ where: { regionId, authorId: { [Op.ne]: null } }, attributes: ['authorId'], transaction });
  return [...new Set(rows.map((row) => row.authorId!))];
}

/** Records a 'mention' for the members among `userIds`; returns who was told. */
async function tellMentioned(region: Region, author: User, userIds: number[], transaction: Transaction): Promise<number[]> {
  const mentioned = await membersAmong(region.studyId, userIds, transaction);
  await recordNotifications(
    { kind: 'mention', userIds: mentioned, actorId: author.id, studyId: region.studyId, summary: `${author.name} mentioned you on region “${region.title}”`, link: regionLink(region) },
    transaction,
  );
  return mentioned;
}

/** Stores the comment and records its notifications in the same transaction. */
export async function addComment({ region, author, body, replyToId }: NewComment, transaction: Transaction) {
  const { RegionComment } = db().models;
  if (replyToId !== null && replyToId !== undefined) {
    const parent = await RegionComment.count({ where: { id: replyToId, regionId: region.id }, transaction });
    if (!parent) throw badRequest(`Invalid request body: replyToId: no comment ${replyToId} on this region`, [{ path: 'replyToId', message: `No comment ${replyToId} on this region` }]);
  }
  const earlier = await participants(region.id, transaction);
  const comment = await RegionComment.create({ regionId: region.id, authorId: author.id, replyToId: replyToId ?? null, body }, { transaction });
  const mentioned = await tellMentioned(region, author, mentionedIds(body), transaction);
  const repliedTo = await membersAmong(region.studyId, earlier.filter((id) => !mentioned.includes(id)), transaction);
  await recordNotifications(
    { kind: 'reply', userIds: repliedTo, actorId: author.id, studyId: region.studyId, summary: `${author.name} commented on region “${region.title}”`, link: regionLink(region) },
    transaction,
  );
  return comment;
}

/** Changes the text of a comment (marked as edited) and tells the members the new text newly mentions. */
export async function editComment(region: Region, author: User, comment: RegionComment, body: string, transaction: Transaction): Promise<void> {
  const before = new Set(mentionedIds(comment.body));
  await comment.update({ body, editedAt: new Date() }, { transaction });
  await tellMentioned(region, author, mentionedIds(body).filter((id) => !before.has(id)), transaction);
}
