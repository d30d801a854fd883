// Invitations into a study by e-mail: an owner invites an address with a role; the mailed link (signed, expiring,
// single-use) lets the person sign up, or accept while signed in with that address, and lands them in the study.
import { Op, type Transaction } from 'sequelize';
import { conflict, forbidden } from '../api/errors';
import { linkExpired, linkInvalid, linkUsed } from '../auth/link-errors';
import { newSignedToken, signedTokenHash } from '../auth/signed-links';
import { db } from '../db/connection';
import { readMailConfig } from '../mail/config';
import { invitationMail } from '../mail/messages';
import { enqueueMail } from '../mail/queue';
import type { Invitation } from '@/models/invitation';
import type { Study } from '@/models/study';
import type { User } from '@/models/user';
import { INVITATION_DAYS, type StudyRole } from '@/models/vocabulary';

export type LoadedInvitation = Invitation & { study: Study; invitedBy: User | null };

export function invitationView(invitation: Invitation & { invitedBy?: User | null }) {
  const { id, email, role, createdAt, expiresAt } = invitation;
  const invitedBy = invitation.invitedBy ? { id: invitation.invitedBy.id, name: invitation.invitedBy.name } : null;
  return { id, email, role, invitedBy, createdAt, expiresAt, expired: expiresAt.getTime() <= Date.now() };
}

/** Records the invitation and queues its mail; refuses a member's address and a second pending invitation. */
export async function inviteToStudy(
  input: { study: Study; inviter: User; email: string; role: StudyRole },
  transaction: Transaction,
): Promise<Invitation> {
  const { models } = db();
  const { study, inviter, email, role } = input;
  const account = await models.User.findOne({ where: { email }, transaction });
  const membership = account && (await models.Membership.findOne({ where: { studyId: study.id, userId: account.id }, transaction }));
  if (membership) throw conflict('already_member', `${email} is already a ${membership.role} of this study.`);
  const pending = await models.Invitation.findOne({
    where: { studyId: study.id, email, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
    transaction,
  });
  if (pending) throw conflict('already_invited', `${email} already has a pending invitation; revoke it first to send a new one.`);
  const { token, secretHash } = newSignedToken('invitation');
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000);
  const invitation = await models.Invitation.create(
    { studyId: study.id, email, role, invitedById: inviter.id, secretHash, expiresAt },
    { transaction },
  );
  const url = `${readMailConfig().publicUrl}/invite/${token}`;
  const mail = invitationMail({ inviterName: inviter.name, studyTitle: study.title, role, email, url, expiresAt });
  await enqueueMail({ to: email, userId: account?.id ?? null, purpose: 'invitation', mail }, transaction);
  return Object.assign(invitation, { invitedBy: inviter });
}

/** The pending invitation a link names, with its study and inviter; 404 or 410 naming why it cannot be used. */
export async function usableInvitation(token: string, transaction?: Transaction): Promise<LoadedInvitation> {
  const { models } = db();
  const secretHash = signedTokenHash('invitation', token);
  const invitation =
    secretHash &&
    (await models.Invitation.findOne({
      where: { secretHash },
      include: [
        { model: models.Study, as: 'study', required: true },
        { model: models.User, as: 'invitedBy', required: false },
      ],
      transaction,
    }));
  if (!invitation) throw linkInvalid('invitation');
  if (invitation.acceptedAt) throw linkUsed('invitation');
  if (invitation.expiresAt.getTime() <= Date.now()) throw linkExpired('invitation', invitation.expiresAt);
  return invitation as LoadedInvitation;
}

/**
 * Uses the invitation for `user`, who must hold the invited address: they become a member with the invited
 * role (someone already a member keeps their role) and the link is spent.
 */
export async function acceptInvitation(invitation: LoadedInvitation, user: User, transaction: Transaction): Promise<StudyRole> {
  if (user.email !== invitation.email) {
    throw forbidden(`This invitation is for ${invitation.email}; you are signed in as ${user.email}. Sign out and open the link again.`);
  }
  const { models } = db();
  const existing = await models.Membership.findOne({ where: { studyId: invitation.studyId, userId: user.id }, transaction });
  if (!existing) await models.Membership.create({ studyId: invitation.studyId, userId: user.id, role: invitation.role }, { transaction });
  await invitation.update({ acceptedAt: new Date(), acceptedById: user.id }, { transaction });
  return existing?.role ?? invitation.role;
}
