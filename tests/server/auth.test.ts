import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import {
  Client,
  clientAs,
  createTestEnv,
  makeUser,
  TEST_PASSWORD,
  type TestEnv,
} from '../helpers/context';

let env: TestEnv;

beforeAll(async () => {
  env = await createTestEnv({
    config: { throttle: { perAccount: 3, perIp: 50, windowMs: 60_000 } },
  });
});
afterAll(() => env.close());

async function mailFor(to: string) {
  await env.ctx.outbox.flush();
  return env.ctx.fakeSmtp!.list().filter((m) => m.to.includes(to));
}

function linkToken(text: string, path: string) {
  const m = text.match(new RegExp(`${path}\\?token=([\\w%-]+)`));
  if (!m) throw new Error(`no ${path} link in: ${text}`);
  return decodeURIComponent(m[1]);
}

const newUser = (suffix: string) => ({
  email: `${suffix}@example.test`,
  displayName: `Tester ${suffix}`,
  password: 'crimp-and-solder-77',
});

describe('GET /api/health', () => {
  it('answers 200 {ok: true}', async () => {
    const res = await request(env.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true });
  });

  it('sends a content security policy that allows only this origin', async () => {
    const res = await request(env.app).get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });
});

describe('unknown API routes', () => {
  it('answer 404 with a JSON error', async () => {
    const res = await request(env.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('NOT_FOUND');
    expect(res.body.error.message).toMatch(/no-such-thing/);
  });
});

describe('GET /api/auth/csrf', () => {
  it('answers a token', async () => {
    const res = await request(env.app).get('/api/auth/csrf');
    expect(res.status).toBe(200);
    expect(res.body.token).toMatch(/^[\w-]{20,}$/);
  });
});

describe('CSRF protection', () => {
  it('answers 403 when the token is missing', async () => {
    const agent = request.agent(env.app);
    await agent.get('/api/auth/csrf');
    const res = await agent
      .post('/api/auth/login')
      .send({ email: 'a@example.test', password: 'x' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CSRF_INVALID');
  });

  it('answers 403 when the token is wrong', async () => {
    const agent = request.agent(env.app);
    await agent.get('/api/auth/csrf');
    const res = await agent
      .post('/api/auth/login')
      .set('X-CSRF-Token', 'not-the-token-of-this-session')
      .send({ email: 'a@example.test', password: 'x' });
    expect(res.status).toBe(403);
  });

  it('answers 403 for a request the browser marks cross-site, even with the token', async () => {
    const c = new Client(env.app);
    await c.token();
    const res = await c.agent
      .post('/api/auth/login')
      .set('X-CSRF-Token', c.csrf)
      .set('Sec-Fetch-Site', 'cross-site')
      .send({ email: 'a@example.test', password: 'x' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CROSS_SITE');
  });
});

describe('POST /api/auth/register', () => {
  it('answers 201 with the user and sends a verification e-mail', async () => {
    const c = new Client(env.app);
    await c.token();
    const res = await c.post('/api/auth/register', newUser('reg1'));
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({
      email: 'reg1@example.test',
      displayName: 'Tester reg1',
      role: 'member',
      emailVerified: false,
    });
    expect(res.body.user.passwordHash).toBeUndefined();
    const mails = await mailFor('reg1@example.test');
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toMatch(/confirm/i);
    expect(mails[0].text).toMatch(/verify-email\?token=/);
    expect(mails[0].html).toMatch(/<a href=/);
    expect(mails[0].from).toMatch(/Loomwright/);
  });

  it('answers 409 when the e-mail is taken, whatever its case', async () => {
    const c = new Client(env.app);
    await c.token();
    await c.post('/api/auth/register', newUser('taken'));
    const res = await c.post('/api/auth/register', {
      ...newUser('taken'),
      email: 'TAKEN@example.test',
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('EMAIL_TAKEN');
  });

  it.each([
    [
      'a missing e-mail',
      { displayName: 'No Mail', password: 'crimp-and-solder-77' },
      /email.*required/i,
    ],
    ['a malformed e-mail', { ...newUser('x'), email: 'not-an-address' }, /e-mail/i],
    ['a wrong-typed display name', { ...newUser('y'), displayName: 42 }, /displayName/],
    ['an unknown field', { ...newUser('z'), role: 'admin' }, /not expected.*role/],
    ['a short password', { ...newUser('s'), password: 'short' }, /at least 10/],
    ['a very common password', { ...newUser('c'), password: 'password123' }, /common/],
  ])('answers 400 with a sentence for %s', async (_name, body, message) => {
    const c = new Client(env.app);
    await c.token();
    const res = await c.post('/api/auth/register', body);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(message);
    expect(res.body.error.message).toMatch(/\.$/);
  });

  it('answers 400 for a body that is not JSON', async () => {
    const c = new Client(env.app);
    await c.token();
    const res = await c.agent
      .post('/api/auth/register')
      .set('X-CSRF-Token', c.csrf)
      .set('Content-Type', 'application/json')
      .send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('BAD_JSON');
  });

  it('refuses a 2 MB JSON body with 413 and a sentence', async () => {
    const c = new Client(env.app);
    await c.token();
    const res = await c.post('/api/auth/register', {
      ...newUser('big'),
      displayName: 'x'.repeat(2 * 1024 * 1024),
    });
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/too large/);
  });
});

describe('POST /api/auth/verify', () => {
  it('answers 200 once, then 400 for the used token', async () => {
    const c = new Client(env.app);
    await c.token();
    await c.post('/api/auth/register', newUser('ver1'));
    const [mail] = await mailFor('ver1@example.test');
    const token = linkToken(mail.text, '/verify-email');
    const ok = await c.post('/api/auth/verify', { token });
    expect(ok.status).toBe(200);
    expect(ok.body.user.emailVerified).toBe(true);
    const again = await c.post('/api/auth/verify', { token });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('TOKEN_INVALID');
  });

  it('answers 400 for an unknown token', async () => {
    const c = new Client(env.app);
    await c.token();
    const res = await c.post('/api/auth/verify', { token: 'x'.repeat(43) });
    expect(res.status).toBe(400);
  });

  it('answers 400 for an expired token', async () => {
    const c = new Client(env.app);
    await c.token();
    await c.post('/api/auth/register', newUser('ver2'));
    const [mail] = await mailFor('ver2@example.test');
    await env.ctx.models.AuthToken.update(
      { expiresAt: new Date(Date.now() - 1000) },
      { where: { purpose: 'verify' } },
    );
    const res = await c.post('/api/auth/verify', { token: linkToken(mail.text, '/verify-email') });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/expired/);
  });
});

describe('POST /api/auth/login', () => {
  it('answers 200 with the user and a session cookie; GET /api/auth/me then knows them', async () => {
    const user = await makeUser(env, { displayName: 'Pin Counter' });
    const c = new Client(env.app);
    await c.token();
    const res = await c.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ id: user.id, role: 'member', emailVerified: true });
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/lw\.sid=/);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    const me = await c.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user).toEqual({
      id: user.id,
      email: user.email,
      displayName: 'Pin Counter',
      role: 'member',
      emailVerified: true,
    });
  });

  it('gives a new session id at sign-in', async () => {
    const user = await makeUser(env);
    const c = new Client(env.app);
    const first = await c.agent.get('/api/auth/csrf');
    const before = String(first.headers['set-cookie']).match(/lw\.sid=([^;]+)/)![1];
    c.csrf = first.body.token;
    const res = await c.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    const after = String(res.headers['set-cookie']).match(/lw\.sid=([^;]+)/)![1];
    expect(after).not.toBe(before);
  });

  it('answers 401 with the same message for an unknown e-mail and a wrong password', async () => {
    const user = await makeUser(env);
    const c = new Client(env.app);
    await c.token();
    const wrong = await c.post('/api/auth/login', {
      email: user.email,
      password: 'not-the-password',
    });
    const unknown = await c.post('/api/auth/login', {
      email: 'nobody@example.test',
      password: 'not-the-password',
    });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  it('answers 429 with a sentence after repeated failures for one account', async () => {
    const user = await makeUser(env);
    const c = new Client(env.app);
    await c.token();
    for (let i = 0; i < 3; i++) {
      const r = await c.post('/api/auth/login', {
        email: user.email,
        password: 'wrong-password-1',
      });
      expect(r.status).toBe(401);
    }
    const res = await c.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(429);
    expect(res.body.error.message).toMatch(/wait \d+ minute/);
  });
});

describe('POST /api/auth/logout', () => {
  it('answers 204 and the session no longer signs anyone in', async () => {
    const { client } = await clientAs(env, 'member');
    const cookie = (await client.get('/api/auth/me')).request.getHeader?.('cookie');
    void cookie;
    const res = await client.post('/api/auth/logout');
    expect(res.status).toBe(204);
    expect((await client.get('/api/auth/me')).status).toBe(401);
  });

  it('answers 401 when signed out', async () => {
    const c = new Client(env.app);
    await c.token();
    expect((await c.post('/api/auth/logout')).status).toBe(401);
  });
});

describe('GET /api/auth/me', () => {
  it('answers 401 when signed out', async () => {
    const res = await request(env.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.message).toBeTruthy();
  });
});

describe('POST /api/auth/password-reset', () => {
  it('answers 202 whether or not the address exists, and mails only a real account', async () => {
    const user = await makeUser(env);
    const c = new Client(env.app);
    await c.token();
    const known = await c.post('/api/auth/password-reset', { email: user.email });
    const unknown = await c.post('/api/auth/password-reset', { email: 'ghost@example.test' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    expect(await mailFor(user.email)).toHaveLength(1);
    expect(await mailFor('ghost@example.test')).toHaveLength(0);
  });
});

describe('POST /api/auth/password-reset/confirm', () => {
  it('sets the new password once; the token is single-use and old sessions end', async () => {
    const user = await makeUser(env);
    const old = new Client(env.app);
    await old.signIn(user.email);
    const c = new Client(env.app);
    await c.token();
    await c.post('/api/auth/password-reset', { email: user.email });
    const [mail] = await mailFor(user.email);
    const token = linkToken(mail.text, '/reset-password');
    const res = await c.post('/api/auth/password-reset/confirm', {
      token,
      password: 'new-loom-password-5',
    });
    expect(res.status).toBe(200);
    const again = await c.post('/api/auth/password-reset/confirm', {
      token,
      password: 'other-loom-password-6',
    });
    expect(again.status).toBe(400);
    expect((await old.get('/api/auth/me')).status).toBe(401);
    const fresh = new Client(env.app);
    await fresh.signIn(user.email, 'new-loom-password-5');
  });

  it('answers 400 for an expired token', async () => {
    const user = await makeUser(env);
    const c = new Client(env.app);
    await c.token();
    await c.post('/api/auth/password-reset', { email: user.email });
    const [mail] = await mailFor(user.email);
    await env.ctx.models.AuthToken.update(
      { expiresAt: new Date(Date.now() - 1000) },
      { where: { userId: user.id, purpose: 'reset' } },
    );
    const res = await c.post('/api/auth/password-reset/confirm', {
      token: linkToken(mail.text, '/reset-password'),
      password: 'new-loom-password-5',
    });
    expect(res.status).toBe(400);
  });
});

describe('POST /api/auth/password', () => {
  it('changes the password, keeps this session and ends the others', async () => {
    const user = await makeUser(env);
    const here = new Client(env.app);
    await here.signIn(user.email);
    const elsewhere = new Client(env.app);
    await elsewhere.signIn(user.email);
    const res = await here.post('/api/auth/password', {
      currentPassword: TEST_PASSWORD,
      newPassword: 'brand-new-splice-42',
    });
    expect(res.status).toBe(200);
    if (res.body.csrfToken) here.csrf = res.body.csrfToken;
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
  });

  it('answers 400 when the current password is wrong', async () => {
    const { client } = await clientAs(env, 'member');
    const res = await client.post('/api/auth/password', {
      currentPassword: 'not-it-at-all',
      newPassword: 'brand-new-splice-42',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/current password/);
  });
});

describe('GET /api/admin/users', () => {
  it('answers 401 signed out, 403 for a member or moderator, 200 with a list for an admin', async () => {
    expect((await request(env.app).get('/api/admin/users')).status).toBe(401);
    expect((await (await clientAs(env, 'member')).client.get('/api/admin/users')).status).toBe(403);
    expect((await (await clientAs(env, 'moderator')).client.get('/api/admin/users')).status).toBe(
      403,
    );
    const res = await (await clientAs(env, 'admin')).client.get('/api/admin/users');
    expect(res.status).toBe(200);
    expect(Array.isArray(res.body)).toBe(true);
    expect(res.body[0]).toHaveProperty('role');
    expect(res.body[0]).not.toHaveProperty('passwordHash');
  });
});

describe('PATCH /api/admin/users/:id', () => {
  it('changes the role, writes the audit log and ends the member\u2019s sessions', async () => {
    const { client: admin, user: adminUser } = await clientAs(env, 'admin');
    const { client: member, user } = await clientAs(env, 'member');
    const res = await admin.patch(`/api/admin/users/${user!.id}`, { role: 'moderator' });
    expect(res.status).toBe(200);
    expect(res.body.user.role).toBe('moderator');
    expect((await member.get('/api/auth/me')).status).toBe(401);
    const audit = await admin.get('/api/admin/audit');
    expect(audit.status).toBe(200);
    const entry = audit.body.items.find(
      (i: { action: string; targetId: string }) =>
        i.action === 'user.role-change' && i.targetId === String(user!.id),
    );
    expect(entry).toMatchObject({
      actor: { id: adminUser!.id },
      details: { from: 'member', to: 'moderator' },
    });
  });

  it('answers 400 for a role that does not exist and 404 for an unknown member', async () => {
    const { client: admin } = await clientAs(env, 'admin');
    const user = await makeUser(env);
    expect((await admin.patch(`/api/admin/users/${user.id}`, { role: 'owner' })).status).toBe(400);
    expect((await admin.patch('/api/admin/users/999999', { role: 'member' })).status).toBe(404);
    expect((await admin.patch('/api/admin/users/abc', { role: 'member' })).status).toBe(400);
  });
});

describe('GET /api/dev/mail', () => {
  it('lists captured e-mails newest first with to, subject, text, html and date', async () => {
    const c = new Client(env.app);
    await c.token();
    await c.post('/api/auth/register', newUser('mbox1'));
    await c.post('/api/auth/register', newUser('mbox2'));
    const res = await request(env.app).get('/api/dev/mail');
    expect(res.status).toBe(200);
    const ours = res.body.filter((m: { to: string }) => /mbox[12]/.test(m.to));
    expect(ours.map((m: { to: string }) => m.to)).toEqual([
      'mbox2@example.test',
      'mbox1@example.test',
    ]);
    for (const key of ['to', 'subject', 'text', 'html', 'date'])
      expect(ours[0]).toHaveProperty(key);
  });
});

describe('an unverified member', () => {
  it('can read and sign in but is told to verify before posting', async () => {
    const { client } = await clientAs(env, 'unverified');
    expect((await client.get('/api/auth/me')).body.user.emailVerified).toBe(false);
    const res = await client.post('/api/auth/verify/resend');
    expect(res.status).toBe(202);
  });
});
