/**
 * Who hears about replies under a document, and how.
 *
 * The document's author follows its thread without a row; everyone who replies gets a
 * row; anyone signed in may follow or stop following. A row with `active: false` is an
 * opt-out, so an author who stopped following stays stopped. How a member hears is
 * their e-mail mode: each reply, a daily digest, or none (in-app notices always).
 *
 * Unsubscribe links carry a token signed with an HMAC of the session secret: they work
 * without signing in and name one member and one thread (or, for digests, all e-mail).
 */
import crypto from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { HttpError, notFound } from '../errors';
import { Document, NotificationSetting, Revision, ThreadSubscription, User } from '../models';
import type { SubscriptionSource } from '../models/ThreadSubscription';
import type { EmailMode } from '../../shared/schemas/replies';

type Member = Pick<Express.User, 'id'>;

/** The member's e-mail mode; "each" when they never chose. */
export async function emailModeOf(userId: number, transaction?: Transaction): Promise<EmailMode> {
  const row = await NotificationSetting.findByPk(userId, { transaction });
  return row?.emailMode ?? 'each';
}

/** Whether `userId` follows the replies under `doc`. */
export async function isSubscribed(
  doc: Pick<Document, 'id' | 'ownerId'>,
  userId: number,
  transaction?: Transaction,
) {
  const row = await ThreadSubscription.findOne({
    where: { documentId: doc.id, userId },
    transaction,
  });
  if (row) return { subscribed: row.active, source: row.source };
  return doc.ownerId === userId
    ? { subscribed: true, source: 'author' as SubscriptionSource }
    : { subscribed: false, source: null };
}

/** Ids of everyone following the thread under `doc`, its author included unless they opted out. */
export async function subscriberIds(
  doc: Pick<Document, 'id' | 'ownerId'>,
  transaction?: Transaction,
): Promise<number[]> {
  const rows = await ThreadSubscription.findAll({ where: { documentId: doc.id }, transaction });
  const ids = new Set(rows.filter((r) => r.active).map((r) => r.userId));
  if (!rows.some((r) => r.userId === doc.ownerId)) ids.add(doc.ownerId);
  return [...ids];
}

/**
 * Follows or stops following a thread. `source` says why a new row exists; an existing
 * row keeps its first reason.
 */
export async function setSubscription(
  documentId: number,
  userId: number,
  active: boolean,
  source: SubscriptionSource,
  transaction?: Transaction,
) {
  const row = await ThreadSubscription.findOne({ where: { documentId, userId }, transaction });
  if (row) {
    if (row.active !== active) await row.update({ active }, { transaction });
    return row;
  }
  return ThreadSubscription.create({ documentId, userId, active, source }, { transaction });
}

const NOT_PUBLISHED = 'There is no published document at this address.';

async function publishedDocument(id: number, transaction?: Transaction) {
  const doc = await Document.findByPk(id, { transaction });
  if (!doc || !doc.publishedRevisionId) throw notFound(NOT_PUBLISHED);
  return doc;
}

/** `GET /api/documents/:id/subscription`: whether the member follows the thread, and their e-mail mode. */
export async function getSubscription(user: Member, documentId: number) {
  const doc = await publishedDocument(documentId);
  const state = await isSubscribed(doc, user.id);
  return { documentId: doc.id, ...state, emailMode: await emailModeOf(user.id) };
}

/** `PUT /api/documents/:id/subscription`: follow or stop following from the page. */
export async function updateSubscription(
  ctx: AppContext,
  user: Member,
  documentId: number,
  subscribed: boolean,
) {
  await ctx.sequelize.transaction(async (transaction) => {
    const doc = await publishedDocument(documentId, transaction);
    await setSubscription(
      doc.id,
      user.id,
      subscribed,
      doc.ownerId === user.id ? 'author' : 'manual',
      transaction,
    );
  });
  return getSubscription(user, documentId);
}

/** The settings page: the e-mail mode and every thread the member follows. */
export async function getSettings(user: Member) {
  const rows = await ThreadSubscription.findAll({ where: { userId: user.id } });
  const optedOut = new Set(rows.filter((r) => !r.active).map((r) => r.documentId));
  const followed = new Map(rows.filter((r) => r.active).map((r) => [r.documentId, r]));
  const owned = await Document.findAll({
    where: { ownerId: user.id, publishedRevisionId: { [Op.ne]: null } },
  });
  const ids = new Set([
    ...followed.keys(),
    ...owned.filter((d) => !optedOut.has(d.id)).map((d) => d.id),
  ]);
  const docs = ids.size
    ? await Document.findAll({
        where: { id: [...ids], publishedRevisionId: { [Op.ne]: null } },
        include: [{ model: Revision, as: 'publishedRevision', attributes: ['id', 'title'] }],
      })
    : [];
  const setting = await NotificationSetting.findByPk(user.id);
  const me = await User.findByPk(user.id);
  return {
    emailMode: setting?.emailMode ?? ('each' as EmailMode),
    emailVerified: !!me?.emailVerifiedAt,
    subscriptions: docs
      .map((d) => {
        const row = followed.get(d.id);
        return {
          documentId: d.id,
          slug: d.slug,
          kind: d.kind,
          title:
            (d as Document & { publishedRevision?: Revision }).publishedRevision?.title ?? d.slug,
          source: row?.source ?? ('author' as SubscriptionSource),
          since: row?.createdAt ?? d.createdAt,
        };
      })
      .sort((a, b) => a.title.localeCompare(b.title)),
  };
}

