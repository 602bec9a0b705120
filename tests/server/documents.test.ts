import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';
import { threeWaySensor } from '../helpers/fixtures';

let env: TestEnv;
let author: Client;
let authorId: number;
let other: Client;
let unverified: Client;
let moderator: Client;
let admin: Client;
let anon: Client;

beforeAll(async () => {
  env = await createTestEnv();
  const a = await clientAs(env, 'member');
  author = a.client;
  authorId = a.user!.id;
  other = (await clientAs(env, 'member')).client;
  unverified = (await clientAs(env, 'unverified')).client;
  moderator = (await clientAs(env, 'moderator')).client;
  admin = (await clientAs(env, 'admin')).client;
  anon = (await clientAs(env, 'anonymous')).client;
});
afterAll(() => env.close());

const sensor = threeWaySensor;

async function createSheet(c: Client = author, title = 'Coolant sensor plug', content = sensor()) {
  const res = await c.post('/api/documents', { kind: 'connector', title, content });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as {
    id: number;
    slug: string;
    revision: { id: number; number: number; status: string; version: number };
  };
}

async function publish(docId: number, by: Client = moderator) {
  const sub = await author.post(`/api/documents/${docId}/submit`);
  expect(sub.status, JSON.stringify(sub.body)).toBe(200);
  const pub = await by.post(`/api/review/${sub.body.revision.id}/publish`, {});
  expect(pub.status, JSON.stringify(pub.body)).toBe(200);
  return pub.body.revision;
}

