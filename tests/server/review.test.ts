import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';
import type { ConnectorContent } from '../../shared/schemas/connector';
import type { User } from '../../server/models';

let env: TestEnv;
let author: Client;
let authorUser: User;
let member: Client;
let moderator: Client;
let modUser: User;
let moderator2: Client;
let admin: Client;
let anon: Client;
let unverified: Client;

beforeAll(async () => {
  env = await createTestEnv();
  ({ client: author, user: authorUser } = (await clientAs(env, 'member')) as {
    client: Client;
    user: User;
  });
  member = (await clientAs(env, 'member')).client;
  ({ client: moderator, user: modUser } = (await clientAs(env, 'moderator')) as {
    client: Client;
    user: User;
  });
  moderator2 = (await clientAs(env, 'moderator')).client;
  admin = (await clientAs(env, 'admin')).client;
  anon = (await clientAs(env, 'anonymous')).client;
  unverified = (await clientAs(env, 'unverified')).client;
});
afterAll(() => env.close());

const pedal = (over: Partial<ConnectorContent> = {}): ConnectorContent => ({
  cavityCount: 6,
  layout: { rows: 2, cols: 3 },
  housing: 'socket',
  view: 'mating-face',
  sealed: false,
  component: 'pedal position sensor',
  pins: [
    { cavity: '1', role: '5 V reference', color: 'GY', size: '0.5 mm²' },
    { cavity: '2', role: 'signal', color: 'GN/YE', size: '0.5 mm²' },
    { cavity: '3', role: 'low reference', color: 'BK/WH', size: '0.5 mm²' },
    { cavity: '4', role: '5 V reference', color: 'GY/RD', size: '0.5 mm²' },
    { cavity: '5', role: 'signal', color: 'BU/WH', size: '0.5 mm²' },
    { cavity: '6', role: 'low reference', color: 'BN', size: '0.5 mm²' },
  ],
  ...over,
});

/** A submitted connector sheet by `by`; returns its ids. */
async function submitted(by: Client = author, title = 'Pedal sensor plug', content = pedal()) {
  const doc = await by.post('/api/documents', { kind: 'connector', title, content });
  expect(doc.status, JSON.stringify(doc.body)).toBe(201);
  const sub = await by.post(`/api/documents/${doc.body.id}/submit`);
  expect(sub.status, JSON.stringify(sub.body)).toBe(200);
  return {
    docId: doc.body.id as number,
    slug: doc.body.slug as string,
    revisionId: sub.body.revision.id as number,
  };
}

async function mailsTo(email: string) {
  await env.ctx.outbox.flush();
  return env.ctx.fakeSmtp!.list().filter((m) => m.to.includes(email));
}

async function auditFor(revisionId: number) {
  return env.ctx.models.AuditEntry.findAll({
    where: { targetType: 'revision', targetId: String(revisionId) },
  });
}

describe('GET /api/review/queue', () => {
  it('lists submissions oldest first with author and claim, per kind', async () => {
    const first = await submitted(author, 'Queue first');
    const second = await submitted(member, 'Queue second');
    const res = await moderator.get('/api/review/queue?kind=connector');
    expect(res.status).toBe(200);
    const ids = res.body.map((r: { revisionId: number }) => r.revisionId);
    expect(ids.indexOf(first.revisionId)).toBeLessThan(ids.indexOf(second.revisionId));
    const item = res.body.find((r: { revisionId: number }) => r.revisionId === first.revisionId);
    expect(item).toMatchObject({
      revisionId: first.revisionId,
      documentId: first.docId,
      kind: 'connector',
      title: 'Queue first',
      author: { id: authorUser.id, displayName: authorUser.displayName },
      submittedAt: expect.any(String),
      claimedBy: null,
    });
    expect(
      (await moderator.get('/api/review/queue?kind=writeup')).body.map(
        (r: { revisionId: number }) => r.revisionId,
      ),
    ).not.toContain(first.revisionId);
    expect((await moderator.get('/api/review/queue?kind=')).status).toBe(200);
    expect((await admin.get('/api/review/queue')).status).toBe(200);
  });

  it('leaves out drafts and decided revisions', async () => {
    const doc = await author.post('/api/documents', {
      kind: 'connector',
      title: 'Just a draft',
      content: pedal(),
    });
    const res = await moderator.get('/api/review/queue');
    expect(res.body.map((r: { documentId: number }) => r.documentId)).not.toContain(doc.body.id);
  });

  it('answers 400 for an unknown kind, 401 signed out, 403 for members', async () => {
    expect((await moderator.get('/api/review/queue?kind=poster')).status).toBe(400);
    expect((await anon.get('/api/review/queue')).status).toBe(401);
    expect((await member.get('/api/review/queue')).status).toBe(403);
    expect((await unverified.get('/api/review/queue')).status).toBe(403);
  });
});

