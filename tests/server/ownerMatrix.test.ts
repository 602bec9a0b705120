import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';
import { jpeg } from '../helpers/images';
import { threeWaySensor } from '../helpers/fixtures';

/**
 * The owner matrix: every route that touches one record, tried as the record's owner, as
 * another member, as a moderator, as an admin and signed out, against the product's role
 * table (read published: everyone; own drafts, replies and uploads: their owner; review,
 * hiding and flags: moderators and admins, never on their own writing; roles: admins).
 *
 * Each actor gets a fresh record, so a success cannot hide a refusal that follows it, and
 * every refused attempt must leave the stored records exactly as they were.
 */

type Actor = 'owner' | 'other' | 'moderator' | 'admin' | 'anonymous';
const ACTORS: Actor[] = ['owner', 'other', 'moderator', 'admin', 'anonymous'];
type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** What a case needs to know of its record. */
interface Fixture {
  docId?: number;
  slug?: string;
  revisionId?: number;
  version?: number;
  replyId?: number;
  uploadId?: string;
  flagId?: number;
  userId?: number;
}

interface Case {
  name: string;
  method: Method;
  path: (f: Fixture) => string;
  body?: (f: Fixture) => object;
  /** Builds a fresh record; `actor` is who will try the route (some need a claim first). */
  setup: (actor: Actor) => Promise<Fixture>;
  expect: Record<Actor, number>;
}

let env: TestEnv;
const as = {} as Record<Actor, Client>;
let ownerId = 0;
/** A third member who writes the things the owner reacts to (replies to answer, flags). */
let bystander: Client;
/** A second moderator who publishes the owner's sheets, so the acting moderator stays free. */
let publisher: Client;

beforeAll(async () => {
  env = await createTestEnv();
  publisher = (await clientAs(env, 'moderator')).client;
});
afterAll(() => env.close());

/**
 * New accounts for every case: replies are rate-limited per member, and the role case
 * ends the owner's session, so no case may lean on what an earlier one left behind.
 */
beforeEach(async () => {
  const owner = await clientAs(env, 'member');
  as.owner = owner.client;
  ownerId = owner.user!.id;
  as.other = (await clientAs(env, 'member')).client;
  as.moderator = (await clientAs(env, 'moderator')).client;
  as.admin = (await clientAs(env, 'admin')).client;
  as.anonymous = (await clientAs(env, 'anonymous')).client;
  bystander = (await clientAs(env, 'member')).client;
});

const connector = () => threeWaySensor({ component: 'invented level sensor' });

const adapter = () => ({
  systemVoltage: 12,
  ends: { A: { label: 'Old plug', cavityCount: 2 }, B: { label: 'New plug', cavityCount: 2 } },
  circuits: [
    { a: ['1'], b: ['2'], role: 'signal', size: '0.5 mm²', color: 'GN', lengthMm: 200 },
    { a: ['2'], b: ['1'], role: 'ground', size: '0.5 mm²', color: 'BK', lengthMm: 200 },
  ],
});

const writeup = () => ({
  body: 'Moved the sensor 40 mm forward and lengthened its three wires.\n',
});

const CONTENT = { connector, adapter, writeup } as const;
type Kind = keyof typeof CONTENT;

let serial = 0;

/** The fields of the answers this file reads. */
interface Answer {
  id: number;
  slug: string;
  revision: { id: number; version: number; title: string };
  unread: number;
  items: { id: number }[];
  flag?: { id: number };
}

async function ok(res: { status: number; body: unknown }, status = 200) {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return res.body as Answer;
}

/** A new draft by `by` that nobody has seen. */
async function draft(kind: Kind = 'connector', by: Client = as.owner): Promise<Fixture> {
  serial++;
  const body = await ok(
    await by.post('/api/documents', {
      kind,
      title: `Owner matrix ${kind} ${serial}`,
      content: CONTENT[kind](),
    }),
    201,
  );
  return {
    docId: body.id,
    slug: body.slug,
    revisionId: body.revision.id,
    version: body.revision.version,
  };
}

/** A draft by `by`, submitted and waiting in the queue. */
async function submitted(kind: Kind = 'connector', by: Client = as.owner): Promise<Fixture> {
  const f = await draft(kind, by);
  await ok(await by.post(`/api/documents/${f.docId}/submit`));
  return f;
}

/** A published document by `by`. */
async function published(kind: Kind = 'connector', by: Client = as.owner): Promise<Fixture> {
  const f = await submitted(kind, by);
  await ok(await publisher.post(`/api/review/${f.revisionId}/publish`, {}));
  return f;
}

