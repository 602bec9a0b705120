import type { AppContext } from '../context';
import { hashPassword } from '../auth/passwords';
import type { Role } from '../models/User';

/** The four accounts the README names, plus an invented community. */
export const DEMO_ACCOUNTS: Array<{ email: string; displayName: string; role: Role }> = [
  { email: 'admin@example.test', displayName: 'Ada Quillfeather', role: 'admin' },
  { email: 'moderator@example.test', displayName: 'Moss Tarrow', role: 'moderator' },
  { email: 'member@example.test', displayName: 'Rook Vantler', role: 'member' },
  { email: 'member2@example.test', displayName: 'Juniper Okonye', role: 'member' },
];

const COMMUNITY: Array<{ email: string; displayName: string }> = [
  { email: 'sable.wren@example.test', displayName: 'Sable Wren' },
  { email: 'tobin.arkwell@example.test', displayName: 'Tobin Arkwell' },
  { email: 'pell.marrow@example.test', displayName: 'Pell Marrow' },
];

/** Creates the demo accounts (all verified) and returns them by e-mail. */
export async function seedAccounts(ctx: AppContext) {
  const { User } = ctx.models;
  const passwordHash = await hashPassword(ctx.config.demoPassword, ctx.config.passwordHashCost);
  const now = new Date();
  const rows = [...DEMO_ACCOUNTS, ...COMMUNITY.map((c) => ({ ...c, role: 'member' as Role }))];
  const users = await ctx.sequelize.transaction(async (transaction) =>
    Promise.all(
      rows.map((r) => User.create({ ...r, passwordHash, emailVerifiedAt: now }, { transaction })),
    ),
  );
  return Object.fromEntries(users.map((u) => [u.email, u]));
}
