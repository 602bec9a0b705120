import net from 'node:net';
import path from 'node:path';
import request from 'supertest';
import { Sequelize, QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  clientAs,
  createTestEnv,
  makeUser,
  Client,
  TEST_PASSWORD,
  type TestEnv,
} from '../helpers/context';
import { startServer, type RunningServer } from '../helpers/server';
import type { ConnectorContent } from '../../shared/schemas/connector';
import type { User } from '../../server/models';
import type { CapturedMail } from '../../server/mail/fakeSmtp';
import { sendDigests } from '../../server/services/digest';
import { REPLY_LIMITS } from '../../server/services/replies';

let env: TestEnv;
let moderator: Client;
let admin: Client;
let anon: Client;

type Signed = { client: Client; user: User };

async function member(role: 'member' | 'moderator' | 'unverified' = 'member'): Promise<Signed> {
  return (await clientAs(env, role)) as Signed;
}

beforeAll(async () => {
  env = await createTestEnv();
  moderator = (await clientAs(env, 'moderator')).client;
  admin = (await clientAs(env, 'admin')).client;
  anon = (await clientAs(env, 'anonymous')).client;
});
afterAll(() => env.close());

const sheet = (): ConnectorContent => ({
  cavityCount: 3,
  layout: { rows: 1, cols: 3 },
  housing: 'socket',
  view: 'wire-side',
  sealed: true,
  component: 'coolant temperature sensor',
  pins: [
    { cavity: '1', role: 'signal', color: 'GN/YE', size: '0.5 mm²' },
    { cavity: '2', role: 'low reference', color: 'BN', size: '0.5 mm²' },
    { cavity: '3', role: 'unused' },
  ],
});

let sheetCount = 0;

/** A connector sheet by `by`, submitted and published by the moderator. */
async function publishedSheet(by: Client) {
  sheetCount++;
  const doc = await by.post('/api/documents', {
    kind: 'connector',
    title: `Invented sensor plug ${sheetCount}`,
    content: sheet(),
  });
  expect(doc.status, JSON.stringify(doc.body)).toBe(201);
  expect((await by.post(`/api/documents/${doc.body.id}/submit`)).status).toBe(200);
  const pub = await moderator.post(`/api/review/${doc.body.revision.id}/publish`, {});
  expect(pub.status, JSON.stringify(pub.body)).toBe(200);
  return { id: doc.body.id as number, slug: doc.body.slug as string };
}

async function reply(by: Client, docId: number, body: string, parentId?: number) {
  const res = await by.post(
    `/api/documents/${docId}/replies`,
    parentId ? { body, parentId } : { body },
  );
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: number; parentId: number | null; bodyHtml: string };
}

/** Delivers what is due and gives the fake a moment; then the mail to `address`. */
async function mailTo(address: string, kind?: RegExp): Promise<CapturedMail[]> {
  await env.ctx.outbox.flush();
  await new Promise((r) => setTimeout(r, 100));
  await env.ctx.outbox.flush();
  return env.ctx
    .fakeSmtp!.list()
    .filter((m) => m.to.includes(address) && (!kind || kind.test(m.subject)));
}

/** The List-Unsubscribe headers as the fake's parser keeps them (folded into "list"). */
function listHeaders(mail: CapturedMail): { url: string; post: string } {
  const list = JSON.parse(mail.headers.list ?? '{}');
  return { url: list.unsubscribe?.url ?? '', post: list['unsubscribe-post']?.name ?? '' };
}