/** A published document by the owner with a second, unsubmitted revision open. */
async function publishedWithDraft(kind: Kind = 'connector'): Promise<Fixture> {
  const f = await published(kind);
  const editor = await ok(await as.owner.get(`/api/documents/${f.docId}/editor`));
  const saved = await ok(
    await as.owner.put(`/api/documents/${f.docId}/draft`, {
      title: `${editor.revision.title} (rev 2)`,
      content: CONTENT[kind](),
      version: editor.revision.version,
    }),
  );
  return { ...f, revisionId: saved.revision.id, version: saved.revision.version };
}

/** A reply by the owner under someone else's published sheet. */
async function ownReply(): Promise<Fixture> {
  const doc = await published('connector', bystander);
  const r = await ok(
    await as.owner.post(`/api/documents/${doc.docId}/replies`, {
      body: 'Cavity B reads 4.9 V here.',
    }),
    201,
  );
  return { ...doc, replyId: r.id };
}

/** Someone else's reply under the owner's published sheet (the owner may mark it the answer). */
async function replyOnOwnSheet(): Promise<Fixture> {
  const doc = await published();
  const r = await ok(
    await bystander.post(`/api/documents/${doc.docId}/replies`, { body: 'Same plug on mine.' }),
    201,
  );
  return { ...doc, replyId: r.id };
}

async function upload(by: Client = as.owner): Promise<Fixture> {
  serial++;
  const res = await by.agent
    .post('/api/uploads')
    .set('X-CSRF-Token', by.csrf)
    .attach('file', await jpeg(64, 48, serial), `bench-${serial}.jpg`);
  const body = await ok(res, 201);
  return { uploadId: String(body.id) };
}

/** An upload shown in a write-up the owner has published. */
async function publishedUpload(): Promise<Fixture> {
  const u = await upload();
  serial++;
  const doc = await ok(
    await as.owner.post('/api/documents', {
      kind: 'writeup',
      title: `Owner matrix pictures ${serial}`,
      content: {
        body: '![The new bracket](image:1)\n',
        images: [{ uploadId: u.uploadId, caption: 'The new bracket', annotations: [] }],
      },
    }),
    201,
  );
  await ok(await as.owner.post(`/api/documents/${doc.id}/submit`));
  await ok(await publisher.post(`/api/review/${doc.revision.id}/publish`, {}));
  return { ...u, docId: doc.id };
}

/** A flag a bystander raised on the owner's reply. */
async function flagOnOwnReply(): Promise<Fixture> {
  const r = await ownReply();
  const flag = await ok(
    await bystander.post('/api/flags', {
      targetType: 'reply',
      targetId: r.replyId,
      reason: 'wrong-pinout',
    }),
    201,
  );
  return { ...r, flagId: flag.id ?? flag.flag?.id };
}

/** Claims the revision for moderators and admins, who must hold it to release it. */
async function claimedFor(actor: Actor): Promise<Fixture> {
  const f = await submitted();
  if (actor === 'moderator' || actor === 'admin')
    await ok(await as[actor].post(`/api/review/${f.revisionId}/claim`));
  return f;
}

const doc = (f: Fixture) => `/api/documents/${f.docId}`;
const M = (owner: number, other: number, moderator: number, admin: number, anonymous: number) => ({
  owner,
  other,
  moderator,
  admin,
  anonymous,
});

const CASES: Case[] = [];

// Drafts nobody has published: to anyone but the author they do not exist (404), so a
// guessed id reveals nothing. Moderators read revisions (for history and review) but never
// edit, submit or withdraw them.
for (const kind of Object.keys(CONTENT) as Kind[]) {
  const setup = () => draft(kind);
  CASES.push(
    {
      name: `unpublished ${kind}: read`,
      method: 'get',
      path: doc,
      setup,
      expect: M(404, 404, 404, 404, 404),
    },
    {
      name: `unpublished ${kind}: read revision 1`,
      method: 'get',
      path: (f) => `${doc(f)}?revision=1`,
      setup,
      expect: M(200, 404, 200, 200, 404),
    },
    {
      name: `unpublished ${kind}: open the editor`,
      method: 'get',
      path: (f) => `${doc(f)}/editor`,
      setup,
      expect: M(200, 404, 404, 404, 401),
    },
    {
      name: `unpublished ${kind}: save the draft`,
      method: 'put',
      path: (f) => `${doc(f)}/draft`,
      body: (f) => ({ title: 'Taken over', content: CONTENT[kind](), version: f.version }),
      setup,
      expect: M(200, 404, 404, 404, 401),
    },
    {
      name: `unpublished ${kind}: submit`,
      method: 'post',
      path: (f) => `${doc(f)}/submit`,
      setup,
      expect: M(200, 404, 404, 404, 401),
    },
    {
      name: `unpublished ${kind}: list revisions`,
      method: 'get',
      path: (f) => `${doc(f)}/revisions`,
      setup,
      expect: M(200, 404, 200, 200, 401),
    },
  );
}

