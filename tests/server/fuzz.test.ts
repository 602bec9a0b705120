import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { listRoutes } from '../../server/http/access';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';

/**
 * Property-based fuzzing of every JSON route: generated bodies of every shape, sent as
 * every role, must never make the server answer 500 or change another member's data.
 */
const TOTAL_BODIES = Number(process.env.FUZZ_BODIES ?? 10_000);

let env: TestEnv;
const clients: Record<string, Client> = {};
let victimDocId = 0;

const hostileKey = fc.constantFrom(
  '__proto__',
  'constructor',
  'prototype',
  'toString',
  '$where',
  '',
);
const hostileString = fc.oneof(
  fc.string(),
  fc.string({ unit: 'binary', maxLength: 50 }),
  fc.constantFrom(
    '\u0000',
    '\uFEFF',
    '\uD800',
    '𝔘𝔫𝔦𝔠𝔬𝔡𝔢',
    'e\u0301\u0301\u0301',
    '<script>alert(1)</script>',
    "' OR 1=1 --",
    '"*^NEAR(',
    '../../etc/passwd',
    'x'.repeat(5000),
  ),
);
const leaf = fc.oneof(hostileString, fc.integer(), fc.double(), fc.boolean(), fc.constant(null));
const body: fc.Arbitrary<unknown> = fc.letrec((tie) => ({
  value: fc.oneof({ depthSize: 'small', withCrossShrink: true }, leaf, tie('array'), tie('object')),
  array: fc.array(tie('value'), { maxLength: 5 }),
  object: fc.dictionary(fc.oneof(fc.string({ maxLength: 12 }), hostileKey), tie('value'), {
    maxKeys: 6,
  }),
})).value;

/** Deep nesting that a naive parser would recurse through. */
const deep = fc.integer({ min: 50, max: 400 }).map((n) => {
  let v: unknown = 'bottom';
  for (let i = 0; i < n; i++) v = { a: [v] };
  return v;
});

const pathValue = fc.oneof(
  fc.constant('1'),
  fc.integer({ min: -5, max: 1_000_000 }).map(String),
  fc.constantFrom('__proto__', '%00', '..%2F..', 'nope', '9'.repeat(30), '%F0%9F%94%8C'),
);

async function snapshot() {
  const rows = await env.ctx.sequelize.query(
    `SELECT id, email, display_name, role, password_hash FROM users WHERE email LIKE 'victim%' ORDER BY id`,
    { type: 'SELECT' },
  );
  const docs = await env.ctx.sequelize
    .query(`SELECT * FROM revisions WHERE document_id = ${victimDocId} ORDER BY id`, {
      type: 'SELECT',
    })
    .catch(() => []);
  return crypto
    .createHash('sha256')
    .update(JSON.stringify([rows, docs]))
    .digest('hex');
}

beforeAll(async () => {
  env = await createTestEnv({
    config: { throttle: { perAccount: 1_000_000, perIp: 1_000_000, windowMs: 1000 } },
  });
  for (const who of ['anonymous', 'unverified', 'member', 'moderator', 'admin'] as const)
    clients[who] = (await clientAs(env, who)).client;
  const victim = (await clientAs(env, 'member')).client;
  await env.ctx.models.User.update(
    { email: 'victim@example.test' },
    { where: { email: (await victim.get('/api/auth/me')).body.user.email } },
  );
  const created = await victim.post('/api/documents', {
    kind: 'connector',
    title: 'Victim sheet',
    content: { cavityCount: 2, pins: [] },
  });
  victimDocId = created.body.id ?? 0;
}, 120_000);
afterAll(() => env.close());