function unsubscribePath(mail: CapturedMail) {
  const m = /\/unsubscribe\?token=([^\s"<>]+)/.exec(mail.text);
  expect(m, 'the e-mail has an unsubscribe link').toBeTruthy();
  return decodeURIComponent(m![1]);
}

describe('POST /api/documents/:id/replies', () => {
  it('e-mails every subscriber but the writer exactly once, with the reply, a link and List-Unsubscribe', async () => {
    const author = await member();
    const b = await member();
    const c = await member();
    const doc = await publishedSheet(author.client);

    const first = await reply(
      b.client,
      doc.id,
      'Which cavity is the **signal** on the later builds?',
    );
    expect(first.bodyHtml).toContain('<strong>signal</strong>');
    const toAuthor = await mailTo(author.user.email, /replied/);
    expect(toAuthor).toHaveLength(1);
    expect(await mailTo(b.user.email, /replied/)).toHaveLength(0);

    const second = await reply(
      c.client,
      doc.id,
      'Cavity 1, GN/YE. <script>alert(1)</script> [probe notes](javascript:alert(1))',
      first.id,
    );
    const a = await mailTo(author.user.email, /replied/);
    const bMail = await mailTo(b.user.email, /replied/);
    expect(a).toHaveLength(2);
    expect(bMail).toHaveLength(1);
    expect(await mailTo(c.user.email, /replied/)).toHaveLength(0);

    const mail = bMail[0];
    expect(mail.subject).toContain(c.user.displayName);
    expect(mail.text).toContain('answered your reply');
    expect(mail.text).toContain('Cavity 1, GN/YE.');
    expect(mail.text).toContain(
      `${env.ctx.config.publicUrl}/documents/${doc.slug}#reply-${second.id}`,
    );
    expect(mail.html).toContain('Cavity 1, GN/YE.');
    expect(mail.html).not.toMatch(/<script|href="javascript:/i);
    expect(mail.html).toContain('&lt;script&gt;');
    expect(listHeaders(mail).url).toContain(`${env.ctx.config.publicUrl}/api/unsubscribe?token=`);
    expect(listHeaders(mail).post).toBe('List-Unsubscribe=One-Click');

    // Exactly once: nothing more arrives, and the outbox holds one row per recipient and reply.
    await new Promise((r) => setTimeout(r, 300));
    expect(await mailTo(author.user.email, /replied/)).toHaveLength(2);
    const rows = await env.ctx.models.OutboxMessage.findAll({ where: { kind: 'reply' } });
    const mine = rows.filter((r) =>
      [author.user.email, b.user.email, c.user.email].includes(r.toAddress),
    );
    expect(mine).toHaveLength(3);
    expect(mine.every((r) => r.status === 'sent' && r.attempts === 1)).toBe(true);
  });

  it('nests a reply to a nested reply under the same top reply (one level)', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    const top = await reply(b.client, doc.id, 'Top');
    const child = await reply(author.client, doc.id, 'Child', top.id);
    const grandchild = await reply(b.client, doc.id, 'Grandchild', child.id);
    expect(child.parentId).toBe(top.id);
    expect(grandchild.parentId).toBe(top.id);
    const bad = await b.client.post(`/api/documents/${doc.id}/replies`, {
      body: 'x',
      parentId: 999999,
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/not under this document/);
  });

  it('answers 403 with a sentence for an unverified member, 401 signed out, 404 for an unpublished document', async () => {
    const author = await member();
    const doc = await publishedSheet(author.client);
    const unverified = await member('unverified');
    const res = await unverified.client.post(`/api/documents/${doc.id}/replies`, { body: 'Hello' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('EMAIL_UNVERIFIED');
    expect(res.body.error.message).toMatch(/verify your e-mail/);
    expect((await anon.post(`/api/documents/${doc.id}/replies`, { body: 'Hello' })).status).toBe(
      401,
    );

    const draft = await author.client.post('/api/documents', {
      kind: 'connector',
      title: 'Unpublished plug',
      content: sheet(),
    });
    const other = await member();
    const closed = await other.client.post(`/api/documents/${draft.body.id}/replies`, {
      body: 'Hi',
    });
    expect(closed.status).toBe(404);
    expect((await anon.get(`/api/documents/${draft.body.id}/replies`)).status).toBe(404);
  });

  it(`answers 429 with a sentence after ${REPLY_LIMITS.perMinute} replies in a minute`, async () => {
    const author = await member();
    const fast = await member();
    const doc = await publishedSheet(author.client);
    for (let i = 0; i < REPLY_LIMITS.perMinute; i++) await reply(fast.client, doc.id, `Reply ${i}`);
    const res = await fast.client.post(`/api/documents/${doc.id}/replies`, {
      body: 'One too many',
    });
    expect(res.status).toBe(429);
    expect(res.body.error.message).toMatch(/replies a minute\. Wait \d+ seconds?/);
    // Another member is not held up.
    await reply(author.client, doc.id, 'Still fine for me');
  });

  it('refuses bad bodies with 400 and a named field, never 500', async () => {
    const author = await member();
    const doc = await publishedSheet(author.client);
    for (const body of [
      {},
      { body: '' },
      { body: 12 },
      { body: 'x', parentId: 'one' },
      { body: 'x', extra: 1 },
      [],
    ]) {
      const res = await author.client.post(`/api/documents/${doc.id}/replies`, body as object);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.message).toMatch(/\w+ \w+/);
    }
    const long = await author.client.post(`/api/documents/${doc.id}/replies`, {
      body: 'x'.repeat(10_001),
    });
    expect(long.status).toBe(400);
    expect(
      (await author.client.post('/api/documents/not-a-doc/replies', { body: 'x' })).status,
    ).toBe(404);
    expect((await author.client.patch('/api/replies/abc', { body: 'x' })).status).toBe(404);
    expect((await author.client.delete('/api/replies/99999999')).status).toBe(404);
  });
});

describe('GET /api/documents/:id/replies', () => {
  it('lists replies oldest first with bodyHtml, by id or slug, for anyone', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    const r1 = await reply(b.client, doc.id, 'First _one_');
    const r2 = await reply(author.client, doc.id, 'Second');
    for (const key of [doc.id, doc.slug]) {
      const res = await anon.get(`/api/documents/${key}/replies`);
      expect(res.status).toBe(200);
      expect(res.body.map((r: { id: number }) => r.id)).toEqual([r1.id, r2.id]);
      expect(res.body[0].bodyHtml).toContain('<em>one</em>');
      expect(res.body[0].body).toBe('First _one_');
      expect(res.body[0].author.displayName).toBe(b.user.displayName);
    }
  });

  it('hides a hidden reply from readers but not from moderators or its writer', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    const r = await reply(b.client, doc.id, 'Buy my harness at a shady shop');
    const noReason = await moderator.post(`/api/replies/${r.id}/hide`, {});
    expect(noReason.status).toBe(400);
    const hidden = await moderator.post(`/api/replies/${r.id}/hide`, { reason: 'Advertising' });
    expect(hidden.status).toBe(200);

    const asReader = (await anon.get(`/api/documents/${doc.id}/replies`)).body[0];
    expect(asReader.status).toBe('hidden');
    expect(asReader.notice).toBe('hidden by a moderator');
    expect(asReader.body).toBeNull();
    expect(asReader.bodyHtml).toBeNull();
    expect(asReader.hidden).toBeNull();
    const asMember = (await author.client.get(`/api/documents/${doc.id}/replies`)).body[0];
    expect(asMember.body).toBeNull();

    const asModerator = (await moderator.get(`/api/documents/${doc.id}/replies`)).body[0];
    expect(asModerator.body).toBe('Buy my harness at a shady shop');
    expect(asModerator.hidden.reason).toBe('Advertising');
    expect(asModerator.can.unhide).toBe(true);
    const asWriter = (await b.client.get(`/api/documents/${doc.id}/replies`)).body[0];
    expect(asWriter.body).toBe('Buy my harness at a shady shop');
    expect(asWriter.hidden.reason).toBe('Advertising');

    const hiddenMail = await mailTo(b.user.email, /hid your reply/);
    expect(hiddenMail).toHaveLength(1);
    expect(hiddenMail[0].text).toContain('Advertising');
    const audit = await env.ctx.models.AuditEntry.findOne({
      where: { action: 'reply.hide', targetId: String(r.id) },
    });
    expect(audit).toBeTruthy();
    expect((await b.client.post(`/api/replies/${r.id}/hide`, { reason: 'x' })).status).toBe(403);

    expect((await moderator.post(`/api/replies/${r.id}/unhide`)).status).toBe(200);
    expect((await anon.get(`/api/documents/${doc.id}/replies`)).body[0].body).toBe(
      'Buy my harness at a shady shop',
    );
  });
});

describe('PATCH and DELETE /api/replies/:id', () => {
  it('lets the writer edit within the window, then answers 409 with a sentence', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    const r = await reply(b.client, doc.id, 'Typo here');
    const edited = await b.client.patch(`/api/replies/${r.id}`, { body: 'No typo *here*' });
    expect(edited.status).toBe(200);
    expect(edited.body.bodyHtml).toContain('<em>here</em>');
    expect(edited.body.editedAt).toBeTruthy();
    expect((await author.client.patch(`/api/replies/${r.id}`, { body: 'Mine now' })).status).toBe(
      403,
    );

    await env.ctx.models.Reply.update(
      { createdAt: new Date(Date.now() - 20 * 60_000) },
      { where: { id: r.id }, silent: true },
    );
    const late = await b.client.patch(`/api/replies/${r.id}`, { body: 'Too late' });
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('EDIT_WINDOW_CLOSED');
    expect(late.body.error.message).toMatch(/15 minutes/);
  });

  it('soft-deletes: the reply stays as "deleted by its author" without its text', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    const r = await reply(b.client, doc.id, 'Oops, wrong thread');
    expect((await author.client.delete(`/api/replies/${r.id}`)).status).toBe(403);
    const del = await b.client.delete(`/api/replies/${r.id}`);
    expect(del.status).toBe(200);
    const listed = (await anon.get(`/api/documents/${doc.id}/replies`)).body[0];
    expect(listed.status).toBe('deleted');
    expect(listed.notice).toBe('deleted by its author');
    expect(listed.body).toBeNull();
  });
});

