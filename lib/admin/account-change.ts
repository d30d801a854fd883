// An admin's change of another account's site role or disabled state. Everything is read and checked inside the
// write transaction, so two admins acting at once (demoting each other, say) cannot leave the site without an
// enabled admin: the second change sees the first.
import { Op } from 'sequelize';
import { conflict, forbidden, notFound } from '../api/errors';
import { endUserSessions } from '../auth/server-sessions';
import { db } from '../db/connection';
import type { User } from '@/models/user';
import type { SiteRole } from '@/models/vocabulary';

export interface AccountChange {
  siteRole?: SiteRole;
  disabled?: boolean;
}

function isActiveAdmin(user: Pick<User, 'siteRole' | 'disabled'>): boolean {
  return user.siteRole === 'admin' && !user.disabled;
}

export async function changeAccount(actorId: number, userId: number, change: AccountChange): Promise<User> {
  const { models, write } = db();
  return write(async (transaction) => {
    const actor = await models.User.findByPk(actorId, { transaction });
    if (!actor || !isActiveAdmin(actor)) throw forbidden('Only site admins may do this.');
    const user = await models.User.findByPk(userId, { transaction });
    if (!user) throw notFound(`No user with id ${userId}.`);
    // Keeps at least one admin able to act: nobody can lock themselves out.
    if (user.id === actor.id && (change.disabled === true || change.siteRole === 'member')) {
      throw conflict('self_lockout', 'Admins cannot disable or demote themselves; ask another admin.');
    }
    const wasActiveAdmin = isActiveAdmin(user);
    if (change.siteRole !== undefined) user.siteRole = change.siteRole;
    if (change.disabled !== undefined && change.disabled !== user.disabled) {
      user.disabled = change.disabled;
      // Ends the sessions issued before, so enabling the account again does not bring them back.
      user.sessionVersion += 1;
      if (user.disabled) {
        await endUserSessions(user.id, null, transaction);
        // Tokens end for good too: a token made before the disable must not work again after re-enabling.
        await models.ApiToken.destroy({ where: { userId: user.id }, transaction });
      }
    }
    if (wasActiveAdmin && !isActiveAdmin(user)) {
      const others = await models.User.count({
        where: { siteRole: 'admin', disabled: false, id: { [Op.ne]: user.id } },
        transaction,
      });
      if (others === 0) throw conflict('last_admin', 'This is the last enabled admin; make someone else an admin first.');
    }
    await user.save({ transaction });
    return user;
  });
}