/**
 * Sets the member's e-mail mode. Switching to the digest starts its window now, so
 * replies already e-mailed one by one are not sent again.
 */
export async function setEmailMode(
  user: Member,
  emailMode: EmailMode,
  transaction?: Transaction,
  now = new Date(),
) {
  const row = await NotificationSetting.findByPk(user.id, { transaction });
  if (!row) {
    await NotificationSetting.create(
      { userId: user.id, emailMode, digestSince: emailMode === 'digest' ? now : null },
      { transaction },
    );
  } else if (row.emailMode !== emailMode) {
    await row.update(
      { emailMode, digestSince: emailMode === 'digest' ? now : row.digestSince },
      { transaction },
    );
  }
}

/** `PUT /api/me/notifications`. */
export async function updateSettings(ctx: AppContext, user: Member, emailMode: EmailMode) {
  await ctx.sequelize.transaction((transaction) => setEmailMode(user, emailMode, transaction));
  return getSettings(user);
}

// ── Unsubscribe tokens ─────────────────────────────────────────────

const TOKEN_VERSION = 'u1';

function tokenKey(ctx: AppContext) {
  // A key of its own, so a token can never stand for anything the session secret signs.
  return crypto
    .createHmac('sha256', ctx.config.sessionSecret ?? 'unset')
    .update('loomwright unsubscribe links')
    .digest();
}

function signature(ctx: AppContext, userId: number, documentId: number) {
  return crypto
    .createHmac('sha256', tokenKey(ctx))
    .update(`${TOKEN_VERSION}:${userId}:${documentId}`)
    .digest('base64url');
}

/**
 * A token for an unsubscribe link: member `userId` stops following `documentId`, or,
 * with `documentId` 0, stops all reply e-mail (the digest's link).
 */
export function unsubscribeToken(ctx: AppContext, userId: number, documentId: number): string {
  return `${TOKEN_VERSION}.${userId}.${documentId}.${signature(ctx, userId, documentId)}`;
}

const BAD_TOKEN =
  'This unsubscribe link is not valid: it may have been cut short when it was copied. Open it again from the e-mail, or sign in and change your e-mail settings under Your account → Notifications.';

function readToken(ctx: AppContext, token: string) {
  const m = /^u1\.(\d{1,12})\.(\d{1,12})\.([A-Za-z0-9_-]{43})$/.exec(token.trim());
  if (!m) throw new HttpError(400, 'BAD_TOKEN', BAD_TOKEN);
  const userId = Number(m[1]);
  const documentId = Number(m[2]);
  const expected = Buffer.from(signature(ctx, userId, documentId));
  const given = Buffer.from(m[3]);
  if (expected.length !== given.length || !crypto.timingSafeEqual(expected, given))
    throw new HttpError(400, 'BAD_TOKEN', BAD_TOKEN);
  return { userId, documentId };
}

async function tokenTarget(ctx: AppContext, token: string, transaction?: Transaction) {
  const { userId, documentId } = readToken(ctx, token);
  const user = await User.findByPk(userId, { transaction });
  if (!user) throw new HttpError(400, 'BAD_TOKEN', BAD_TOKEN);
  if (!documentId) return { user, doc: null, title: null };
  const doc = await Document.findByPk(documentId, {
    include: [{ model: Revision, as: 'publishedRevision', attributes: ['id', 'title'] }],
    transaction,
  });
  if (!doc)
    throw new HttpError(
      404,
      'NOT_FOUND',
      'The document of this link no longer exists, so there is nothing left to unsubscribe from.',
    );
  const title =
    (doc as Document & { publishedRevision?: Revision }).publishedRevision?.title ?? doc.slug;
  return { user, doc, title };
}

async function tokenState(
  user: User,
  doc: Document | null,
  title: string | null,
  transaction?: Transaction,
) {
  const emailMode = await emailModeOf(user.id, transaction);
  return {
    scope: doc ? ('thread' as const) : ('all' as const),
    displayName: user.displayName,
    document: doc ? { id: doc.id, slug: doc.slug, title } : null,
    subscribed: doc
      ? (await isSubscribed(doc, user.id, transaction)).subscribed
      : emailMode !== 'none',
    emailMode,
  };
}

/** What an unsubscribe link would do, for the confirm page. Changes nothing. */
export async function describeUnsubscribe(ctx: AppContext, token: string) {
  const { user, doc, title } = await tokenTarget(ctx, token);
  return tokenState(user, doc, title);
}

/**
 * Does what an unsubscribe link says: stops the member following the thread, or turns
 * their reply e-mail off. Doing it twice is harmless.
 */
export async function unsubscribe(ctx: AppContext, token: string) {
  return ctx.sequelize.transaction(async (transaction) => {
    const { user, doc, title } = await tokenTarget(ctx, token, transaction);
    if (doc) await setSubscription(doc.id, user.id, false, 'manual', transaction);
    else await setEmailMode(user, 'none', transaction);
    return { ok: true, ...(await tokenState(user, doc, title, transaction)) };
  });
}
