import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { Express } from 'express';
import { loadConfig, type Config } from '../../server/config';
import { createContext } from '../../server/bootstrap';
import { createApp } from '../../server/app';
import type { AppContext } from '../../server/context';
import { hashPassword } from '../../server/auth/passwords';
import type { Role } from '../../server/models/User';

/** Cheap scrypt for tests; production uses OWASP's N=2^17. */
export const TEST_HASH_COST = { N: 2 ** 10, r: 8, p: 1 };
export const TEST_PASSWORD = 'harness-test-pass-91';

export interface TestEnv {
  ctx: AppContext;
  app: Express;
  dataDir: string;
  close(): Promise<void>;
}

/** A fresh app on its own temporary DATA_DIR, with a mail fake on a free port. */
export async function createTestEnv(
  opts: { seedDemo?: boolean; config?: Partial<Config>; env?: Record<string, string> } = {},
): Promise<TestEnv> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-test-'));
  const config = loadConfig(
    {
      NODE_ENV: 'test',
      DATA_DIR: dataDir,
      DEV_SMTP_PORT: '0',
      DEMO_PASSWORD: TEST_PASSWORD,
      LOG_LEVEL: process.env.LOG_LEVEL ?? 'silent',
      ...opts.env,
    },
    {
      seedDemo: opts.seedDemo ?? false,
      passwordHashCost: TEST_HASH_COST,
      outbox: { pollMs: 50, maxAttempts: 3, baseBackoffMs: 20 },
      ...opts.config,
    },
  );
  const ctx = await createContext(config);
  const app = createApp(ctx);
  return {
    ctx,
    app,
    dataDir,
    async close() {
      await ctx.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

let counter = 0;

/** Creates an account straight in the database. */
export async function makeUser(
  env: TestEnv,
  opts: { role?: Role; verified?: boolean; email?: string; displayName?: string } = {},
) {
  counter++;
  return env.ctx.models.User.create({
    email: opts.email ?? `user${counter}-${Date.now()}@example.test`,
    displayName: opts.displayName ?? `Tester ${counter}`,
    passwordHash: await hashPassword(TEST_PASSWORD, TEST_HASH_COST),
    role: opts.role ?? 'member',
    emailVerifiedAt: opts.verified === false ? null : new Date(),
  });
}

/** A cookie-keeping client that sends the CSRF token on state-changing requests. */
export class Client {
  readonly agent: ReturnType<typeof request.agent>;
  csrf = '';

  constructor(app: Express) {
    this.agent = request.agent(app);
  }

  async token() {
    const res = await this.agent.get('/api/auth/csrf');
    this.csrf = res.body.token;
    return this.csrf;
  }

  get(url: string) {
    return this.agent.get(url);
  }
  post(url: string, body?: object) {
    return this.agent
      .post(url)
      .set('X-CSRF-Token', this.csrf)
      .send(body ?? {});
  }
  put(url: string, body?: object) {
    return this.agent
      .put(url)
      .set('X-CSRF-Token', this.csrf)
      .send(body ?? {});
  }
  patch(url: string, body?: object) {
    return this.agent
      .patch(url)
      .set('X-CSRF-Token', this.csrf)
      .send(body ?? {});
  }
  delete(url: string) {
    return this.agent.delete(url).set('X-CSRF-Token', this.csrf);
  }

  /** Signs in; throws unless the server says 200. */
  async signIn(email: string, password = TEST_PASSWORD) {
    if (!this.csrf) await this.token();
    const res = await this.post('/api/auth/login', { email, password });
    if (res.status !== 200)
      throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
    if (res.body.csrfToken) this.csrf = res.body.csrfToken;
    return res.body.user;
  }
}

/** A signed-in client for a new account of the given role. */
export async function clientAs(env: TestEnv, role: Role | 'unverified' | 'anonymous') {
  const client = new Client(env.app);
  await client.token();
  if (role === 'anonymous') return { client, user: null };
  const user = await makeUser(env, {
    role: role === 'unverified' ? 'member' : role,
    verified: role !== 'unverified',
  });
  await client.signIn(user.email);
  return { client, user };
}
