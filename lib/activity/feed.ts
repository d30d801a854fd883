// A study's activity feed, read from what the study holds (entries, samples, regions and their state changes,
// comments) rather than kept as a log of its own, so it cannot disagree with them; something deleted leaves the feed.
// Unread: newer than the reader's last "mark as read" and done by someone else.
import type { Transaction } from 'sequelize';
import { db } from '@/lib/db/connection';
import { regionLink } from '@/lib/regions/links';
import type { ActivityFeed, ActivityItem } from '@/lib/regions/shapes';
import { personRef } from '@/lib/regions/views';
import type { User } from '@/models/user';

/** How many of each kind the feed reads (the newest); the feed shows the newest FEED_LENGTH of them together. */
const PER_KIND = 100;
export const FEED_LENGTH = 100;

const ENTRY_NAMES: Record<string, string> = { note: 'note', map: 'Map', contrast: 'Contrast', separation: 'Separation' };

function quoted(text: string): string {
  return text ? ` “${text}”` : '';
}

type Draft = Omit<ActivityItem, 'unread' | 'at'> & { at: Date; actorId: number | null };

async function entryItems(studyId: number): Promise<Draft[]> {
  const entries = await db().models.Entry.findAll({ where: { studyId }, include: [{ model: db().models.User, as: 'createdBy' }], order: [['createdAt', 'DESC']], limit: PER_KIND });
  return entries.map((entry) => ({
    kind: 'entry',
    key: `entry:${entry.id}`,
    actor: personRef(entry.createdBy),
    actorId: entry.createdById,
    what: `${ENTRY_NAMES[entry.kind] ?? entry.kind}${quoted(entry.title)}`,
    link: entry.kind === 'note' ? `/studies/${studyId}` : `/studies/${studyId}/entries/${entry.id}`,
    at: entry.createdAt,
  }));
}

async function sampleItems(studyId: number): Promise<Draft[]> {
  const samples = await db().models.Sample.findAll({ where: { studyId }, include: [{ model: db().models.User, as: 'uploadedBy' }], order: [['createdAt', 'DESC']], limit: PER_KIND });
  return samples.map((sample) => ({
    kind: 'sample',
    key: `sample:${sample.id}`,
    actor: personRef((sample as typeof sample & { uploadedBy?: User | null }).uploadedBy),
    actorId: sample.uploadedById,
    what: `sample${quoted(sample.name)}`,
    link: `/samples/${sample.id}`,
    at: sample.createdAt,
  }));
}

async function regionItems(studyId: number): Promise<Draft[]> {
  const { Region, User } = db().models;
  const regions = await Region.findAll({
    where: { studyId },
    include: [
      { model: User, as: 'createdBy' },
      { model: User, as: 'stateChangedBy' },
    ],
    order: [['createdAt', 'DESC']],
    limit: PER_KIND,
  });
  return regions.flatMap((region): Draft[] => {
    const added: Draft = { kind: 'region', key: `region:${region.id}`, actor: personRef(region.createdBy), actorId: region.createdById, what: `region${quoted(region.title)}`, link: regionLink(region), at: region.createdAt };
    if (!region.stateChangedAt) return [added];
    const kind = region.state === 'resolved' ? 'region-resolved' : 'region-reopened';
    const changed: Draft = { kind, key: `${kind}:${region.id}`, actor: personRef(region.stateChangedBy), actorId: region.stateChangedById, what: `region${quoted(region.title)}`, link: regionLink(region), at: region.stateChangedAt };
    return [added, changed];
  });
}

async function commentItems(studyId: number): Promise<Draft[]> {
  const { Region, RegionComment, User } = db().models;
  const comments = await RegionComment.findAll({
    where: { deletedAt: null },
    include: [
      { model: Region, as: 'region', where: { studyId }, required: true },
      { model: User, as: 'author' },
    ],
    order: [['createdAt', 'DESC']],
    limit: PER_KIND,
  });
  return comments.map((comment) => {
    const region = (comment as typeof comment & { region: InstanceType<typeof Region> }).region;
    return { kind: 'comment', key: `comment:${comment.id}`, actor: personRef(comment.author), actorId: comment.authorId, what: `comment on region${quoted(region.title)}`, link: regionLink(region), at: comment.createdAt };
  });
}

async function seenAt(studyId: number, userId: number, transaction?: Transaction): Promise<Date | null> {
  const row = await db().models.ActivityRead.findOne({ where: { studyId, userId }, transaction });
  return row?.seenAt ?? null;
}

export async function studyActivity(studyId: number, reader: User): Promise<ActivityFeed> {
  const drafts = (await Promise.all([entryItems(studyId), sampleItems(studyId), regionItems(studyId), commentItems(studyId)])).flat();
  const seen = await seenAt(studyId, reader.id);
  const items = drafts
    .sort((a, b) => b.at.getTime() - a.at.getTime() || a.key.localeCompare(b.key))
    .slice(0, FEED_LENGTH)
    .map(({ actorId, at, ...item }) => ({ ...item, at: at.toISOString(), unread: actorId !== reader.id && (seen === null || at > seen) }));
  return { items, unreadCount: items.filter((item) => item.unread).length, seenAt: seen?.toISOString() ?? null };
}

/** Marks everything up to now as read for the reader. */
export async function markActivityRead(studyId: number, userId: number): Promise<void> {
  await db().write(async (transaction) => {
    const row = await db().models.ActivityRead.findOne({ where: { studyId, userId }, transaction });
    if (row) await row.update({ seenAt: new Date() }, { transaction });
    else await db().models.ActivityRead.create({ studyId, userId, seenAt: new Date() }, { transaction });
  });
}