describe('POST /api/review/:revisionId/claim and /release', () => {
  it('claims for one moderator; another gets 409 CLAIMED until it is released', async () => {
    const { revisionId } = await submitted();
    const c = await moderator.post(`/api/review/${revisionId}/claim`);
    expect(c.status).toBe(200);
    expect(c.body.revision.claimedBy).toMatchObject({ id: modUser.id });
    expect((await moderator.post(`/api/review/${revisionId}/claim`)).status).toBe(200);
    const other = await moderator2.post(`/api/review/${revisionId}/claim`);
    expect(other.status).toBe(409);
    expect(other.body.error.code).toBe('CLAIMED');
    expect(other.body.error.details.claimedBy.id).toBe(modUser.id);
    expect((await moderator2.post(`/api/review/${revisionId}/release`)).status).toBe(409);
    const queue = await moderator2.get('/api/review/queue');
    expect(
      queue.body.find((r: { revisionId: number }) => r.revisionId === revisionId).claimedBy.id,
    ).toBe(modUser.id);
    expect((await moderator.post(`/api/review/${revisionId}/release`)).status).toBe(200);
    expect((await moderator2.post(`/api/review/${revisionId}/claim`)).status).toBe(200);
  });

  it('lets exactly one of two racing moderators claim', async () => {
    const { revisionId } = await submitted();
    const [a, b] = await Promise.all([
      moderator.post(`/api/review/${revisionId}/claim`),
      moderator2.post(`/api/review/${revisionId}/claim`),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
  });

  it('refuses a moderator claiming their own submission (403)', async () => {
    const { revisionId } = await submitted(moderator, 'Moderator’s own sheet');
    const res = await moderator.post(`/api/review/${revisionId}/claim`);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/another moderator/i);
  });

  it('answers 404 for an unknown revision, 409 for a draft, 403 for members', async () => {
    expect((await moderator.post('/api/review/999999/claim')).status).toBe(404);
    const doc = await author.post('/api/documents', {
      kind: 'connector',
      title: 'Draft only',
      content: pedal(),
    });
    const res = await moderator.post(`/api/review/${doc.body.revision.id}/claim`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('NOT_IN_REVIEW');
    expect((await member.post(`/api/review/${doc.body.revision.id}/claim`)).status).toBe(403);
  });
});

describe('GET /api/review/:revisionId', () => {
  it('shows the revision, the last published one, the diff, findings and the checklist', async () => {
    const { docId, revisionId } = await submitted(author, 'Diffed sheet', pedal({ view: '' }));
    expect((await moderator.post(`/api/review/${revisionId}/publish`, {})).status).toBe(200);
    const next = pedal({
      view: 'wire-side',
      pins: [
        { cavity: '1', role: '5 V reference', color: 'GY', size: '0.5 mm²' },
        { cavity: '2', role: 'signal', color: 'GN/YE', size: '0.75 mm²' },
        { cavity: '3', role: 'low reference', color: 'BK/WH', size: '0.5 mm²' },
        { cavity: '5', role: 'signal', color: 'BU/WH', size: '0.5 mm²' },
        { cavity: '6', role: 'low reference', color: 'BN', size: '0.5 mm²' },
        { cavity: '4', role: 'fuel pump relay feed', color: 'XX', size: '0.5 mm²' },
      ],
      notes: 'Line one\nLine two',
    });
    const save = await author.put(`/api/documents/${docId}/draft`, {
      title: 'Diffed sheet',
      content: next,
      version: 1,
    });
    expect(save.status).toBe(200);
    const sub = await author.post(`/api/documents/${docId}/submit`);
    const res = await moderator2.get(`/api/review/${sub.body.revision.id}`);
    expect(res.status).toBe(200);
    expect(res.body.document).toMatchObject({
      id: docId,
      kind: 'connector',
      owner: { id: authorUser.id },
    });
    expect(res.body.revision).toMatchObject({
      number: 2,
      status: 'submitted',
      content: { view: 'wire-side' },
    });
    expect(res.body.previous).toMatchObject({ id: revisionId, number: 1, status: 'published' });
    const pins = res.body.diff.rows.pins as Array<{
      key: string;
      status: string;
      changed: string[];
    }>;
    expect(pins.find((p) => p.key === 'cavity:2')).toMatchObject({
      status: 'changed',
      changed: ['size'],
    });
    expect(pins.find((p) => p.key === 'cavity:4')).toMatchObject({ status: 'changed' });
    expect(pins.filter((p) => p.status === 'same').map((p) => p.key)).toEqual([
      'cavity:1',
      'cavity:3',
      'cavity:5',
      'cavity:6',
    ]);
    expect(res.body.diff.fields).toContainEqual({ field: 'view', before: '', after: 'wire-side' });
    expect(res.body.diff.text.notes).toMatchObject({ changed: true, added: 2, removed: 0 });
    expect(res.body.findings.warnings.map((w: { code: string }) => w.code)).toContain(
      'COLOR_UNKNOWN',
    );
    expect(res.body.findings.cautions).toEqual(['fuel']);
    const keys = res.body.checklist.map((c: { key: string }) => c.key);
    expect(keys).toEqual(['checks-clean', 'view-side', 'cautions', 'images-clean', 'original']);
    expect(res.body.checklist.find((c: { key: string }) => c.key === 'view-side').ok).toBe(true);
    expect(res.body.actions).toMatchObject({ canDecide: true, canClaim: true });
  });

  it('compares a first revision with nothing, and tells the author-moderator they cannot decide', async () => {
    const { revisionId } = await submitted(moderator, 'Own review view');
    const res = await moderator.get(`/api/review/${revisionId}`);
    expect(res.status).toBe(200);
    expect(res.body.previous).toBeNull();
    expect(res.body.diff.hasPrevious).toBe(false);
    expect(res.body.diff.rows.pins.every((p: { status: string }) => p.status === 'added')).toBe(
      true,
    );
    expect(res.body.actions.canDecide).toBe(false);
  });

  it('is for moderators only', async () => {
    const { revisionId } = await submitted();
    expect((await author.get(`/api/review/${revisionId}`)).status).toBe(403);
    expect((await anon.get(`/api/review/${revisionId}`)).status).toBe(401);
    expect((await moderator.get('/api/review/424242')).status).toBe(404);
  });
});

describe('POST /api/review/:revisionId/publish', () => {
  it('publishes, audits with the note, and e-mails the author a link to the page', async () => {
    const { docId, slug, revisionId } = await submitted(author, 'Publish me');
    const res = await moderator.post(`/api/review/${revisionId}/publish`, {
      note: 'Clear and complete, thanks.',
    });
    expect(res.status).toBe(200);
    expect(res.body.revision).toMatchObject({
      id: revisionId,
      status: 'published',
      publishedAt: expect.any(String),
      note: 'Clear and complete, thanks.',
    });
    expect(res.body.revision.reviewer).toMatchObject({ id: modUser.id });
    const doc = await env.ctx.models.Document.findByPk(docId);
    expect(doc!.publishedRevisionId).toBe(revisionId);
    const entries = await auditFor(revisionId);
    expect(entries.map((e) => e.action)).toEqual(['review.publish']);
    expect(entries[0].actorId).toBe(modUser.id);
    expect(entries[0].details).toMatchObject({
      documentId: docId,
      note: 'Clear and complete, thanks.',
    });
    const mail = (await mailsTo(authorUser.email)).find((m) => m.subject.includes('Publish me'));
    expect(mail).toBeDefined();
    expect(mail!.subject).toMatch(/^Published/);
    expect(mail!.text).toContain('Clear and complete, thanks.');
    expect(mail!.text).toContain(`${env.ctx.config.publicUrl}/documents/${slug}`);
    expect((await anon.get(`/api/documents/${slug}`)).status).toBe(200);
  });

  it('accepts no body at all', async () => {
    const { revisionId } = await submitted();
    const res = await moderator.agent
      .post(`/api/review/${revisionId}/publish`)
      .set('X-CSRF-Token', moderator.csrf);
    expect(res.status).toBe(200);
  });

  it('supersedes the previously published revision and moves the pointer in one transaction', async () => {
    const first = await submitted(author, 'Two versions');
    await moderator.post(`/api/review/${first.revisionId}/publish`, {});
    await author.put(`/api/documents/${first.docId}/draft`, {
      title: 'Two versions',
      content: pedal({ sealed: true }),
      version: 1,
    });
    const second = await author.post(`/api/documents/${first.docId}/submit`);
    const secondId = second.body.revision.id as number;
    expect((await anon.get(`/api/documents/${first.slug}`)).body.revision.id).toBe(
      first.revisionId,
    );

    // Make the pointer update fail after the revisions changed: nothing may stick.
    const { Document } = env.ctx.models;
    const original = Document.prototype.update;
    Document.prototype.update = async function () {
      throw new Error('simulated failure while moving the pointer');
    } as typeof original;
    try {
      const failed = await moderator.post(`/api/review/${secondId}/publish`, {});
      expect(failed.status, JSON.stringify(failed.body)).toBe(500);
    } finally {
      Document.prototype.update = original;
    }
    const { Revision } = env.ctx.models;
    expect((await Revision.findByPk(first.revisionId))!.status).toBe('published');
    expect((await Revision.findByPk(secondId))!.status).toBe('submitted');
    expect((await Document.findByPk(first.docId))!.publishedRevisionId).toBe(first.revisionId);
    expect(await auditFor(secondId)).toHaveLength(0);

    const ok = await moderator.post(`/api/review/${secondId}/publish`, {});
    expect(ok.status).toBe(200);
    expect((await Revision.findByPk(first.revisionId))!.status).toBe('superseded');
    expect((await Revision.findByPk(secondId))!.status).toBe('published');
    expect((await Document.findByPk(first.docId))!.publishedRevisionId).toBe(secondId);
    const page = await anon.get(`/api/documents/${first.slug}`);
    expect(page.body.revision.number).toBe(2);
    expect(page.body.content.sealed).toBe(true);
    expect(await Revision.count({ where: { documentId: first.docId, status: 'published' } })).toBe(
      1,
    );
  });

  it('refuses a moderator publishing their own submission (403), even an admin', async () => {
    const own = await submitted(moderator, 'Self approval');
    const res = await moderator.post(`/api/review/${own.revisionId}/publish`, {});
    expect(res.status).toBe(403);
    expect((await env.ctx.models.Revision.findByPk(own.revisionId))!.status).toBe('submitted');
    const adminOwn = await submitted(admin, 'Admin self approval');
    expect((await admin.post(`/api/review/${adminOwn.revisionId}/publish`, {})).status).toBe(403);
    for (const d of ['return', 'decline']) {
      expect(
        (await moderator.post(`/api/review/${own.revisionId}/${d}`, { note: 'x' })).status,
      ).toBe(403);
    }
    expect(await auditFor(own.revisionId)).toHaveLength(0);
  });

  it('answers 409 CLAIMED when another moderator holds the claim; deciding an unclaimed item claims it', async () => {
    const { revisionId } = await submitted();
    await moderator.post(`/api/review/${revisionId}/claim`);
    const res = await moderator2.post(`/api/review/${revisionId}/publish`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('CLAIMED');
    const two = await submitted();
    const [a, b] = await Promise.all([
      moderator.post(`/api/review/${two.revisionId}/publish`, {}),
      moderator2.post(`/api/review/${two.revisionId}/decline`, {
        note: 'Duplicate of another sheet.',
      }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect(await auditFor(two.revisionId)).toHaveLength(1);
  });

  it('answers 409 NOT_IN_REVIEW for a decided or withdrawn revision', async () => {
    const { docId, revisionId } = await submitted();
    await moderator.post(`/api/review/${revisionId}/publish`, {});
    const again = await moderator.post(`/api/review/${revisionId}/publish`, {});
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('NOT_IN_REVIEW');
    await author.put(`/api/documents/${docId}/draft`, { title: 'x', content: pedal(), version: 1 });
    const sub = await author.post(`/api/documents/${docId}/submit`);
    await author.post(`/api/documents/${docId}/withdraw`);
    const withdrawn = await moderator.post(`/api/review/${sub.body.revision.id}/publish`, {});
    expect(withdrawn.status).toBe(409);
    expect(withdrawn.body.error.message).toMatch(/withdrew/);
  });

  it('is refused to members, unverified accounts and signed-out readers', async () => {
    const { revisionId } = await submitted();
    expect((await member.post(`/api/review/${revisionId}/publish`, {})).status).toBe(403);
    expect((await unverified.post(`/api/review/${revisionId}/publish`, {})).status).toBe(403);
    expect((await anon.post(`/api/review/${revisionId}/publish`, {})).status).toBe(401);
    expect((await moderator.post(`/api/review/${revisionId}/publish`, { note: 5 })).status).toBe(
      400,
    );
    expect(
      (await moderator.post(`/api/review/${revisionId}/publish`, { note: 'ok', extra: 1 })).status,
    ).toBe(400);
  });
});

describe('POST /api/review/:revisionId/return', () => {
  it('returns with the note: audited, e-mailed, shown in my documents; the author edits and resubmits', async () => {
    const { docId, slug, revisionId } = await submitted(author, 'Return me');
    const note = 'Cavity 4 has no wire colour; add it and resubmit.';
    const res = await moderator.post(`/api/review/${revisionId}/return`, { note });
    expect(res.status).toBe(200);
    expect(res.body.revision).toMatchObject({
      status: 'returned',
      note,
      decidedAt: expect.any(String),
    });
    expect((await anon.get(`/api/documents/${slug}`)).status).toBe(404);
    const entries = await auditFor(revisionId);
    expect(entries.map((e) => e.action)).toEqual(['review.return']);
    expect(entries[0].details).toMatchObject({ note });
    const mail = (await mailsTo(authorUser.email)).find((m) => m.subject.includes('Return me'));
    expect(mail!.subject).toMatch(/^Returned/);
    expect(mail!.text).toContain(note);
    expect(mail!.text).toContain(`${env.ctx.config.publicUrl}/me/documents`);

    const mine = await author.get('/api/me/documents');
    expect(mine.body.find((d: { id: number }) => d.id === docId).latest).toMatchObject({
      status: 'returned',
      note,
    });
    const editor = await author.get(`/api/documents/${docId}/editor`);
    expect(editor.body.revision).toMatchObject({ id: revisionId, status: 'returned' });
    const save = await author.put(`/api/documents/${docId}/draft`, {
      title: 'Return me',
      content: pedal({ pins: pedal().pins!.map((p) => ({ ...p, color: p.color || 'VT' })) }),
      version: editor.body.revision.version,
    });
    expect(save.status).toBe(200);
    expect(save.body.revision.id).toBe(revisionId);
    const resub = await author.post(`/api/documents/${docId}/submit`);
    expect(resub.status).toBe(200);
    expect(resub.body.revision).toMatchObject({ id: revisionId, status: 'submitted' });
    expect((await moderator.post(`/api/review/${revisionId}/publish`, {})).status).toBe(200);
    expect((await anon.get(`/api/documents/${slug}`)).status).toBe(200);
  });

  it('needs a note (400)', async () => {
    const { revisionId } = await submitted();
    const res = await moderator.post(`/api/review/${revisionId}/return`, {});
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('note');
    expect((await moderator.post(`/api/review/${revisionId}/return`, { note: '   ' })).status).toBe(
      400,
    );
    expect((await env.ctx.models.Revision.findByPk(revisionId))!.status).toBe('submitted');
  });
});

describe('POST /api/review/:revisionId/decline', () => {
  it('declines with the note, audited and e-mailed; nothing is published', async () => {
    const { docId, revisionId } = await submitted(author, 'Decline me');
    expect((await moderator.post(`/api/review/${revisionId}/decline`, {})).status).toBe(400);
    const note = 'This duplicates the published pump module sheet.';
    const res = await moderator.post(`/api/review/${revisionId}/decline`, { note });
    expect(res.status).toBe(200);
    expect(res.body.revision).toMatchObject({ status: 'declined', note });
    expect((await env.ctx.models.Document.findByPk(docId))!.publishedRevisionId).toBeNull();
    expect((await auditFor(revisionId)).map((e) => e.action)).toEqual(['review.decline']);
    const mail = (await mailsTo(authorUser.email)).find((m) => m.subject.includes('Decline me'));
    expect(mail!.subject).toMatch(/^Declined/);
    expect(mail!.text).toContain(note);
    // The author can start over from the declined revision.
    const editor = await author.get(`/api/documents/${docId}/editor`);
    expect(editor.body.revision.status).toBe('declined');
    const save = await author.put(`/api/documents/${docId}/draft`, {
      title: 'Decline me, take two',
      content: pedal(),
      version: editor.body.revision.version,
    });
    expect(save.status).toBe(200);
    expect(save.body.revision).toMatchObject({ number: 2, status: 'draft' });
  });
});