CASES.push(
  {
    name: 'submitted sheet: withdraw',
    method: 'post',
    path: (f) => `${doc(f)}/withdraw`,
    setup: () => submitted(),
    expect: M(200, 404, 404, 404, 401),
  },
  {
    name: 'unpublished sheet: read its replies',
    method: 'get',
    path: (f) => `${doc(f)}/replies`,
    setup: () => draft(),
    expect: M(200, 404, 200, 200, 404),
  },
  {
    // A thread opens when the document is published: those who may see the draft are told
    // so (409), anyone else learns nothing (404).
    name: 'unpublished sheet: reply',
    method: 'post',
    path: (f) => `${doc(f)}/replies`,
    body: () => ({ body: 'A reply to a draft' }),
    setup: () => draft(),
    expect: M(409, 404, 409, 409, 401),
  },
  {
    // Following starts with publishing; the author follows their own thread without asking.
    name: 'unpublished sheet: read the subscription',
    method: 'get',
    path: (f) => `${doc(f)}/subscription`,
    setup: () => draft(),
    expect: M(404, 404, 404, 404, 401),
  },
  {
    name: 'unpublished sheet: follow it',
    method: 'put',
    path: (f) => `${doc(f)}/subscription`,
    body: () => ({ subscribed: true }),
    setup: () => draft(),
    expect: M(404, 404, 404, 404, 401),
  },

  // Review: moderators and admins, never the author; members are refused by role.
  {
    name: 'submitted sheet: open the review',
    method: 'get',
    path: (f) => `/api/review/${f.revisionId}`,
    setup: () => submitted(),
    expect: M(403, 403, 200, 200, 401),
  },
  {
    name: 'submitted sheet: claim',
    method: 'post',
    path: (f) => `/api/review/${f.revisionId}/claim`,
    setup: () => submitted(),
    expect: M(403, 403, 200, 200, 401),
  },
  {
    name: 'submitted sheet: release the claim',
    method: 'post',
    path: (f) => `/api/review/${f.revisionId}/release`,
    setup: claimedFor,
    expect: M(403, 403, 200, 200, 401),
  },
  ...(['publish', 'return', 'decline'] as const).map((decision): Case => ({
    name: `submitted sheet: ${decision}`,
    method: 'post',
    path: (f) => `/api/review/${f.revisionId}/${decision}`,
    body: () => ({ note: 'Cavity C is labelled twice on the drawing.' }),
    setup: () => submitted(),
    expect: M(403, 403, 200, 200, 401),
  })),

  // Published documents: everyone reads the published revision; only the author edits.
  {
    name: 'published sheet with a new draft: read',
    method: 'get',
    path: (f) => `/api/documents/${f.slug}`,
    setup: () => publishedWithDraft(),
    expect: M(200, 200, 200, 200, 200),
  },
  {
    name: 'published sheet with a new draft: read the published revision',
    method: 'get',
    path: (f) => `${doc(f)}?revision=1`,
    setup: () => publishedWithDraft(),
    expect: M(200, 200, 200, 200, 200),
  },
  {
    name: 'published sheet with a new draft: read the draft revision',
    method: 'get',
    path: (f) => `${doc(f)}?revision=2`,
    setup: () => publishedWithDraft(),
    expect: M(200, 404, 200, 200, 404),
  },
  {
    name: 'published sheet: open the editor',
    method: 'get',
    path: (f) => `${doc(f)}/editor`,
    setup: () => publishedWithDraft(),
    expect: M(200, 403, 403, 403, 401),
  },
  {
    name: 'published sheet: save a draft',
    method: 'put',
    path: (f) => `${doc(f)}/draft`,
    body: (f) => ({ title: 'Taken over', content: connector(), version: f.version }),
    setup: () => publishedWithDraft(),
    expect: M(200, 403, 403, 403, 401),
  },
  {
    name: 'published adapter: save a draft',
    method: 'put',
    path: (f) => `${doc(f)}/draft`,
    body: (f) => ({ title: 'Taken over', content: adapter(), version: f.version }),
    setup: () => publishedWithDraft('adapter'),
    expect: M(200, 403, 403, 403, 401),
  },
  {
    name: 'published write-up: save a draft',
    method: 'put',
    path: (f) => `${doc(f)}/draft`,
    body: (f) => ({ title: 'Taken over', content: writeup(), version: f.version }),
    setup: () => publishedWithDraft('writeup'),
    expect: M(200, 403, 403, 403, 401),
  },
  {
    name: 'published sheet: submit the new draft',
    method: 'post',
    path: (f) => `${doc(f)}/submit`,
    setup: () => publishedWithDraft(),
    expect: M(200, 403, 403, 403, 401),
  },
  {
    name: 'published sheet: list revisions',
    method: 'get',
    path: (f) => `${doc(f)}/revisions`,
    setup: () => publishedWithDraft(),
    expect: M(200, 403, 200, 200, 401),
  },
  {
    name: 'published sheet: read its replies',
    method: 'get',
    path: (f) => `${doc(f)}/replies`,
    setup: () => published(),
    expect: M(200, 200, 200, 200, 200),
  },
  {
    name: 'published sheet: reply',
    method: 'post',
    path: (f) => `${doc(f)}/replies`,
    body: () => ({ body: 'Mine has a grey seal, not green.' }),
    setup: () => published(),
    expect: M(201, 201, 201, 201, 401),
  },
  {
    name: 'published sheet: follow it',
    method: 'put',
    path: (f) => `${doc(f)}/subscription`,
    body: () => ({ subscribed: true }),
    setup: () => published(),
    expect: M(200, 200, 200, 200, 401),
  },

  // Replies: the writer edits and deletes; moderators hide; the sheet's author marks answers.
  {
    name: 'own reply: edit',
    method: 'patch',
    path: (f) => `/api/replies/${f.replyId}`,
    body: () => ({ body: 'Rewritten by whoever got in' }),
    setup: ownReply,
    expect: M(200, 403, 403, 403, 401),
  },
  {
    name: 'own reply: delete',
    method: 'delete',
    path: (f) => `/api/replies/${f.replyId}`,
    setup: ownReply,
    expect: M(200, 403, 403, 403, 401),
  },
  {
    name: 'own reply: hide',
    method: 'post',
    path: (f) => `/api/replies/${f.replyId}/hide`,
    body: () => ({ reason: 'Off topic for this sheet.' }),
    setup: ownReply,
    expect: M(403, 403, 200, 200, 401),
  },
  {
    name: 'hidden reply: unhide',
    method: 'post',
    path: (f) => `/api/replies/${f.replyId}/unhide`,
    setup: async () => {
      const f = await ownReply();
      await ok(
        await publisher.post(`/api/replies/${f.replyId}/hide`, {
          reason: 'Checking a claim in it.',
        }),
      );
      return f;
    },
    expect: M(403, 403, 200, 200, 401),
  },
  {
    name: "a reply on the owner's sheet: mark it the answer",
    method: 'post',
    path: (f) => `/api/replies/${f.replyId}/answer`,
    setup: replyOnOwnSheet,
    expect: M(200, 403, 403, 403, 401),
  },
  {
    name: "the answer on the owner's sheet: unmark it",
    method: 'delete',
    path: (f) => `/api/replies/${f.replyId}/answer`,
    setup: async () => {
      const f = await replyOnOwnSheet();
      await ok(await as.owner.post(`/api/replies/${f.replyId}/answer`));
      return f;
    },
    expect: M(200, 403, 403, 403, 401),
  },

  // Uploads: private to the uploader (and moderators, who review them) until published.
  {
    name: 'unattached upload: view',
    method: 'get',
    path: (f) => `/api/uploads/${f.uploadId}`,
    setup: () => upload(),
    expect: M(200, 404, 200, 200, 404),
  },
  {
    name: 'unattached upload: thumbnail',
    method: 'get',
    path: (f) => `/api/uploads/${f.uploadId}/thumb`,
    setup: () => upload(),
    expect: M(200, 404, 200, 200, 404),
  },
  {
    name: 'unattached upload: download with markings',
    method: 'post',
    path: (f) => `/api/uploads/${f.uploadId}/flatten`,
    body: () => ({ annotations: [{ id: 'm1', type: 'marker', x: 0.5, y: 0.5, color: 'copper' }] }),
    setup: () => upload(),
    expect: M(200, 404, 200, 200, 404),
  },
  {
    name: 'upload in a published write-up: view',
    method: 'get',
    path: (f) => `/api/uploads/${f.uploadId}`,
    setup: publishedUpload,
    expect: M(200, 200, 200, 200, 200),
  },

  // Flags: moderators resolve them, never on their own writing.
  {
    name: "a flag on the owner's reply: resolve",
    method: 'post',
    path: (f) => `/api/flags/${f.flagId}/resolve`,
    body: () => ({ action: 'dismiss', note: 'Reads correctly to me.' }),
    setup: flagOnOwnReply,
    expect: M(403, 403, 200, 200, 401),
  },

  // The account itself: roles are for admins only, and nobody raises their own.
  {
    name: "the owner's account: change its role",
    method: 'patch',
    path: () => `/api/admin/users/${ownerId}`,
    body: () => ({ role: 'member' }),
    setup: async () => ({ userId: ownerId }),
    expect: M(403, 403, 403, 200, 401),
  },
);