describe('POST /api/replies/:id/answer', () => {
  it('lets only the document author mark one answer; marking another moves it', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    const r1 = await reply(b.client, doc.id, 'Answer one');
    const r2 = await reply(b.client, doc.id, 'Answer two');
    expect((await b.client.post(`/api/replies/${r1.id}/answer`)).status).toBe(403);
    expect((await author.client.post(`/api/replies/${r1.id}/answer`)).body.isAnswer).toBe(true);
    expect((await author.client.post(`/api/replies/${r2.id}/answer`)).status).toBe(200);
    const list = (await anon.get(`/api/documents/${doc.id}/replies`)).body;
    expect(list.map((r: { isAnswer: boolean }) => r.isAnswer)).toEqual([false, true]);
    const notes = (await b.client.get('/api/notifications')).body;
    expect(notes.items.some((n: { kind: string }) => n.kind === 'answer')).toBe(true);
    expect((await author.client.delete(`/api/replies/${r2.id}/answer`)).body.isAnswer).toBe(false);
  });
});

describe('unsubscribe links', () => {
  it('stops e-mail for the thread without signing in; a bad token answers 400', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    await reply(b.client, doc.id, 'First question');
    const [mail] = await mailTo(author.user.email, /replied/);
    const token = unsubscribePath(mail);

    const stranger = request(env.app);
    const look = await stranger.get(`/api/unsubscribe?token=${encodeURIComponent(token)}`);
    expect(look.status).toBe(200);
    expect(look.body).toMatchObject({
      scope: 'thread',
      subscribed: true,
      document: { id: doc.id },
    });
    const res = await stranger.post('/api/unsubscribe').send({ token });
    expect(res.status).toBe(200);
    expect(res.body.subscribed).toBe(false);
    expect((await stranger.post('/api/unsubscribe').send({ token })).status).toBe(200);

    await reply(b.client, doc.id, 'Second question');
    expect(await mailTo(author.user.email, /replied/)).toHaveLength(1);
    // Still in the app's bell, and the page can follow again.
    const sub = await author.client.get(`/api/documents/${doc.id}/subscription`);
    expect(sub.body.subscribed).toBe(false);
    expect(
      (await author.client.put(`/api/documents/${doc.id}/subscription`, { subscribed: true })).body
        .subscribed,
    ).toBe(true);

    const tampered = token.slice(0, -2) + (token.endsWith('AA') ? 'BB' : 'AA');
    const bad = await stranger.post('/api/unsubscribe').send({ token: tampered });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/not valid/);
    expect((await stranger.post('/api/unsubscribe').send({ token: 'nonsense-token' })).status).toBe(
      400,
    );
    expect((await stranger.get('/api/unsubscribe')).status).toBe(400);
  });

  it('takes the one-click POST of RFC 8058 at the List-Unsubscribe address', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    await reply(author.client, doc.id, 'Anyone probed this one?');
    await reply(b.client, doc.id, 'Yes');
    const [mail] = await mailTo(author.user.email, /replied/);
    const url = new URL(listHeaders(mail).url);
    const res = await request(env.app)
      .post(`${url.pathname}${url.search}`)
      .type('form')
      .send('List-Unsubscribe=One-Click');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.subscribed).toBe(false);
  });
});

