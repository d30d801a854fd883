// Study data that several study routes read or change.
import type { Transaction } from 'sequelize';
import type { User } from '@/models/user';
import { STUDY_ROLES } from '@/models/vocabulary';
import { entryView, memberView } from '../api/views';
import { db } from '../db/connection';

function authorIncludes() {
  const { User } = db().models;
  return [
    { model: User, as: 'createdBy' },
    { model: User, as: 'updatedBy' },
  ];
}

export async function studyEntries(studyId: number, transaction?: Transaction) {
  const entries = await db().models.Entry.findAll({
    where: { studyId },
    include: authorIncludes(),
    order: [['position', 'ASC']],
    transaction,
  });
  return entries.map(entryView);
}

export async function entryWithAuthors(entryId: number, transaction?: Transaction) {
  const entry = await db().models.Entry.findByPk(entryId, {
    include: authorIncludes(),
    rejectOnEmpty: true,
    transaction,
  });
  return entryView(entry);
}

/** Members, owners first, then by name. */
export async function studyMembers(studyId: number, transaction?: Transaction) {
  const { Membership, User } = db().models;
  const memberships = await Membership.findAll({
    where: { studyId },
    include: [{ model: User, as: 'user', required: true }],
    transaction,
  });
  return memberships
    .map((membership) => memberView(membership as typeof membership & { user: User }))
    .sort((a, b) => STUDY_ROLES.indexOf(b.role) - STUDY_ROLES.indexOf(a.role) || a.name.localeCompare(b.name));
}

/** Marks the study as changed now, so lists show recently worked-on studies first. */
export async function touchStudy(studyId: number, transaction: Transaction): Promise<void> {
  // Model.update skips a change of updatedAt alone, so this goes to the table directly.
  await db().sequelize.query('UPDATE studies SET updated_at = :now WHERE id = :studyId', {
    replacements: { now: new Date(), studyId },
    transaction,
  });
}

/** The study's entry ids in list order. */
export async function entryOrder(studyId: number, transaction: Transaction): Promise<number[]> {
  const entries = await db().models.Entry.findAll({
    where: { studyId },
    attributes: ['id'],
    order: [
      ['position', 'ASC'],
      ['id', 'ASC'],
    ],
    transaction,
  });
  return entries.map((entry) => entry.id);
}

/** Gives each entry its index in `orderedIds` as position. */
export async function renumberEntries(studyId: number, orderedIds: number[], transaction: Transaction) {
  const { Entry } = db().models;
  for (const [position, id] of orderedIds.entries()) {
    await Entry.update({ position }, { where: { id, studyId }, transaction, silent: true });
  }
}
