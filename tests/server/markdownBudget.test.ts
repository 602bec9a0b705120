import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';

let env: TestEnv;
let author: Client;
let moderator: Client;
let docId: number;

beforeAll(async () => {
  env = await createTestEnv();
  author = (await clientAs(env, 'member')).client;
  moderator = (await clientAs(env, 'moderator')).client;
  const doc = await author.post('/api/documents', {
    kind: 'writeup',
    title: 'Moving the level sensor',
    content: { body: 'Moved it 40 mm forward.\n' },
  });
  expect(doc.status, JSON.stringify(doc.body)).toBe(201);
  docId = doc.body.id;
  expect((await author.post(`/api/documents/${docId}/submit`)).status).toBe(200);
  expect((await moderator.post(`/api/review/${doc.body.revision.id}/publish`, {})).status).toBe(
    200,
  );
});
afterAll(() => env.close());

describe('POST /api/documents/:id/replies', () => {
  it('answers 400 with a sentence for a reply with too many brackets, before rendering it', async () => {
    const res = await author.post(`/api/documents/${docId}/replies`, { body: '['.repeat(401) });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/401 "\[" and "<" characters; at most 400/);
  });

  it('answers 400 REPLY_TOO_COMPLEX for a reply that would become too many elements', async () => {
    const res = await author.post(`/api/documents/${docId}/replies`, {
      body: '- `a`\n'.repeat(1_000),
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('REPLY_TOO_COMPLEX');
    expect(res.body.error.message).toMatch(/too much formatting to show/);
    const list = await author.get(`/api/documents/${docId}/replies`);
    expect(list.body).toEqual([]);
  });
});

describe('a write-up body past the Markdown budget', () => {
  it('is saved as a draft, shown as a finding, and refused at submit with 422', async () => {
    const editor = await author.get(`/api/documents/${docId}/editor`);
    const body = `Steps.\n\n${'<http://a> '.repeat(2_500)}`;
    const saved = await author.put(`/api/documents/${docId}/draft`, {
      title: 'Moving the level sensor',
      content: { body },
      version: editor.body.revision.version,
    });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);

    const view = await author.get(`/api/documents/${docId}?revision=2`);
    const finding = view.body.findings.errors.find(
      (f: { code: string }) => f.code === 'BODY_TOO_COMPLEX',
    );
    expect(finding?.message).toMatch(/2,500 "\[" and "<" characters/);

    const refused = await author.post(`/api/documents/${docId}/submit`);
    expect(refused.status).toBe(422);
    expect(refused.body.error.code).toBe('BODY_TOO_COMPLEX');
    expect(refused.body.error.message).toMatch(
      /^This write-up cannot be shown as it is\. The text has/,
    );

    // The published revision is untouched and still readable by everyone.
    const published = await (
      await clientAs(env, 'anonymous')
    ).client.get(`/api/documents/${docId}`);
    expect(published.status).toBe(200);
    expect(published.body.content.body).toBe('Moved it 40 mm forward.\n');

    const fixed = await author.put(`/api/documents/${docId}/draft`, {
      title: 'Moving the level sensor',
      content: { body: 'Moved it 40 mm forward, see <http://example.test/photo>.\n' },
      version: saved.body.revision.version,
    });
    expect(fixed.status).toBe(200);
    expect((await author.post(`/api/documents/${docId}/submit`)).status).toBe(200);
  });
});