describe('the daily digest', () => {
  it('gathers a day of replies into one e-mail for a member who chose it', async () => {
    const author = await member();
    const b = await member();
    const c = await member();
    const doc = await publishedSheet(author.client);
    const pref = await author.client.put('/api/me/notifications', { emailMode: 'digest' });
    expect(pref.status).toBe(200);
    expect(pref.body.emailMode).toBe('digest');
    expect(pref.body.subscriptions.map((s: { documentId: number }) => s.documentId)).toContain(
      doc.id,
    );

    await reply(b.client, doc.id, 'Digest reply one');
    await reply(c.client, doc.id, 'Digest reply two');
    await reply(b.client, doc.id, 'Digest reply three');
    await reply(author.client, doc.id, 'My own reply is not in my digest');
    expect(await mailTo(author.user.email, /replied|digest/)).toHaveLength(0);

    expect(await sendDigests(env.ctx, new Date(Date.now() + 60_000))).toBe(0);
    const tomorrow = new Date(Date.now() + 25 * 60 * 60 * 1000);
    expect(await sendDigests(env.ctx, tomorrow)).toBeGreaterThanOrEqual(1);
    const digests = await mailTo(author.user.email, /digest/);
    expect(digests).toHaveLength(1);
    const text = digests[0].text;
    for (const t of ['Digest reply one', 'Digest reply two', 'Digest reply three'])
      expect(text).toContain(t);
    expect(text).not.toContain('My own reply');
    expect(digests[0].subject).toMatch(/3 new replies/);
    expect(listHeaders(digests[0]).post).toBe('List-Unsubscribe=One-Click');

    // Not again for the same day.
    expect(await sendDigests(env.ctx, new Date(tomorrow.getTime() + 60_000))).toBe(0);
    expect(await mailTo(author.user.email, /digest/)).toHaveLength(1);

    // The digest's link turns reply e-mail off.
    const token = unsubscribePath(digests[0]);
    const off = await request(env.app).post('/api/unsubscribe').send({ token });
    expect(off.body).toMatchObject({ scope: 'all', emailMode: 'none' });
  });

  it('sends nothing for "none", and the bell still shows the reply', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    await author.client.put('/api/me/notifications', { emailMode: 'none' });
    await reply(b.client, doc.id, 'Quiet reply');
    expect(await mailTo(author.user.email, /replied/)).toHaveLength(0);
    const bell = await author.client.get('/api/notifications');
    expect(bell.body.unread).toBeGreaterThanOrEqual(1);
    expect(bell.body.items[0]).toMatchObject({ kind: 'reply', read: false });
    expect(bell.body.items[0].link).toMatch(/#reply-\d+$/);
    const read = await author.client.post('/api/notifications/read', {});
    expect(read.body.unread).toBe(0);
  });
});