/** The stored records a refused request must not touch. */
async function snapshot() {
  const q = (sql: string) => env.ctx.sequelize.query(sql, { type: QueryTypes.SELECT });
  return {
    documents: await q('SELECT * FROM documents ORDER BY id'),
    revisions: await q('SELECT * FROM revisions ORDER BY id'),
    replies: await q('SELECT * FROM replies ORDER BY id'),
    uploads: await q('SELECT * FROM uploads ORDER BY id'),
    flags: await q('SELECT * FROM flags ORDER BY id'),
    subscriptions: await q('SELECT * FROM thread_subscriptions ORDER BY id'),
    users: await q('SELECT id, role, email, display_name FROM users ORDER BY id'),
  };
}

function send(c: Client, method: Method, url: string, body?: object) {
  switch (method) {
    case 'get':
      return c.get(url);
    case 'delete':
      return c.delete(url);
    default:
      return c[method](url, body ?? {});
  }
}

describe('the owner matrix', () => {
  for (const k of CASES) {
    it(`${k.name}: ${ACTORS.map((a) => `${a} ${k.expect[a]}`).join(', ')}`, async () => {
      const got = {} as Record<Actor, number>;
      for (const actor of ACTORS) {
        const f = await k.setup(actor);
        const before = await snapshot();
        const res = await send(as[actor], k.method, k.path(f), k.body?.(f));
        got[actor] = res.status;
        if (res.status >= 400) {
          expect(res.body.error?.message, `${actor}: ${k.name} gets a sentence`).toMatch(/\w+ \w+/);
          expect(await snapshot(), `${actor}'s refused ${k.name} changed nothing`).toEqual(before);
        }
      }
      expect(got).toEqual(k.expect);
    });
  }

  it("lists only the signed-in member's own documents under /api/me/documents", async () => {
    const mine = await draft();
    const theirs = await ok(await as.other.get('/api/me/documents'));
    expect((theirs as unknown as { id: number }[]).map((d) => d.id)).not.toContain(mine.docId);
    const own = await ok(await as.owner.get('/api/me/documents'));
    expect((own as unknown as { id: number }[]).map((d) => d.id)).toContain(mine.docId);
  });

  it("never marks another member's notifications read", async () => {
    const f = await published();
    await ok(
      await bystander.post(`${doc(f)}/replies`, { body: 'A question for the author.' }),
      201,
    );
    const before = await ok(await as.owner.get('/api/notifications'));
    expect(before.unread).toBeGreaterThan(0);
    const ids = (before.items as { id: number }[]).map((n) => n.id);
    await ok(await as.other.post('/api/notifications/read', { ids }));
    const after = await ok(await as.owner.get('/api/notifications'));
    expect(after.unread).toBe(before.unread);
  });

  it('refuses a moderator the review and the flags of their own writing; an admin may decide it', async () => {
    const f = await submitted('connector', as.moderator);
    for (const decision of ['claim', 'publish', 'return', 'decline']) {
      const res = await as.moderator.post(`/api/review/${f.revisionId}/${decision}`, {
        note: 'Own work.',
      });
      expect(res.status, decision).toBe(403);
    }
    await ok(await as.admin.post(`/api/review/${f.revisionId}/publish`, {}));

    const r = await ok(
      await as.moderator.post(`${doc(f)}/replies`, { body: 'Cavity A is the 5 V feed.' }),
      201,
    );
    const flag = await ok(
      await bystander.post('/api/flags', {
        targetType: 'reply',
        targetId: r.id,
        reason: 'wrong-pinout',
      }),
      201,
    );
    const flagId = flag.id ?? flag.flag?.id;
    const own = await as.moderator.post(`/api/flags/${flagId}/resolve`, { action: 'dismiss' });
    expect(own.status).toBe(403);
    await ok(await publisher.post(`/api/flags/${flagId}/resolve`, { action: 'dismiss' }));
  });
});
