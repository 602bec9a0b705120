import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { Client, createTestEnv, makeUser, type TestEnv } from '../helpers/context';

let env: TestEnv;
const IDLE = 2000;
const ABSOLUTE = 5000;

beforeAll(async () => {
  env = await createTestEnv({ config: { session: { idleMs: IDLE, absoluteMs: ABSOLUTE } } });
});
afterAll(() => env.close());

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function signedInCookie() {
  const user = await makeUser(env);
  const c = new Client(env.app);
  await c.token();
  const res = await c.post('/api/auth/login', {
    email: user.email,
    password: 'harness-test-pass-91',
  });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  const cookie = String(res.headers['set-cookie']).match(/lw\.sid=[^;]+/)![0];
  return { cookie, user };
}

const me = (cookie: string) => request(env.app).get('/api/auth/me').set('Cookie', cookie);

describe('sessions', () => {
  it('are refused after the idle timeout, even while the row is still in the store', async () => {
    const { cookie } = await signedInCookie();
    expect((await me(cookie)).status).toBe(200);
    await sleep(IDLE + 200);
    const rows = await env.ctx.models.Session.count();
    expect(rows).toBeGreaterThan(0);
    expect((await me(cookie)).status).toBe(401);
  });

  it('stay alive while used, then end at the absolute timeout however active', async () => {
    const { cookie } = await signedInCookie();
    const started = Date.now();
    while (Date.now() - started < ABSOLUTE - 1000) {
      expect((await me(cookie)).status).toBe(200);
      await sleep(IDLE / 4);
    }
    await sleep(1200);
    expect((await me(cookie)).status).toBe(401);
  });

  it('end at sign-out: the old id replayed signs nobody in', async () => {
    const user = await makeUser(env);
    const c = new Client(env.app);
    await c.token();
    const res = await c.post('/api/auth/login', {
      email: user.email,
      password: 'harness-test-pass-91',
    });
    const cookie = String(res.headers['set-cookie']).match(/lw\.sid=[^;]+/)![0];
    if (res.body.csrfToken) c.csrf = res.body.csrfToken;
    expect((await c.post('/api/auth/logout')).status).toBe(204);
    expect((await me(cookie)).status).toBe(401);
  });

  it('end when an admin changes the member\u2019s role', async () => {
    const { cookie, user } = await signedInCookie();
    const admin = await makeUser(env, { role: 'admin' });
    const a = new Client(env.app);
    await a.signIn(admin.email);
    expect((await a.patch(`/api/admin/users/${user.id}`, { role: 'moderator' })).status).toBe(200);
    expect((await me(cookie)).status).toBe(401);
  });

  it('a pruned store drops expired rows', async () => {
    await signedInCookie();
    await sleep(IDLE + 200);
    await env.ctx.sessionStore.prune();
    const { Op } = await import('sequelize');
    expect(
      await env.ctx.models.Session.count({ where: { expires: { [Op.lte]: new Date() } } }),
    ).toBe(0);
  });
});
