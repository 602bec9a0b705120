/**
 * Replies under published documents: one level of nesting, Markdown rendered and
 * sanitised on the server, a short edit window, soft delete by the author, hiding by
 * moderators and one answer marked by the document's author.
 *
 * A new reply, its writer's subscription, the in-app notices and every subscriber's
 * e-mail are one transaction: the e-mails are rows in the outbox, delivered later by
 * the worker, so a mail server that is down never fails or slows the reply.
 */
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { Op, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { HttpError, conflict, forbidden, notFound } from '../errors';
import { Document, NotificationSetting, Reply, Revision, User } from '../models';
import { serverMarkdown } from '../markdown';
import { mailSafeHtml, replyMail } from '../mail/replyMail';
import { REPLY_EDIT_MINUTES } from '../../shared/schemas/replies';
import { REPLY_MARKDOWN_BUDGET } from '../../shared/markdown/budget';
import { isModerator, userRef } from './documents';
import { audit } from './audit';
import { enqueueMail } from './outbox';
import { notify } from './notifications';
import { setSubscription, subscriberIds, unsubscribeToken } from './subscriptions';
import { closeOpenFlags, hideReplyTx, mailDomain, replyLink } from './moderation';

type Viewer = Pick<Express.User, 'id' | 'role'> | null | undefined;
type Member = Pick<Express.User, 'id' | 'role'>;

const EDIT_MS = REPLY_EDIT_MINUTES * 60_000;

/** Replies one member may post: per minute and per day. */
export const REPLY_LIMITS = { perMinute: 5, perDay: 60 };

let renderer: ReturnType<typeof serverMarkdown> | undefined;

/**
 * Renders a reply's Markdown to sanitised HTML, with the same rules and budget as the
 * client's preview; text past the budget is a 400 with the renderer's sentence.
 */
export function renderReply(source: string): string {
  renderer ??= serverMarkdown({ budget: REPLY_MARKDOWN_BUDGET });
  try {
    return renderer.render(source);
  } catch (err) {
    if (err instanceof RangeError) throw new HttpError(400, 'REPLY_TOO_COMPLEX', err.message);
    throw err;
  }
}

const limiters = new WeakMap<AppContext, { minute: RateLimiterMemory; day: RateLimiterMemory }>();

async function consumeQuota(ctx: AppContext, userId: number) {
  let l = limiters.get(ctx);
  if (!l) {
    l = {
      minute: new RateLimiterMemory({
        points: REPLY_LIMITS.perMinute,
        duration: 60,
        keyPrefix: 'reply-min',
      }),
      day: new RateLimiterMemory({
        points: REPLY_LIMITS.perDay,
        duration: 86_400,
        keyPrefix: 'reply-day',
      }),
    };
    limiters.set(ctx, l);
  }
  const key = String(userId);
  try {
    await l.day.consume(key);
  } catch (err) {
    if (!(err instanceof RateLimiterRes)) throw err;
    const hours = Math.max(1, Math.ceil(err.msBeforeNext / 3_600_000));
    throw new HttpError(
      429,
      'REPLY_LIMIT',
      `You have posted ${REPLY_LIMITS.perDay} replies today, the most one member can. You can reply again in about ${hours} hour${hours === 1 ? '' : 's'}.`,
      { retryAfterSeconds: Math.ceil(err.msBeforeNext / 1000) },
    );
  }
  try {
    await l.minute.consume(key);
  } catch (err) {
    if (!(err instanceof RateLimiterRes)) throw err;
    const seconds = Math.max(1, Math.ceil(err.msBeforeNext / 1000));
    throw new HttpError(
      429,
      'REPLY_LIMIT',
      `You can post ${REPLY_LIMITS.perMinute} replies a minute. Wait ${seconds} second${seconds === 1 ? '' : 's'} and post again; your text is still there.`,
      { retryAfterSeconds: seconds },
    );
  }
}

type DocWithTitle = Document & { publishedRevision?: Revision | null };

const NOT_PUBLISHED = 'There is no published document at this address, so it has no replies.';

async function findDocument(idOrSlug: string | number, transaction?: Transaction) {
  const s = String(idOrSlug);
  const where = /^\d{1,12}$/.test(s) ? { id: Number(s) } : { slug: s.toLowerCase() };
  return (await Document.findOne({
    where,
    include: [{ model: Revision, as: 'publishedRevision', attributes: ['id', 'title'] }],
    transaction,
  })) as DocWithTitle | null;
}

function titleOf(doc: DocWithTitle) {
  return doc.publishedRevision?.title || 'Untitled';
}

/**
 * The document of a thread. Readers see threads of published documents only; its
 * author and moderators may still read the thread of one taken back for changes.
 */
async function threadDocument(
  idOrSlug: string | number,
  viewer: Viewer,
  transaction?: Transaction,
) {
  const doc = await findDocument(idOrSlug, transaction);
  if (!doc) throw notFound(NOT_PUBLISHED);
  const privileged = !!viewer && (viewer.id === doc.ownerId || isModerator(viewer));
  if (!doc.publishedRevisionId && !privileged) throw notFound(NOT_PUBLISHED);
  return doc;
}

function notOpen() {
  return conflict(
    'NOT_PUBLISHED',
    'This document is not published at the moment, so its thread is closed until it is published again.',
  );
}

const withPeople = [
  { model: User, as: 'author', attributes: ['id', 'displayName'] },
  { model: User, as: 'hiddenBy', attributes: ['id', 'displayName'] },
];

type ReplyRow = Reply & { author?: User | null; hiddenBy?: User | null };

/** A reply as `viewer` may see it: the text of a hidden reply only for moderators and its writer. */
export function replyJson(
  r: ReplyRow,
  doc: Pick<Document, 'ownerId' | 'publishedRevisionId'>,
  viewer: Viewer,
  now = new Date(),
) {
  const mod = isModerator(viewer);
  const mine = !!viewer && viewer.id === r.authorId;
  const docOwner = !!viewer && viewer.id === doc.ownerId;
  const open = !!doc.publishedRevisionId;
  const showText = r.status === 'visible' || (r.status === 'hidden' && (mod || mine));
  const editableUntil = new Date(new Date(r.createdAt).getTime() + EDIT_MS);
  return {
    id: r.id,
    documentId: r.documentId,
    parentId: r.parentId,
    author: userRef(r.author) ?? { id: r.authorId, displayName: 'a member' },
    status: r.status,
    notice:
      r.status === 'deleted'
        ? 'deleted by its author'
        : r.status === 'hidden'
          ? 'hidden by a moderator'
          : null,
    body: showText ? r.body : null,
    bodyHtml: showText ? r.bodyHtml : null,
    hidden:
      r.status === 'hidden' && (mod || mine)
        ? { reason: r.hiddenReason, at: r.hiddenAt, by: mod ? userRef(r.hiddenBy) : null }
        : null,
    isAnswer: r.isAnswer,
    createdAt: r.createdAt,
    editedAt: r.editedAt,
    editableUntil,
    can: {
      edit: mine && open && r.status === 'visible' && now < editableUntil,
      delete: mine && r.status !== 'deleted',
      hide: mod && r.status === 'visible',
      unhide: mod && r.status === 'hidden',
      markAnswer: docOwner && open && r.status === 'visible' && !r.isAnswer,
      unmarkAnswer: docOwner && r.isAnswer,
      reply: !!viewer && open && r.status !== 'hidden',
      flag: !!viewer && !mine && open && r.status === 'visible',
    },
  };
}

export type ReplyJson = ReturnType<typeof replyJson>;

/** `GET /api/documents/:id/replies`: every reply of the thread, oldest first (children carry `parentId`). */
export async function listReplies(viewer: Viewer, idOrSlug: string) {
  const doc = await threadDocument(idOrSlug, viewer);
  const rows = (await Reply.findAll({
    where: { documentId: doc.id },
    include: withPeople,
    order: [
      ['createdAt', 'ASC'],
      ['id', 'ASC'],
    ],
  })) as ReplyRow[];
  const now = new Date();
  return rows.map((r) => replyJson(r, doc, viewer, now));
}

async function loadReply(id: number, transaction?: Transaction) {
  const reply = (await Reply.findByPk(id, { include: withPeople, transaction })) as ReplyRow | null;
  if (!reply)
    throw notFound(
      'There is no reply with this number. It may have been removed with its document.',
    );
  const doc = (await findDocument(reply.documentId, transaction))!;
  return { reply, doc };
}

function excerpt(text: string, n = 160) {
  const flat = text.replace(/\s+/g, ' ').trim();
  return flat.length > n ? `${flat.slice(0, n - 1)}…` : flat;
}

/**
 * Posts a reply. Refused while the document is not published, when `parentId` is not
 * a reply of the same document, and (429) past the member's rate limit. A reply to a
 * nested reply joins its thread (one level of nesting). Subscribes the writer, and
 * queues one e-mail for each other subscriber who wants each reply, in the same
 * transaction as the reply.
 */
export async function createReply(
  ctx: AppContext,
  user: Member,
  idOrSlug: string,
  input: { body: string; parentId?: number | null },
) {
  const found = await threadDocument(idOrSlug, user);
  if (!found.publishedRevisionId) throw notOpen();
  await consumeQuota(ctx, user.id);
  const bodyHtml = renderReply(input.body);

  const result = await ctx.sequelize.transaction(async (transaction) => {
    const doc = (await findDocument(found.id, transaction))!;
    if (!doc.publishedRevisionId) throw notOpen();
    let parentId: number | null = null;
    let answered: Reply | null = null;
    if (input.parentId) {
      answered = await Reply.findOne({
        where: { id: input.parentId, documentId: doc.id },
        transaction,
      });
      if (!answered)
        throw new HttpError(
          400,
          'PARENT_NOT_FOUND',
          'The reply you are answering is not under this document any more. Reload the page and reply to the document instead.',
          [{ path: 'parentId', message: 'There is no such reply under this document.' }],
        );
      if (answered.status === 'hidden')
        throw conflict(
          'PARENT_HIDDEN',
          'A moderator hid the reply you are answering. Reply to the document instead.',
        );
      parentId = answered.parentId ?? answered.id;
    }

    const reply = await Reply.create(
      { documentId: doc.id, authorId: user.id, parentId, body: input.body, bodyHtml },
      { transaction },
    );
    await setSubscription(
      doc.id,
      user.id,
      true,
      doc.ownerId === user.id ? 'author' : 'replied',
      transaction,
    );
    await tellSubscribers(ctx, doc, reply, answered, transaction);
    const row = (await Reply.findByPk(reply.id, { include: withPeople, transaction })) as ReplyRow;
    return replyJson(row, doc, user);
  });
  void ctx.outbox.flush();
  return result;
}

/** In-app notices for every subscriber but the writer, and an e-mail for those who want each reply. */
async function tellSubscribers(
  ctx: AppContext,
  doc: DocWithTitle,
  reply: Reply,
  answered: Reply | null,
  transaction: Transaction,
) {
  const recipients = (await subscriberIds(doc, transaction)).filter((id) => id !== reply.authorId);
  if (!recipients.length) return;
  const writer = (await User.findByPk(reply.authorId, { transaction }))!;
  const users = await User.findAll({ where: { id: { [Op.in]: recipients } }, transaction });
  const settings = await NotificationSetting.findAll({
    where: { userId: { [Op.in]: recipients } },
    transaction,
  });
  const modeOf = new Map(settings.map((s) => [s.userId, s.emailMode]));
  const title = titleOf(doc);
  const link = replyLink(ctx, doc.slug, reply.id);

  await notify(
    users.map((u) => ({
      userId: u.id,
      kind: 'reply' as const,
      title: `${writer.displayName} replied: ${title}`,
      body: excerpt(reply.body),
      link: link.path,
    })),
    transaction,
  );

  const html = mailSafeHtml(reply.bodyHtml, ctx.config.publicUrl);
  for (const u of users) {
    if ((modeOf.get(u.id) ?? 'each') !== 'each' || !u.emailVerifiedAt) continue;
    const token = unsubscribeToken(ctx, u.id, doc.id);
    const oneClick = `${ctx.config.publicUrl}/api/unsubscribe?token=${encodeURIComponent(token)}`;
    const mail = replyMail({
      replier: writer.displayName,
      documentTitle: title,
      replyText: reply.body,
      replyHtml: html,
      replyUrl: link.url,
      unsubscribeUrl: `${ctx.config.publicUrl}/unsubscribe?token=${encodeURIComponent(token)}`,
      settingsUrl: `${ctx.config.publicUrl}/account/notifications`,
      isAuthor: u.id === doc.ownerId,
      answersYou: !!answered && answered.authorId === u.id,
    });
    await enqueueMail(
      {
        ...mail,
        to: u.email,
        kind: 'reply',
        headers: {
          'List-Unsubscribe': `<${oneClick}>`,
          'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
        },
      },
      { transaction, domain: mailDomain(ctx) },
    );
  }
}

function notYours(what: string) {
  return forbidden(`Only the member who wrote this reply can ${what} it.`);
}

/** Changes a reply's text: its writer only, within {@link REPLY_EDIT_MINUTES} minutes of posting. */
export async function editReply(ctx: AppContext, user: Member, id: number, body: string) {
  const bodyHtml = renderReply(body);
  return ctx.sequelize.transaction(async (transaction) => {
    const { reply, doc } = await loadReply(id, transaction);
    if (reply.authorId !== user.id) throw notYours('change');
    if (reply.status === 'deleted')
      throw conflict('REPLY_DELETED', 'This reply was deleted, so it cannot be changed.');
    if (reply.status === 'hidden')
      throw conflict(
        'REPLY_HIDDEN',
        'A moderator hid this reply, so it cannot be changed any more.',
      );
    if (!doc.publishedRevisionId) throw notOpen();
    const age = Date.now() - new Date(reply.createdAt).getTime();
    if (age > EDIT_MS)
      throw conflict(
        'EDIT_WINDOW_CLOSED',
        `A reply can be changed for ${REPLY_EDIT_MINUTES} minutes after it is posted, and this one was posted ${Math.floor(age / 60_000)} minutes ago. Post a new reply to add to it.`,
      );
    await reply.update({ body, bodyHtml, editedAt: new Date() }, { transaction });
    return replyJson(reply, doc, user);
  });
}

/** Deletes a reply by its writer: it stays in the thread as "deleted by its author". */
export async function deleteReply(ctx: AppContext, user: Member, id: number) {
  return ctx.sequelize.transaction(async (transaction) => {
    const { reply, doc } = await loadReply(id, transaction);
    if (reply.authorId !== user.id) throw notYours('delete');
    if (reply.status !== 'deleted')
      await reply.update(
        { status: 'deleted', deletedAt: new Date(), isAnswer: false },
        { transaction },
      );
    return replyJson(reply, doc, user);
  });
}

/** Hides a reply (moderators), closing any open flags on it with the same outcome. */
export async function hideReply(ctx: AppContext, moderator: Member, id: number, reason: string) {
  const result = await ctx.sequelize.transaction(async (transaction) => {
    const { reply, doc } = await loadReply(id, transaction);
    if (reply.status === 'deleted')
      throw conflict(
        'REPLY_DELETED',
        'Its author already deleted this reply; readers do not see its text.',
      );
    if (reply.status === 'hidden')
      throw conflict('ALREADY_HIDDEN', 'This reply is already hidden.');
    await hideReplyTx(ctx, moderator, reply, reason, transaction);
    await closeOpenFlags(
      `reply:${reply.id}`,
      {
        action: 'hide-reply',
        note: reason,
        moderatorId: moderator.id,
        title: titleOf(doc),
        link: replyLink(ctx, doc.slug, reply.id).path,
      },
      transaction,
    );
    const row = (await Reply.findByPk(reply.id, { include: withPeople, transaction })) as ReplyRow;
    return replyJson(row, doc, moderator);
  });
  void ctx.outbox.flush();
  return result;
}

/** Shows a hidden reply again (moderators). Audited. */
export async function unhideReply(ctx: AppContext, moderator: Member, id: number) {
  return ctx.sequelize.transaction(async (transaction) => {
    const { reply, doc } = await loadReply(id, transaction);
    if (reply.status !== 'hidden') throw conflict('NOT_HIDDEN', 'This reply is not hidden.');
    await reply.update(
      { status: 'visible', hiddenReason: null, hiddenById: null, hiddenAt: null },
      { transaction },
    );
    await audit(
      {
        actorId: moderator.id,
        action: 'reply.unhide',
        targetType: 'reply',
        targetId: reply.id,
        details: { documentId: doc.id, slug: doc.slug, authorId: reply.authorId },
      },
      transaction,
    );
    const row = (await Reply.findByPk(reply.id, { include: withPeople, transaction })) as ReplyRow;
    return replyJson(row, doc, moderator);
  });
}

/**
 * Marks a reply as the answer (the document's author only); the earlier answer, if
 * any, stops being one. The reply's writer is told in the app.
 */
export async function markAnswer(ctx: AppContext, user: Member, id: number) {
  return ctx.sequelize.transaction(async (transaction) => {
    const { reply, doc } = await loadReply(id, transaction);
    if (doc.ownerId !== user.id)
      throw forbidden('Only the author of the document can mark a reply as the answer.');
    if (!doc.publishedRevisionId) throw notOpen();
    if (reply.status !== 'visible')
      throw conflict(
        'NOT_VISIBLE',
        'A deleted or hidden reply cannot be the answer. Choose another one.',
      );
    if (!reply.isAnswer) {
      await Reply.update(
        { isAnswer: false },
        { where: { documentId: doc.id, isAnswer: true }, transaction },
      );
      await reply.update({ isAnswer: true }, { transaction });
      if (reply.authorId !== user.id) {
        const owner = await User.findByPk(user.id, { transaction });
        await notify(
          {
            userId: reply.authorId,
            kind: 'answer',
            title: `${owner?.displayName ?? 'The author'} marked your reply as the answer: ${titleOf(doc)}`,
            link: replyLink(ctx, doc.slug, reply.id).path,
          },
          transaction,
        );
      }
    }
    return replyJson(reply, doc, user);
  });
}

/** Takes the answer mark off a reply (the document's author only). */
export async function unmarkAnswer(ctx: AppContext, user: Member, id: number) {
  return ctx.sequelize.transaction(async (transaction) => {
    const { reply, doc } = await loadReply(id, transaction);
    if (doc.ownerId !== user.id)
      throw forbidden('Only the author of the document can change which reply is the answer.');
    if (reply.isAnswer) await reply.update({ isAnswer: false }, { transaction });
    return replyJson(reply, doc, user);
  });
}