describe('every JSON route under generated input', () => {
  it(`answers no 500 and leaves others' data alone over ${TOTAL_BODIES} bodies`, async () => {
    const routes = listRoutes((env.app as unknown as { router: { stack: never[] } }).router).filter(
      (r) =>
        ['POST', 'PUT', 'PATCH', 'DELETE'].includes(r.method) &&
        r.path.startsWith('/api/') &&
        !/logout|uploads|dev\/mail/.test(r.path),
    );
    expect(routes.length).toBeGreaterThan(10);
    const before = await snapshot();
    const perRoute = Math.max(1, Math.floor(TOTAL_BODIES / routes.length));
    const who = Object.keys(clients);
    const failures: string[] = [];
    let sent = 0;
    for (const route of routes) {
      await fc
        .assert(
          fc.asyncProperty(
            fc.oneof({ weight: 9, arbitrary: body }, { weight: 1, arbitrary: deep }),
            pathValue,
            fc.nat(),
            async (b, p, w) => {
              const url = route.path.replace(
                /:[A-Za-z]+/g,
                route.path.includes('documents/:id') && w % 3 === 0 ? String(victimDocId) : p,
              );
              const c = clients[who[w % who.length]];
              const m = route.method.toLowerCase() as 'post' | 'put' | 'patch' | 'delete';
              const req = c.agent[m](url)
                .set('X-CSRF-Token', c.csrf)
                .set('Content-Type', 'application/json');
              const res = await req.send(JSON.stringify(b));
              sent++;
              if (res.status >= 500 && res.status !== 503) {
                failures.push(
                  `${route.method} ${url} as ${who[w % who.length]} → ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`,
                );
              }
              expect(res.status < 500 || res.status === 503).toBe(true);
              if (res.status >= 400) expect(typeof res.body?.error?.message).toBe('string');
            },
          ),
          { numRuns: perRoute, endOnFailure: true },
        )
        .catch((err) => failures.push(String(err).slice(0, 500)));
    }
    console.log(`fuzz: ${sent} bodies over ${routes.length} routes`);
    expect(failures).toEqual([]);
    expect(await snapshot()).toBe(before);
  }, 600_000);

  it('answers no 500 to generated query strings and path values on every GET route', async () => {
    const routes = listRoutes((env.app as unknown as { router: { stack: never[] } }).router).filter(
      (r) => r.method === 'GET' && r.path.startsWith('/api/'),
    );
    expect(routes.length).toBeGreaterThan(10);
    const knownKeys = fc.constantFrom(
      'q',
      'kind',
      'cavities',
      'cavitiesMin',
      'cavitiesMax',
      'component',
      'sealed',
      'housing',
      'color',
      'role',
      'tag',
      'sort',
      'limit',
      'offset',
      'revision',
      'status',
      'token',
      'ids',
    );
    const key = fc.oneof(knownKeys, hostileKey, fc.string({ maxLength: 10 }), fc.constant('q[]'));
    const value = fc.oneof(
      hostileString,
      fc.integer().map(String),
      fc.constantFrom('-1', '1e309', 'NaN', '0x10', ''),
    );
    // Raw pieces URLSearchParams would never write: broken escapes, bare separators.
    const raw = fc.constantFrom('%', '%E0%A4%A', '%ZZ', '&&&', '==', 'q=%00', 'q=%uD800', '+%2B+');
    const query = fc.oneof(
      {
        weight: 4,
        arbitrary: fc
          .array(fc.tuple(key, value), { maxLength: 6 })
          .map((pairs) => new URLSearchParams(pairs).toString()),
      },
      { weight: 1, arbitrary: raw },
    );
    const who = Object.keys(clients);
    const failures: string[] = [];
    let sent = 0;
    for (const route of routes) {
      await fc
        .assert(
          fc.asyncProperty(query, pathValue, fc.nat(), async (q, p, w) => {
            const url = `${route.path.replace(/:[A-Za-z]+/g, p)}?${q}`;
            const res = await clients[who[w % who.length]].agent.get(url);
            sent++;
            if (res.status >= 500 && res.status !== 503)
              failures.push(
                `GET ${url} as ${who[w % who.length]} → ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`,
              );
            expect(res.status < 500 || res.status === 503).toBe(true);
          }),
          { numRuns: 40, endOnFailure: true },
        )
        .catch((err) => failures.push(String(err).slice(0, 500)));
    }
    console.log(`fuzz: ${sent} query strings over ${routes.length} GET routes`);
    expect(failures).toEqual([]);
  }, 300_000);

  it('answers 400 NUL_CHARACTER for a NUL in the address, the query or anywhere in a JSON body', async () => {
    const c = clients.member;
    for (const url of [
      '/api/documents/%00',
      '/api/documents/a%00b/replies',
      '/api/search?q=pump%00',
    ]) {
      const res = await c.agent.get(url);
      expect(res.status, url).toBe(400);
      expect(res.body.error.code).toBe('NUL_CHARACTER');
    }
    const body = await c.post('/api/documents', {
      kind: 'connector',
      title: 'Plug',
      content: { notes: ['a', { deep: 'x\u0000y' }] },
    });
    expect(body.status).toBe(400);
    expect(body.body.error.message).toMatch(/NUL character \(U\+0000\)/);
    const key = await c.post('/api/adapters/check', {
      ends: { A: {}, B: {} },
      circuits: [],
      ['k\u0000']: 1,
    });
    expect(key.status).toBe(400);
  });
});