describe('delivery failures', () => {
  it('retries, then marks the message failed without losing the reply; admins see it and retry', async () => {
    const author = await member();
    const b = await member();
    const doc = await publishedSheet(author.client);
    env.ctx.fakeSmtp!.setFailing(true);
    try {
      const started = Date.now();
      const r = await reply(b.client, doc.id, 'Posted while the mail server is down');
      expect(Date.now() - started).toBeLessThan(2000);
      const { OutboxMessage } = env.ctx.models;
      let row = null;
      for (let i = 0; i < 100; i++) {
        row = await OutboxMessage.findOne({
          where: { toAddress: author.user.email, kind: 'reply' },
        });
        if (row?.status === 'failed') break;
        await new Promise((res) => setTimeout(res, 50));
      }
      expect(row?.status).toBe('failed');
      expect(row?.attempts).toBe(env.ctx.config.outbox.maxAttempts);
      expect(row?.lastError).toMatch(/temporarily unavailable|451/i);
      const list = (await anon.get(`/api/documents/${doc.id}/replies`)).body;
      expect(list.map((x: { id: number }) => x.id)).toContain(r.id);

      const failed = await admin.get('/api/admin/mail?status=failed');
      expect(failed.status).toBe(200);
      expect(failed.body.counts.failed).toBeGreaterThanOrEqual(1);
      const item = failed.body.items.find((m: { id: number }) => m.id === row!.id);
      expect(item).toMatchObject({ status: 'failed', to: author.user.email });
      expect((await moderator.get('/api/admin/mail')).status).toBe(403);

      env.ctx.fakeSmtp!.setFailing(false);
      const retry = await admin.post(`/api/admin/mail/${row!.id}/retry`);
      expect(retry.status).toBe(200);
      expect(await mailTo(author.user.email, /replied/)).toHaveLength(1);
      expect((await OutboxMessage.findByPk(row!.id))!.status).toBe('sent');
      expect((await admin.post(`/api/admin/mail/${row!.id}/retry`)).status).toBe(409);
    } finally {
      env.ctx.fakeSmtp!.setFailing(false);
    }
  });
});

