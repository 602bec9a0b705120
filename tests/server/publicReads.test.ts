import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';
import { threeWaySensor } from '../helpers/fixtures';

/**
 * Readers without a session get searches and published sheets from the prepared answers,
 * ahead of the routes. What they get must be exactly what the routes give.
 */
let env: TestEnv;
let author: Client;
let moderator: Client;
let signedIn: Client;
let slug = '';

async function publishSheet(title: string) {
  const doc = await author.post('/api/documents', {
    kind: 'connector',
    title,
    content: threeWaySensor(),
  });
  expect(doc.status, JSON.stringify(doc.body)).toBe(201);
  expect((await author.post(`/api/documents/${doc.body.id}/submit`)).status).toBe(200);
  expect((await moderator.post(`/api/review/${doc.body.revision.id}/publish`, {})).status).toBe(
    200,
  );
  return doc.body as { id: number; slug: string };
}

beforeAll(async () => {
  env = await createTestEnv();
  author = (await clientAs(env, 'member')).client;
  moderator = (await clientAs(env, 'moderator')).client;
  signedIn = (await clientAs(env, 'member')).client;
  slug = (await publishSheet('Invented level sensor plug')).slug;
});
afterAll(() => env.close());

const anon = () => request(env.app);

describe('GET /api/documents/:slug without a session', () => {
  it('answers the same body, ETag and security headers as the route a signed-in reader gets', async () => {
    const a = await anon().get(`/api/documents/${slug}`);
    const b = await anon().get(`/api/documents/${slug}`);
    const routed = await signedIn.get(`/api/documents/${slug}`);
    expect(a.status).toBe(200);
    expect(routed.status).toBe(200);
    expect(b.text).toBe(a.text);
    expect(a.body).toEqual(routed.body);
    expect(a.headers.etag).toBe(routed.headers.etag);
    expect(a.headers['content-type']).toBe('application/json; charset=utf-8');
    for (const h of [
      'content-security-policy',
      'x-content-type-options',
      'referrer-policy',
      'x-frame-options',
    ])
      expect(a.headers[h], h).toBe(routed.headers[h]);
    expect(a.headers['set-cookie']).toBeUndefined();
  });

  it('answers 304 to the ETag it gave, and HEAD without a body', async () => {
    const first = await anon().get(`/api/documents/${slug}`);
    const again = await anon()
      .get(`/api/documents/${slug}`)
      .set('If-None-Match', `"other", ${first.headers.etag}`);
    expect(again.status).toBe(304);
    expect(again.text).toBe('');
    const head = await anon().head(`/api/documents/${slug}`);
    expect(head.status).toBe(200);
    expect(Number(head.headers['content-length'])).toBe(Buffer.byteLength(first.text));
  });

  it('leaves a 404, a query and odd addresses to the route, which answers them with a sentence', async () => {
    const missing = await anon().get('/api/documents/no-such-sheet');
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toMatch(/\w+ \w+/);
    expect((await anon().get(`/api/documents/${slug}?revision=99`)).status).toBe(404);
    expect((await anon().get('/api/documents/%E0%A4%A')).status).toBe(400);
    expect((await anon().get('/api/documents/%00')).body.error.code).toBe('NUL_CHARACTER');
  });
});

describe('GET /api/search without a session', () => {
  it('answers what the route answers, and sees a new publication at once', async () => {
    const q = '/api/search?q=level%20sensor';
    const a = await anon().get(q);
    const routed = await signedIn.get(q);
    expect(a.status).toBe(200);
    expect(a.body).toEqual(routed.body);
    expect(a.headers.etag).toBe(routed.headers.etag);
    const before = a.body.total as number;
    await publishSheet('Second invented level sensor plug');
    const after = await anon().get(q);
    expect(after.body.total).toBe(before + 1);
  });

  it('leaves a bad parameter to the route: 400 naming it', async () => {
    const res = await anon().get('/api/search?q=pump&colour=red');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/"colour" is not known here/);
  });
});
