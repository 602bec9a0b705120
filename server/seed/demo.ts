import type { AppContext } from '../context';
import { seedAccounts } from './accounts';
import { seedConnectors } from './connectors';
import { seedAdapters } from './adapters';
import { seedWriteups } from './writeups';
import { seedReplies } from './replies';

export type DemoUsers = Awaited<ReturnType<typeof seedAccounts>>;

/**
 * Seeds an invented community on a fresh database. Each kind of document adds its own
 * step to `DEMO_STEPS`; they run in order with the accounts made first.
 */
export const DEMO_STEPS: Array<(ctx: AppContext, users: DemoUsers) => Promise<void>> = [
  seedConnectors,
  seedAdapters,
  seedWriteups,
  seedReplies,
];

export async function seedDemo(ctx: AppContext) {
  const users = await seedAccounts(ctx);
  for (const step of DEMO_STEPS) await step(ctx, users);
}
