import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes, type Access } from '../../server/http/access';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';

/**
 * Who may call each route, from the role table of the product design. A route that is
 * not listed here fails the first test, so no route ships without a decision.
 */
const MATRIX: Record<string, Access> = {
  'GET /api/health': 'anyone',
  'GET /api/meta': 'anyone',
  'GET /api/auth/csrf': 'anyone',
  'POST /api/auth/register': 'anyone',
  'POST /api/auth/verify': 'anyone',
  'POST /api/auth/verify/resend': 'signedIn',
  'POST /api/auth/login': 'anyone',
  'POST /api/auth/logout': 'signedIn',
  'GET /api/auth/me': 'anyone',
  'PATCH /api/auth/me': 'signedIn',
  'POST /api/auth/password': 'signedIn',
  'POST /api/auth/password-reset': 'anyone',
  'POST /api/auth/password-reset/confirm': 'anyone',
  'GET /api/admin/users': 'admin',
  'PATCH /api/admin/users/:id': 'admin',
  'GET /api/admin/audit': 'admin',
  'GET /api/dev/mail': 'dev',
  'DELETE /api/dev/mail': 'dev',
  'POST /api/adapters/check': 'anyone',
  'GET /api/connectors': 'anyone',
  'POST /api/documents': 'verified',
  'GET /api/documents/:idOrSlug': 'anyone',
  'GET /api/documents/:id/editor': 'verified',
  'PUT /api/documents/:id/draft': 'verified',
  'POST /api/documents/:id/submit': 'verified',
  'POST /api/documents/:id/withdraw': 'verified',
  'GET /api/documents/:id/revisions': 'signedIn',
  'GET /api/me/documents': 'signedIn',
  'GET /api/search': 'anyone',
  'GET /api/search/suggest': 'anyone',
  'GET /api/browse': 'anyone',
  'GET /api/review/queue': 'moderator',
  'GET /api/review/:revisionId': 'moderator',
  'POST /api/review/:revisionId/claim': 'moderator',
  'POST /api/review/:revisionId/release': 'moderator',
  'POST /api/review/:revisionId/publish': 'moderator',
  'POST /api/review/:revisionId/return': 'moderator',
  'POST /api/review/:revisionId/decline': 'moderator',
  'POST /api/uploads': 'verified',
  'GET /api/uploads/:id': 'anyone',
  'GET /api/uploads/:id/thumb': 'anyone',
  'POST /api/uploads/:id/flatten': 'anyone',
  'GET /api/writeups': 'anyone',
  // Replies, subscriptions, flags, notifications, unsubscribe links, the outbox for admins
  'GET /api/documents/:id/replies': 'anyone',
  'POST /api/documents/:id/replies': 'verified',
  'GET /api/documents/:id/subscription': 'signedIn',
  'PUT /api/documents/:id/subscription': 'signedIn',
  'PATCH /api/replies/:id': 'verified',
  'DELETE /api/replies/:id': 'signedIn',
  'POST /api/replies/:id/hide': 'moderator',
  'POST /api/replies/:id/unhide': 'moderator',
  'POST /api/replies/:id/answer': 'verified',
  'DELETE /api/replies/:id/answer': 'verified',
  'POST /api/flags': 'signedIn',
  'GET /api/flags': 'moderator',
  'POST /api/flags/:id/resolve': 'moderator',
  'GET /api/notifications': 'signedIn',
  'POST /api/notifications/read': 'signedIn',
  'GET /api/me/notifications': 'signedIn',
  'PUT /api/me/notifications': 'signedIn',
  'GET /api/unsubscribe': 'anyone',
  'POST /api/unsubscribe': 'anyone',
  'GET /api/admin/mail': 'admin',
  'POST /api/admin/mail/:id/retry': 'admin',
};

type Who = 'anonymous' | 'unverified' | 'member' | 'moderator' | 'admin';
const WHO: Who[] = ['anonymous', 'unverified', 'member', 'moderator', 'admin'];

/** Whether `who` passes the access gate `access` (ownership is checked later, in services). */
function passes(access: Access, who: Who): boolean {
  switch (access) {
    case 'anyone':
    case 'dev':
      return true;
    case 'signedIn':
      return who !== 'anonymous';
    case 'verified':
      return who === 'member' || who === 'moderator' || who === 'admin';
    case 'moderator':
      return who === 'moderator' || who === 'admin';
    case 'admin':
      return who === 'admin';
  }
}

let env: TestEnv;
const clients = {} as Record<Who, Client>;

beforeAll(async () => {
  env = await createTestEnv();
  for (const who of WHO) clients[who] = (await clientAs(env, who)).client;
});
afterAll(() => env.close());

describe('the role matrix', () => {
  it('has an entry for every registered /api route, and each route declares the same access', () => {
    const routes = listRoutes((env.app as unknown as { router: { stack: never[] } }).router).filter(
      (r) => r.path.startsWith('/api/'),
    );
    expect(routes.length).toBeGreaterThan(10);
    const missing = routes
      .filter((r) => !(`${r.method} ${r.path}` in MATRIX))
      .map((r) => `${r.method} ${r.path}`);
    expect(missing, 'routes with no entry in the role matrix').toEqual([]);
    const undeclared = routes.filter((r) => !r.access).map((r) => `${r.method} ${r.path}`);
    expect(undeclared, 'routes whose first handler is not allow(...)').toEqual([]);
    const differing = routes
      .filter((r) => MATRIX[`${r.method} ${r.path}`] !== r.access)
      .map(
        (r) =>
          `${r.method} ${r.path}: route says ${r.access}, matrix says ${MATRIX[`${r.method} ${r.path}`]}`,
      );
    expect(differing).toEqual([]);
    const registered = new Set(routes.map((r) => `${r.method} ${r.path}`));
    const stale = Object.keys(MATRIX).filter((k) => !registered.has(k));
    expect(stale, 'matrix entries for routes that no longer exist').toEqual([]);
  });

  for (const [key, access] of Object.entries(MATRIX)) {
    const [method, path] = key.split(' ');
    const url = path.replace(/:[A-Za-z]+/g, '1');
    it(`${key} refuses whoever is below "${access}"`, async () => {
      for (const who of WHO) {
        if (passes(access, who)) continue;
        const c = clients[who];
        const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
        const res = await (m === 'get'
          ? c.get(url)
          : m === 'delete'
            ? c.delete(url)
            : c[m](url, {}));
        const expected = who === 'anonymous' ? 401 : 403;
        expect(res.status, `${who} on ${key}`).toBe(expected);
        expect(res.body.error?.message, `${who} on ${key} gets a sentence`).toMatch(/\w+ \w+/);
      }
    });
  }
});
