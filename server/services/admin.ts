import type { AppContext } from '../context';
import { HttpError, notFound } from '../errors';
import { User, type Role } from '../models/User';
import { audit } from './audit';

/** Every account, oldest first, with the fields an admin needs. */
export async function listUsers() {
  const users = await User.findAll({ order: [['id', 'ASC']] });
  return users.map((u) => ({ ...u.toPublic(), createdAt: u.createdAt }));
}

/**
 * Changes a member's role, writes it to the audit log and ends the member's sessions
 * so the new role takes effect at their next sign-in.
 */
export async function changeRole(ctx: AppContext, actorId: number, userId: number, role: Role) {
  const user = await ctx.sequelize.transaction(async (transaction) => {
    const target = await User.findByPk(userId, { transaction });
    if (!target) throw notFound('There is no member with this id.');
    if (target.id === actorId && role !== 'admin')
      throw new HttpError(
        409,
        'SELF_DEMOTION',
        'You cannot take the admin role from yourself; ask another admin.',
      );
    const from = target.role;
    if (from === role) return target;
    await target.update({ role, sessionEpoch: target.sessionEpoch + 1 }, { transaction });
    await audit(
      {
        actorId,
        action: 'user.role-change',
        targetType: 'user',
        targetId: target.id,
        details: { from, to: role },
      },
      transaction,
    );
    return target;
  });
  await ctx.sessionStore.destroyForUser(user.id);
  return user;
}