describe('POST /api/documents', () => {
  it('answers 201 with the id, a slug from the title and the first draft revision', async () => {
    const res = await author.post('/api/documents', {
      kind: 'connector',
      title: 'Quorvane T3 Injector Plug',
      content: sensor(),
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      id: expect.any(Number),
      slug: 'quorvane-t3-injector-plug',
      revision: { id: expect.any(Number), number: 1, status: 'draft', version: 1 },
    });
  });

  it('makes slugs unique with a suffix, and never all digits', async () => {
    const a = await createSheet(author, 'Pump Module Plug');
    const b = await createSheet(author, 'Pump module plug!');
    expect(a.slug).toBe('pump-module-plug');
    expect(b.slug).toBe('pump-module-plug-2');
    const n = await createSheet(author, '4242');
    expect(n.slug).toBe('connector-4242');
  });

  it('accepts an incomplete draft: blank cells, no view yet, an empty table', async () => {
    const res = await author.post('/api/documents', {
      kind: 'connector',
      title: 'Half done',
      content: {
        cavityCount: 6,
        view: '',
        housing: '',
        pins: [{ cavity: '', role: '', color: '' }],
      },
    });
    expect(res.status).toBe(201);
  });

  it('answers 400 naming the field for content that does not fit', async () => {
    const bad = await author.post('/api/documents', {
      kind: 'connector',
      title: 'x',
      content: { view: 'top side' },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toContain('content.view');
    const unknown = await author.post('/api/documents', {
      kind: 'connector',
      title: 'x',
      content: { colour: 'red' },
    });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toMatch(/colour/);
    const tooMany = await author.post('/api/documents', {
      kind: 'connector',
      title: 'x',
      content: { cavities: Array.from({ length: 401 }, (_, i) => String(i + 1)) },
    });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.message).toContain('content.cavities');
    const kind = await author.post('/api/documents', { kind: 'poster', title: 'x', content: {} });
    expect(kind.status).toBe(400);
    expect(kind.body.error.message).toContain('kind');
    const title = await author.post('/api/documents', {
      kind: 'connector',
      title: '  ',
      content: {},
    });
    expect(title.status).toBe(400);
    expect(title.body.error.message).toContain('title');
    const notObject = await author.post('/api/documents', ['x'] as unknown as object);
    expect(notObject.status).toBe(400);
  });

  it('answers 401 signed out and 403 for an unverified account', async () => {
    const body = { kind: 'connector', title: 'x', content: {} };
    expect((await anon.post('/api/documents', body)).status).toBe(401);
    const res = await unverified.post('/api/documents', body);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('EMAIL_UNVERIFIED');
  });

  it('creates write-ups and adapters too', async () => {
    const w = await author.post('/api/documents', {
      kind: 'writeup',
      title: 'Moving the sensor',
      content: { body: '# Steps' },
    });
    expect(w.status).toBe(201);
    const a = await author.post('/api/documents', {
      kind: 'adapter',
      title: 'Pump adapter',
      content: { ends: {}, circuits: [] },
    });
    expect(a.status).toBe(201);
  });
});

describe('GET /api/documents/:idOrSlug', () => {
  it('answers 404 to everyone, the author included, while nothing is published', async () => {
    const doc = await createSheet();
    for (const c of [anon, other, moderator, author]) {
      expect((await c.get(`/api/documents/${doc.id}`)).status).toBe(404);
      expect((await c.get(`/api/documents/${doc.slug}`)).status).toBe(404);
    }
  });

  it('lets the author and moderators ask for a draft with ?revision=N, and nobody else', async () => {
    const doc = await createSheet();
    const mine = await author.get(`/api/documents/${doc.id}?revision=1`);
    expect(mine.status).toBe(200);
    expect(mine.body.revision.status).toBe('draft');
    expect((await moderator.get(`/api/documents/${doc.slug}?revision=1`)).status).toBe(200);
    expect((await admin.get(`/api/documents/${doc.slug}?revision=1`)).status).toBe(200);
    expect((await other.get(`/api/documents/${doc.id}?revision=1`)).status).toBe(404);
    expect((await anon.get(`/api/documents/${doc.id}?revision=1`)).status).toBe(404);
    expect((await author.get(`/api/documents/${doc.id}?revision=9`)).status).toBe(404);
    expect((await author.get(`/api/documents/${doc.id}?revision=abc`)).status).toBe(400);
  });

  it('never shows a submitted revision to a reader', async () => {
    const doc = await createSheet();
    expect((await author.post(`/api/documents/${doc.id}/submit`)).status).toBe(200);
    expect((await anon.get(`/api/documents/${doc.id}`)).status).toBe(404);
    expect((await anon.get(`/api/documents/${doc.id}?revision=1`)).status).toBe(404);
    expect((await other.get(`/api/documents/${doc.slug}`)).status).toBe(404);
  });

  it('shows the published revision with owner, reviewer, summary and findings', async () => {
    const doc = await createSheet(
      author,
      'Brindlemoor coolant sensor',
      sensor({ pins: [...sensor().pins!, { cavity: 'A', role: 'battery feed' }] }),
    );
    await publish(doc.id);
    const res = await request(env.app).get(`/api/documents/${doc.slug}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      id: doc.id,
      slug: doc.slug,
      kind: 'connector',
      title: 'Brindlemoor coolant sensor',
      content: { view: 'wire-side', component: 'coolant temperature sensor' },
      owner: { id: authorId, displayName: expect.any(String) },
      revision: {
        number: 1,
        status: 'published',
        version: 1,
        publishedAt: expect.any(String),
        reviewer: { id: expect.any(Number) },
      },
    });
    expect(res.body.summary).toContain('3-cavity');
    expect(res.body.findings.cautions).toContain('battery');
    expect(res.body.findings.errors.map((e: { code: string }) => e.code)).toContain(
      'PIN_CAVITY_REPEATED',
    );
    expect(res.body.owner.email).toBeUndefined();
  });

  it('keeps the published revision visible while the next one is drafted and reviewed', async () => {
    const doc = await createSheet(author, 'Stays visible');
    await publish(doc.id);
    const save = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Stays visible (revised)',
      content: sensor({ component: 'changed component' }),
      version: 1,
    });
    expect(save.status).toBe(200);
    expect(save.body.revision).toMatchObject({ number: 2, status: 'draft', version: 2 });
    let pub = await anon.get(`/api/documents/${doc.slug}`);
    expect(pub.body.title).toBe('Stays visible');
    expect(pub.body.content.component).toBe('coolant temperature sensor');
    expect((await author.post(`/api/documents/${doc.id}/submit`)).status).toBe(200);
    pub = await anon.get(`/api/documents/${doc.slug}`);
    expect(pub.status).toBe(200);
    expect(pub.body.revision.number).toBe(1);
    expect((await anon.get(`/api/documents/${doc.slug}?revision=2`)).status).toBe(404);
    expect((await anon.get(`/api/documents/${doc.slug}?revision=1`)).status).toBe(200);
  });
});

describe('GET /api/documents/:id/editor', () => {
  it('gives the author the open revision with its content', async () => {
    const doc = await createSheet();
    const res = await author.get(`/api/documents/${doc.id}/editor`);
    expect(res.status).toBe(200);
    expect(res.body.document).toMatchObject({
      id: doc.id,
      slug: doc.slug,
      kind: 'connector',
      published: null,
    });
    expect(res.body.revision).toMatchObject({
      id: doc.revision.id,
      status: 'draft',
      version: 1,
      content: { housing: 'socket' },
    });
  });

  it('gives the published revision when none is open', async () => {
    const doc = await createSheet();
    const published = await publish(doc.id);
    const res = await author.get(`/api/documents/${doc.id}/editor`);
    expect(res.body.revision).toMatchObject({ id: published.id, status: 'published' });
    expect(res.body.document.published).toMatchObject({ id: published.id, number: 1 });
  });

  it('answers 404 to another member for a draft and 403 once it is public; 401 signed out', async () => {
    const doc = await createSheet();
    expect((await other.get(`/api/documents/${doc.id}/editor`)).status).toBe(404);
    expect((await moderator.get(`/api/documents/${doc.id}/editor`)).status).toBe(404);
    expect((await anon.get(`/api/documents/${doc.id}/editor`)).status).toBe(401);
    expect((await author.get(`/api/documents/999999/editor`)).status).toBe(404);
    expect((await author.get(`/api/documents/abc/editor`)).status).toBe(404);
    await publish(doc.id);
    expect((await other.get(`/api/documents/${doc.id}/editor`)).status).toBe(403);
  });
});

describe('PUT /api/documents/:id/draft', () => {
  it('saves and answers the new version', async () => {
    const doc = await createSheet();
    const res = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Renamed',
      content: sensor({ sealed: false }),
      version: 1,
    });
    expect(res.status).toBe(200);
    expect(res.body.revision).toMatchObject({
      id: doc.revision.id,
      version: 2,
      title: 'Renamed',
      content: { sealed: false },
    });
    const again = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Renamed again',
      content: sensor(),
      version: 2,
    });
    expect(again.body.revision.version).toBe(3);
  });

  it('answers 409 VERSION_CONFLICT with the stored revision for a stale version, and overwrites nothing', async () => {
    const doc = await createSheet();
    const first = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Tab one',
      content: sensor({ component: 'tab one' }),
      version: 1,
    });
    expect(first.status).toBe(200);
    const stale = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Tab two',
      content: sensor({ component: 'tab two' }),
      version: 1,
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('VERSION_CONFLICT');
    expect(stale.body.error.message).toMatch(/Nothing was overwritten/);
    expect(stale.body.error.details.current).toMatchObject({
      version: 2,
      title: 'Tab one',
      content: { component: 'tab one' },
    });
    const editor = await author.get(`/api/documents/${doc.id}/editor`);
    expect(editor.body.revision).toMatchObject({
      version: 2,
      title: 'Tab one',
      content: { component: 'tab one' },
    });
  });

  it('of 200 concurrent saves from the same version exactly one wins; the others get 409 with the current revision', async () => {
    const doc = await createSheet();
    const saves = await Promise.all(
      Array.from({ length: 200 }, (_, i) =>
        author.put(`/api/documents/${doc.id}/draft`, {
          title: `Save ${i}`,
          content: sensor({
            component: `writer ${i}`,
            tags: [`t${i}`],
            notes: `note ${i}`.repeat(20),
          }),
          version: 1,
        }),
      ),
    );
    const statuses = saves.map((s) => s.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(199);
    const winner = saves.find((s) => s.status === 200)!;
    const i = Number(winner.body.revision.title.replace('Save ', ''));
    for (const s of saves.filter((x) => x.status === 409)) {
      expect(s.body.error.code).toBe('VERSION_CONFLICT');
      expect(s.body.error.details.current.version).toBe(2);
    }
    const stored = (await author.get(`/api/documents/${doc.id}/editor`)).body.revision;
    expect(stored.version).toBe(2);
    expect(stored.title).toBe(`Save ${i}`);
    expect(stored.content).toEqual(
      sensor({ component: `writer ${i}`, tags: [`t${i}`], notes: `note ${i}`.repeat(20) }),
    );
  });

  it('starts a new draft from the published revision; a stale version from there is a conflict too', async () => {
    const doc = await createSheet();
    await publish(doc.id);
    const saves = await Promise.all(
      [0, 1, 2, 3, 4].map((i) =>
        author.put(`/api/documents/${doc.id}/draft`, {
          title: `Next ${i}`,
          content: sensor({ component: `n${i}` }),
          version: 1,
        }),
      ),
    );
    expect(saves.filter((s) => s.status === 200)).toHaveLength(1);
    expect(saves.filter((s) => s.status === 409)).toHaveLength(4);
    const revisions = await author.get(`/api/documents/${doc.id}/revisions`);
    expect(
      revisions.body.map((r: { number: number; status: string }) => [r.number, r.status]),
    ).toEqual([
      [2, 'draft'],
      [1, 'published'],
    ]);
  });

  it('answers 409 NOT_EDITABLE while submitted, and saves again after a withdrawal', async () => {
    const doc = await createSheet();
    await author.post(`/api/documents/${doc.id}/submit`);
    const res = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'x',
      content: sensor(),
      version: 1,
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('NOT_EDITABLE');
    expect(res.body.error.details.current.status).toBe('submitted');
    expect((await author.post(`/api/documents/${doc.id}/withdraw`)).status).toBe(200);
    expect(
      (
        await author.put(`/api/documents/${doc.id}/draft`, {
          title: 'x',
          content: sensor(),
          version: 1,
        })
      ).status,
    ).toBe(200);
  });

  it('answers 400 for a body that does not fit, naming the field, and changes nothing', async () => {
    const doc = await createSheet();
    const res = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'x',
      content: sensor({ pins: [{ cavity: 'A', role: 5 as unknown as string }] }),
      version: 1,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('content.pins.0.role');
    const noVersion = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'x',
      content: sensor(),
    });
    expect(noVersion.status).toBe(400);
    expect(noVersion.body.error.message).toContain('version');
    expect((await author.get(`/api/documents/${doc.id}/editor`)).body.revision.version).toBe(1);
  });

  it('refuses other members (404 for a draft), signed-out (401) and unverified (403) callers', async () => {
    const doc = await createSheet();
    const body = { title: 'hijack', content: sensor(), version: 1 };
    expect((await other.put(`/api/documents/${doc.id}/draft`, body)).status).toBe(404);
    expect((await moderator.put(`/api/documents/${doc.id}/draft`, body)).status).toBe(404);
    expect((await anon.put(`/api/documents/${doc.id}/draft`, body)).status).toBe(401);
    expect((await unverified.put(`/api/documents/${doc.id}/draft`, body)).status).toBe(403);
    expect((await author.get(`/api/documents/${doc.id}/editor`)).body.revision.title).toBe(
      'Coolant sensor plug',
    );
  });
});

describe('POST /api/documents/:id/submit and /withdraw', () => {
  it('submits the draft, then withdraws it back to draft', async () => {
    const doc = await createSheet();
    const sub = await author.post(`/api/documents/${doc.id}/submit`);
    expect(sub.status).toBe(200);
    expect(sub.body.revision).toMatchObject({
      id: doc.revision.id,
      status: 'submitted',
      submittedAt: expect.any(String),
    });
    const again = await author.post(`/api/documents/${doc.id}/submit`);
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('ALREADY_SUBMITTED');
    const w = await author.post(`/api/documents/${doc.id}/withdraw`);
    expect(w.status).toBe(200);
    expect(w.body.revision).toMatchObject({ status: 'draft', submittedAt: null });
    const w2 = await author.post(`/api/documents/${doc.id}/withdraw`);
    expect(w2.status).toBe(409);
  });

  it('refuses a draft with no title (422) and other people (404)', async () => {
    const doc = await createSheet();
    await author.put(`/api/documents/${doc.id}/draft`, {
      title: '',
      content: sensor(),
      version: 1,
    });
    const res = await author.post(`/api/documents/${doc.id}/submit`);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('TITLE_MISSING');
    expect((await other.post(`/api/documents/${doc.id}/submit`)).status).toBe(404);
    expect((await moderator.post(`/api/documents/${doc.id}/withdraw`)).status).toBe(404);
  });

  it('refuses an adapter whose pin-to-pin check has errors with 422 CHECK_FAILED and the report', async () => {
    const res = await author.post('/api/documents', {
      kind: 'adapter',
      title: 'Broken adapter',
      content: {
        ends: {
          A: { label: 'pump plug', cavityCount: 4 },
          B: { label: 'body plug', cavityCount: 4 },
        },
        circuits: [{ a: ['1'], b: [] }],
      },
    });
    expect(res.status).toBe(201);
    const sub = await author.post(`/api/documents/${res.body.id}/submit`);
    expect(sub.status).toBe(422);
    expect(sub.body.error.code).toBe('CHECK_FAILED');
    expect(sub.body.error.details.report.ok).toBe(false);
    expect(sub.body.error.details.report.errors.map((e: { code: string }) => e.code)).toContain(
      'OPEN_END',
    );
    const rev = await author.get(`/api/documents/${res.body.id}/editor`);
    expect(rev.body.revision.status).toBe('draft');
  });

  it('accepts an adapter that checks clean', async () => {
    const res = await author.post('/api/documents', {
      kind: 'adapter',
      title: 'Clean adapter',
      content: {
        ends: {
          A: { label: 'pump plug', cavityCount: 2 },
          B: { label: 'body plug', cavityCount: 2 },
        },
        circuits: [
          { a: ['1'], b: ['1'], size: '18 AWG', color: 'RD' },
          { a: ['2'], b: ['2'], size: '18 AWG', color: 'BK' },
        ],
      },
    });
    expect((await author.post(`/api/documents/${res.body.id}/submit`)).status).toBe(200);
  });
});

describe('POST /api/documents/:id/submit {version}', () => {
  it('submits when the version is the one last saved', async () => {
    const doc = await createSheet();
    const saved = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Saved here',
      content: sensor(),
      version: 1,
    });
    expect(saved.body.revision.version).toBe(2);
    const sub = await author.post(`/api/documents/${doc.id}/submit`, { version: 2 });
    expect(sub.status, JSON.stringify(sub.body)).toBe(200);
    expect(sub.body.revision).toMatchObject({
      status: 'submitted',
      version: 2,
      title: 'Saved here',
    });
  });

  it('answers 409 VERSION_CONFLICT with the stored revision when another tab saved since, and submits nothing', async () => {
    const doc = await createSheet();
    // This tab's last save made version 2; another tab then saved version 3.
    await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'This tab',
      content: sensor({ component: 'this tab' }),
      version: 1,
    });
    const elsewhere = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Other tab',
      content: sensor({ component: 'other tab' }),
      version: 2,
    });
    expect(elsewhere.body.revision.version).toBe(3);
    const sub = await author.post(`/api/documents/${doc.id}/submit`, { version: 2 });
    expect(sub.status).toBe(409);
    expect(sub.body.error.code).toBe('VERSION_CONFLICT');
    expect(sub.body.error.message).toMatch(/Nothing was overwritten/);
    expect(sub.body.error.details.current).toMatchObject({
      id: doc.revision.id,
      documentId: doc.id,
      status: 'draft',
      version: 3,
      title: 'Other tab',
      content: { component: 'other tab' },
    });
    const editor = await author.get(`/api/documents/${doc.id}/editor`);
    expect(editor.body.revision).toMatchObject({ status: 'draft', version: 3, submittedAt: null });
    const queue = await moderator.get('/api/review/queue');
    expect(queue.body.map((i: { documentId: number }) => i.documentId)).not.toContain(doc.id);
    // Having seen the stored version, the editor submits it.
    const ok = await author.post(`/api/documents/${doc.id}/submit`, { version: 3 });
    expect(ok.status).toBe(200);
    expect(ok.body.revision).toMatchObject({ status: 'submitted', version: 3 });
  });

  it('answers 409 VERSION_CONFLICT for a version from before a new draft was started', async () => {
    const doc = await createSheet();
    await publish(doc.id);
    const next = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Second revision',
      content: sensor(),
      version: 1,
    });
    expect(next.body.revision).toMatchObject({ number: 2, version: 2 });
    const sub = await author.post(`/api/documents/${doc.id}/submit`, { version: 1 });
    expect(sub.status).toBe(409);
    expect(sub.body.error.code).toBe('VERSION_CONFLICT');
    expect(sub.body.error.details.current).toMatchObject({ number: 2, version: 2 });
  });

  it('submits the stored revision when no version is sent (no body at all, or {})', async () => {
    const a = await createSheet();
    const bare = await author.agent
      .post(`/api/documents/${a.id}/submit`)
      .set('X-CSRF-Token', author.csrf);
    expect(bare.status, JSON.stringify(bare.body)).toBe(200);
    expect(bare.body.revision.status).toBe('submitted');
    const b = await createSheet();
    expect((await author.post(`/api/documents/${b.id}/submit`, {})).status).toBe(200);
  });

  it('answers 400 naming the field for a version that is not a whole number, or an unknown field', async () => {
    const doc = await createSheet();
    for (const body of [{ version: '1' }, { version: 1.5 }, { version: -1 }]) {
      const res = await author.post(`/api/documents/${doc.id}/submit`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('VALIDATION');
      expect(res.body.error.message).toMatch(/version/);
    }
    const extra = await author.post(`/api/documents/${doc.id}/submit`, { version: 1, force: true });
    expect(extra.status).toBe(400);
    expect(extra.body.error.message).toMatch(/force/);
    const editor = await author.get(`/api/documents/${doc.id}/editor`);
    expect(editor.body.revision.status).toBe('draft');
  });

  it('answers 409 ALREADY_SUBMITTED, not a version conflict, once the revision is in review', async () => {
    const doc = await createSheet();
    expect((await author.post(`/api/documents/${doc.id}/submit`, { version: 1 })).status).toBe(200);
    const again = await author.post(`/api/documents/${doc.id}/submit`, { version: 1 });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('ALREADY_SUBMITTED');
  });

  it('answers 404 to other members whatever the version', async () => {
    const doc = await createSheet();
    expect((await other.post(`/api/documents/${doc.id}/submit`, { version: 1 })).status).toBe(404);
  });
});

describe('GET /api/documents/:id/revisions', () => {
  it('lists revisions newest first for the author and moderators', async () => {
    const doc = await createSheet();
    await publish(doc.id);
    await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'v2',
      content: sensor(),
      version: 1,
    });
    for (const c of [author, moderator, admin]) {
      const res = await c.get(`/api/documents/${doc.id}/revisions`);
      expect(res.status).toBe(200);
      expect(res.body).toHaveLength(2);
      expect(res.body[0]).toMatchObject({
        number: 2,
        status: 'draft',
        title: 'v2',
        reviewer: null,
        version: 2,
      });
      expect(res.body[1]).toMatchObject({
        number: 1,
        status: 'published',
        reviewer: { id: expect.any(Number) },
      });
      expect(Object.keys(res.body[1])).toEqual(
        expect.arrayContaining([
          'id',
          'number',
          'status',
          'title',
          'note',
          'reviewer',
          'submittedAt',
          'decidedAt',
          'version',
        ]),
      );
    }
  });

  it('answers 404 to other members for an unpublished document, 403 for a published one, 401 signed out', async () => {
    const doc = await createSheet();
    expect((await other.get(`/api/documents/${doc.id}/revisions`)).status).toBe(404);
    expect((await anon.get(`/api/documents/${doc.id}/revisions`)).status).toBe(401);
    await publish(doc.id);
    expect((await other.get(`/api/documents/${doc.id}/revisions`)).status).toBe(403);
  });
});

describe('GET /api/me/documents', () => {
  it('lists the member’s own documents with the newest revision’s status and note', async () => {
    const { client: me } = await clientAs(env, 'member');
    const a = await createSheet(me, 'Mine one');
    const b = await createSheet(me, 'Mine two');
    await me.post(`/api/documents/${b.id}/submit`);
    const rev = (await me.get(`/api/documents/${b.id}/editor`)).body.revision;
    await moderator.post(`/api/review/${rev.id}/return`, {
      note: 'Say which side the drawing is viewed from.',
    });
    const res = await me.get('/api/me/documents');
    expect(res.status).toBe(200);
    expect(res.body).toHaveLength(2);
    const byId = Object.fromEntries(res.body.map((d: { id: number }) => [d.id, d]));
    expect(byId[a.id]).toMatchObject({
      slug: a.slug,
      kind: 'connector',
      title: 'Mine one',
      published: false,
      latest: { number: 1, status: 'draft', note: null },
    });
    expect(byId[b.id]).toMatchObject({
      published: false,
      latest: {
        status: 'returned',
        note: 'Say which side the drawing is viewed from.',
        updatedAt: expect.any(String),
      },
    });
  });

  it('answers [] for an unverified account and 401 signed out', async () => {
    expect((await unverified.get('/api/me/documents')).body).toEqual([]);
    expect((await anon.get('/api/me/documents')).status).toBe(401);
  });
});