describe('flags', () => {
  it('queues a flag on a reply; hiding it closes every open flag on it, audits and e-mails the writer', async () => {
    const author = await member();
    const writer = await member();
    const r1 = await member();
    const r2 = await member();
    const doc = await publishedSheet(author.client);
    const r = await reply(writer.client, doc.id, 'Bridge the airbag loop with a paper clip');
    const f1 = await r1.client.post('/api/flags', {
      targetType: 'reply',
      targetId: r.id,
      reason: 'unsafe-advice',
      note: 'This could set off the airbag',
    });
    expect(f1.status, JSON.stringify(f1.body)).toBe(201);
    expect(
      (
        await r1.client.post('/api/flags', {
          targetType: 'reply',
          targetId: r.id,
          reason: 'spam-abuse',
        })
      ).status,
    ).toBe(409);
    expect(
      (await r2.client.post('/api/flags', { targetType: 'reply', targetId: r.id, reason: 'other' }))
        .status,
    ).toBe(400);
    expect(
      (
        await r2.client.post('/api/flags', {
          targetType: 'reply',
          targetId: r.id,
          reason: 'other',
          note: 'Dangerous',
        })
      ).status,
    ).toBe(201);
    expect(
      (
        await writer.client.post('/api/flags', {
          targetType: 'reply',
          targetId: r.id,
          reason: 'other',
          note: 'x',
        })
      ).status,
    ).toBe(409);

    const queue = await moderator.get('/api/flags?status=open');
    expect(queue.status).toBe(200);
    const item = queue.body.find((f: { id: number }) => f.id === f1.body.flag.id);
    expect(item).toMatchObject({
      targetType: 'reply',
      reasonLabel: 'Unsafe advice',
      openOnTarget: 2,
      reply: { id: r.id, body: 'Bridge the airbag loop with a paper clip' },
      document: { id: doc.id, slug: doc.slug },
    });
    expect((await r1.client.get('/api/flags')).status).toBe(403);

    const wrong = await moderator.post(`/api/flags/${f1.body.flag.id}/resolve`, {
      action: 'return-document',
      note: 'x',
    });
    expect(wrong.status).toBe(400);
    const res = await moderator.post(`/api/flags/${f1.body.flag.id}/resolve`, {
      action: 'hide-reply',
      note: 'Unsafe: never bridge an airbag circuit.',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({
      closed: 2,
      changed: true,
      flag: { status: 'resolved', action: 'hide-reply' },
    });
    expect(
      (await moderator.get('/api/flags?status=open')).body.filter(
        (f: { reply: { id: number } | null }) => f.reply?.id === r.id,
      ),
    ).toEqual([]);
    expect((await anon.get(`/api/documents/${doc.id}/replies`)).body[0].notice).toBe(
      'hidden by a moderator',
    );
    expect(await mailTo(writer.user.email, /hid your reply/)).toHaveLength(1);
    expect(
      await env.ctx.models.AuditEntry.findOne({
        where: { action: 'flag.hide-reply', targetId: String(f1.body.flag.id) },
      }),
    ).toBeTruthy();
    const bell = (await r2.client.get('/api/notifications')).body.items;
    expect(bell[0]).toMatchObject({ kind: 'flag' });
    expect(
      (await moderator.post(`/api/flags/${f1.body.flag.id}/resolve`, { action: 'dismiss' })).status,
    ).toBe(409);
  });

  it('returns a flagged document to its author: not public any more, audited and e-mailed', async () => {
    const author = await member();
    const reporter = await member();
    const doc = await publishedSheet(author.client);
    const f = await reporter.client.post('/api/flags', {
      targetType: 'document',
      targetId: doc.id,
      reason: 'wrong-pinout',
      note: 'Cavities 1 and 2 are swapped against my probed harness',
    });
    expect(f.status).toBe(201);
    const noNote = await moderator.post(`/api/flags/${f.body.flag.id}/resolve`, {
      action: 'return-document',
    });
    expect(noNote.status).toBe(400);
    const res = await moderator.post(`/api/flags/${f.body.flag.id}/resolve`, {
      action: 'return-document',
      note: 'Please check cavities 1 and 2 against a probed harness.',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect((await anon.get(`/api/documents/${doc.slug}`)).status).toBe(404);
    expect((await anon.get(`/api/documents/${doc.id}/replies`)).status).toBe(404);
    const mine = (await author.client.get('/api/me/documents')).body.find(
      (d: { id: number }) => d.id === doc.id,
    );
    expect(mine.latest.status).toBe('returned');
    expect(mine.latest.note).toMatch(/cavities 1 and 2/);
    const mail = await mailTo(author.user.email, /Returned after a flag/);
    expect(mail).toHaveLength(1);
    expect(
      await env.ctx.models.AuditEntry.findOne({ where: { action: 'flag.return-document' } }),
    ).toBeTruthy();
  });

  it('dismisses without e-mailing anyone, and a moderator cannot resolve a flag on their own writing', async () => {
    const author = await member();
    const reporter = await member();
    const doc = await publishedSheet(author.client);
    const f = await reporter.client.post('/api/flags', {
      targetType: 'document',
      targetId: doc.id,
      reason: 'copied-material',
    });
    await mailTo(author.user.email);
    const before = env.ctx.fakeSmtp!.list().length;
    const res = await moderator.post(`/api/flags/${f.body.flag.id}/resolve`, { action: 'dismiss' });
    expect(res.body).toMatchObject({ changed: false, flag: { action: 'dismiss' } });
    await env.ctx.outbox.flush();
    expect(env.ctx.fakeSmtp!.list().length).toBe(before);
    expect((await anon.get(`/api/documents/${doc.slug}`)).status).toBe(200);

    const modUser = await makeUser(env, { role: 'moderator' });
    const mod2 = new Client(env.app);
    await mod2.signIn(modUser.email);
    const ownDoc = await publishedSheet(mod2);
    const f2 = await reporter.client.post('/api/flags', {
      targetType: 'document',
      targetId: ownDoc.id,
      reason: 'spam-abuse',
    });
    const own = await mod2.post(`/api/flags/${f2.body.flag.id}/resolve`, { action: 'dismiss' });
    expect(own.status).toBe(403);
    expect(own.body.error.message).toMatch(/another moderator/);
  });
});

describe('in-app notifications', () => {
  it('tells the author of a review decision in the bell', async () => {
    const author = await member();
    await publishedSheet(author.client);
    const bell = await author.client.get('/api/notifications');
    expect(bell.body.items[0]).toMatchObject({ kind: 'review', read: false });
    expect(bell.body.items[0].title).toMatch(/Published/);
    const read = await author.client.post('/api/notifications/read', {
      ids: [bell.body.items[0].id],
    });
    expect(read.body.unread).toBe(0);
    expect((await author.client.post('/api/notifications/read', { ids: ['x'] })).status).toBe(400);
  });
});

describe('odd input', () => {
  it('never answers 500 on the reply, flag, notification and unsubscribe routes', async () => {
    const author = await member();
    const doc = await publishedSheet(author.client);
    const r = await reply(author.client, doc.id, 'Anchor reply');
    const bodies: unknown[] = [
      {},
      [],
      'text',
      null,
      { body: null },
      { body: ['x'] },
      { body: 'x', parentId: -1 },
      { body: 'x', parentId: 1e20 },
      { reason: 'x'.repeat(5000) },
      { targetType: 'reply', targetId: 1e20, reason: 'spam-abuse' },
      { targetType: 'user', targetId: 1, reason: 'spam-abuse' },
      { action: 'delete' },
      { ids: [1e20, -1] },
      { subscribed: 'yes' },
      { emailMode: 'sometimes' },
      { token: 'u1.1.1.' + 'A'.repeat(43) },
      { token: 'u1.99999999999.0.' + 'A'.repeat(43) },
    ];
    const routes: Array<[string, string]> = [
      ['post', `/api/documents/${doc.id}/replies`],
      ['post', '/api/documents/%E0%A4%A/replies'],
      ['put', `/api/documents/${doc.id}/subscription`],
      ['put', '/api/documents/abc/subscription'],
      ['patch', `/api/replies/${r.id}`],
      ['post', `/api/replies/${r.id}/hide`],
      ['post', '/api/replies/0/answer'],
      ['post', '/api/flags'],
      ['post', '/api/flags/1/resolve'],
      ['post', '/api/notifications/read'],
      ['put', '/api/me/notifications'],
      ['post', '/api/unsubscribe'],
      ['post', '/api/admin/mail/999999/retry'],
    ];
    const who = [author.client, moderator, admin];
    for (const c of who)
      for (const [method, url] of routes)
        for (const body of bodies) {
          const agent = c.agent as unknown as Record<string, (u: string) => request.Test>;
          const res = await agent[method](url)
            .set('X-CSRF-Token', c.csrf)
            .set('Content-Type', 'application/json')
            .send(JSON.stringify(body));
          expect(res.status, `${method} ${url} ${JSON.stringify(body)}`).toBeLessThan(500);
          expect(res.body.error?.message ?? 'ok', `${method} ${url}`).toMatch(/\w/);
        }
    for (const q of ['', '?token=', '?token[]=a', '?token=' + 'x'.repeat(500), '?status=weird'])
      for (const url of ['/api/unsubscribe', '/api/flags', '/api/admin/mail'])
        expect((await admin.get(url + q)).status, url + q).toBeLessThan(500);
  }, 60_000);
});

// ── A restart with mail still queued ──────────────────────────────────────

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

async function signedInAgent(url: string, email: string) {
  const agent = request.agent(url);
  const csrf = (await agent.get('/api/auth/csrf')).body.token as string;
  const login = await agent
    .post('/api/auth/login')
    .set('X-CSRF-Token', csrf)
    .send({ email, password: TEST_PASSWORD });
  expect(login.status).toBe(200);
  return { agent, csrf: (login.body.csrfToken as string | undefined) ?? csrf };
}

async function outboxRows(dataDir: string) {
  const db = new Sequelize({
    dialect: 'sqlite',
    storage: path.join(dataDir, 'loomwright.sqlite'),
    logging: false,
  });
  try {
    return await db.query<{
      id: number;
      message_id: string;
      to_address: string;
      status: string;
      attempts: number;
      kind: string;
    }>(
      "SELECT id, message_id, to_address, status, attempts, kind FROM mail_outbox WHERE kind = 'reply' ORDER BY id",
      { type: QueryTypes.SELECT },
    );
  } finally {
    await db.close();
  }
}

describe('a restart with mail queued', () => {
  let first: RunningServer | undefined;
  let second: RunningServer | undefined;
  afterAll(async () => {
    await first?.stop();
    await second?.stop();
  });

  it('delivers each queued message exactly once after the server comes back', async () => {
    // The first server's mail relay is down: every delivery fails and waits for a retry.
    const deadPort = await freePort();
    first = await startServer({ env: { SMTP_URL: `smtp://127.0.0.1:${deadPort}` } });
    const juniper = await signedInAgent(first.url, 'member2@example.test');
    const sheets = await request(first.url).get('/api/me/documents');
    expect(sheets.status).toBe(401);
    const rook = await signedInAgent(first.url, 'member@example.test');
    const owned = (await rook.agent.get('/api/me/documents')).body.filter(
      (d: { published: boolean }) => d.published,
    );
    expect(owned.length).toBeGreaterThan(0);
    const docId = owned[0].id;
    for (const body of [
      'Queued while the relay is down, one',
      'Queued while the relay is down, two',
    ]) {
      const res = await juniper.agent
        .post(`/api/documents/${docId}/replies`)
        .set('X-CSRF-Token', juniper.csrf)
        .send({ body });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    await new Promise((r) => setTimeout(r, 700));
    await first.stop();
    const dataDir = first.dataDir;
    first = undefined;

    const queued = (await outboxRows(dataDir)).filter(
      (r) => r.to_address === 'member@example.test',
    );
    expect(queued).toHaveLength(2);
    expect(queued.every((r) => r.status === 'queued')).toBe(true);

    second = await startServer({ dataDir });
    const mailToRook = async () =>
      ((await request(second!.url).get('/api/dev/mail')).body as CapturedMail[]).filter((m) =>
        m.to.includes('member@example.test'),
      );
    for (let i = 0; i < 60 && (await mailToRook()).length < 2; i++)
      await new Promise((r) => setTimeout(r, 250));
    // And nothing more arrives later: each message once.
    await new Promise((r) => setTimeout(r, 1500));
    const mail = await mailToRook();
    expect(mail).toHaveLength(2);
    expect(new Set(mail.map((m) => m.messageId)).size).toBe(2);
    expect(mail.map((m) => m.messageId).sort()).toEqual(queued.map((r) => r.message_id).sort());
    await second.stop();
    const after = (await outboxRows(dataDir)).filter((r) => r.to_address === 'member@example.test');
    second = undefined;
    expect(after.every((r) => r.status === 'sent')).toBe(true);
  }, 120_000);
});
