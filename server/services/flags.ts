/**
 * Flags: a signed-in reader reports a published document or a reply to the moderators,
 * with a reason from a short list and a note. Flags form their own queue. Resolving one
 * (dismiss, hide the reply, return the document to its author) closes every open flag
 * on the same target, is audited, tells the reporters in the app and, where it changes
 * something, e-mails the author.
 */
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { Op, UniqueConstraintError } from 'sequelize';
import type { AppContext } from '../context';
import { HttpError, conflict, forbidden, notFound } from '../errors';
import { Document, Flag, Reply, Revision, User } from '../models';
import {
  FLAG_REASON_LABELS,
  type CreateFlagInput,
  type ResolveFlagInput,
} from '../../shared/schemas/replies';
import { documentReturnedMail } from '../mail/replyMail';
import { returnPublishedDocument, userRef } from './documents';
import { audit } from './audit';
import { enqueueMail } from './outbox';
import { notify } from './notifications';
import { closeOpenFlags, documentTitle, hideReplyTx, mailDomain, replyLink } from './moderation';

type Member = Pick<Express.User, 'id' | 'role'>;

/** Flags one member may raise per hour. */
export const FLAG_LIMIT_PER_HOUR = 20;
const limiters = new WeakMap<AppContext, RateLimiterMemory>();

async function consumeFlagQuota(ctx: AppContext, userId: number) {
  let l = limiters.get(ctx);
  if (!l) {
    l = new RateLimiterMemory({ points: FLAG_LIMIT_PER_HOUR, duration: 3600, keyPrefix: 'flag' });
    limiters.set(ctx, l);
  }
  try {
    await l.consume(String(userId));
  } catch (err) {
    if (!(err instanceof RateLimiterRes)) throw err;
    const minutes = Math.max(1, Math.ceil(err.msBeforeNext / 60_000));
    throw new HttpError(
      429,
      'FLAG_LIMIT',
      `You have raised ${FLAG_LIMIT_PER_HOUR} flags in the last hour. Moderators will work through them; you can flag more in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
    );
  }
}

const NOT_PUBLISHED = 'There is no published document with this number to flag.';

/** `POST /api/flags`: raises a flag on a published document or on a visible reply. */
export async function createFlag(ctx: AppContext, user: Member, input: CreateFlagInput) {
  let documentId: number;
  let replyId: number | null = null;
  if (input.targetType === 'document') {
    const doc = await Document.findByPk(input.targetId);
    if (!doc?.publishedRevisionId) throw notFound(NOT_PUBLISHED);
    if (doc.ownerId === user.id)
      throw conflict('OWN_CONTENT', 'This is your own document: edit it instead of flagging it.');
    documentId = doc.id;
  } else {
    const reply = await Reply.findByPk(input.targetId);
    const doc = reply ? await Document.findByPk(reply.documentId) : null;
    if (!reply || !doc?.publishedRevisionId)
      throw notFound('There is no reply with this number under a published document.');
    if (reply.authorId === user.id)
      throw conflict(
        'OWN_CONTENT',
        'This is your own reply: edit or delete it instead of flagging it.',
      );
    if (reply.status !== 'visible')
      throw conflict(
        'NOT_VISIBLE',
        reply.status === 'hidden'
          ? 'A moderator has already hidden this reply.'
          : 'Its author deleted this reply; there is nothing left to flag.',
      );
    documentId = doc.id;
    replyId = reply.id;
  }
  await consumeFlagQuota(ctx, user.id);
  const targetKey = `${input.targetType}:${input.targetId}`;
  try {
    const flag = await Flag.create({
      targetType: input.targetType,
      targetKey,
      documentId,
      replyId,
      reporterId: user.id,
      reason: input.reason,
      note: input.note?.trim() || null,
    });
    return {
      flag: { id: flag.id, status: flag.status, targetType: flag.targetType, reason: flag.reason },
    };
  } catch (err) {
    if (err instanceof UniqueConstraintError)
      throw conflict(
        'ALREADY_FLAGGED',
        'You have already flagged this and a moderator has not looked at it yet. Thank you; there is no need to flag it again.',
      );
    throw err;
  }
}

type FlagRow = Flag & {
  reporter?: User | null;
  resolvedBy?: User | null;
  document?: (Document & { owner?: User | null }) | null;
  reply?: (Reply & { author?: User | null }) | null;
};

/** `GET /api/flags?status=`: open flags oldest first, or resolved ones newest first, with what they point at. */
export async function listFlags(moderator: Member, status: 'open' | 'resolved' | 'all') {
  const rows = (await Flag.findAll({
    where: status === 'all' ? {} : { status },
    order:
      status === 'open'
        ? [
            ['createdAt', 'ASC'],
            ['id', 'ASC'],
          ]
        : [['id', 'DESC']],
    limit: 300,
    include: [
      { model: User, as: 'reporter', attributes: ['id', 'displayName'] },
      { model: User, as: 'resolvedBy', attributes: ['id', 'displayName'] },
      {
        model: Document,
        as: 'document',
        attributes: ['id', 'slug', 'kind', 'ownerId', 'publishedRevisionId'],
        include: [{ model: User, as: 'owner', attributes: ['id', 'displayName'] }],
      },
      {
        model: Reply,
        as: 'reply',
        include: [{ model: User, as: 'author', attributes: ['id', 'displayName'] }],
      },
    ],
  })) as FlagRow[];
  const docIds = [...new Set(rows.map((r) => r.documentId))];
  const titles = new Map<number, string>();
  if (docIds.length) {
    const revs = await Revision.findAll({
      where: { documentId: { [Op.in]: docIds } },
      attributes: ['documentId', 'number', 'title'],
      order: [['number', 'DESC']],
    });
    for (const r of revs) if (!titles.has(r.documentId)) titles.set(r.documentId, r.title);
  }
  const openCounts = new Map<string, number>();
  for (const f of await Flag.findAll({ where: { status: 'open' }, attributes: ['targetKey'] }))
    openCounts.set(f.targetKey, (openCounts.get(f.targetKey) ?? 0) + 1);

  return rows.map((f) => {
    const ownerId = f.reply ? f.reply.authorId : f.document?.ownerId;
    return {
      id: f.id,
      targetType: f.targetType,
      reason: f.reason,
      reasonLabel: FLAG_REASON_LABELS[f.reason] ?? f.reason,
      note: f.note,
      status: f.status,
      action: f.action,
      resolutionNote: f.resolutionNote,
      createdAt: f.createdAt,
      resolvedAt: f.resolvedAt,
      reporter: userRef(f.reporter),
      resolvedBy: userRef(f.resolvedBy),
      openOnTarget: openCounts.get(f.targetKey) ?? 0,
      own: ownerId === moderator.id,
      document: f.document
        ? {
            id: f.document.id,
            slug: f.document.slug,
            kind: f.document.kind,
            title: titles.get(f.document.id) ?? 'Untitled',
            published: !!f.document.publishedRevisionId,
            owner: userRef(f.document.owner),
          }
        : null,
      reply: f.reply
        ? {
            id: f.reply.id,
            status: f.reply.status,
            author: userRef(f.reply.author),
            body: f.reply.body,
            bodyHtml: f.reply.bodyHtml,
            createdAt: f.reply.createdAt,
          }
        : null,
    };
  });
}

/**
 * `POST /api/flags/:id/resolve`. `hide-reply` is for flags on replies and
 * `return-document` for flags on documents; a moderator never resolves a flag on their
 * own content. Closes every open flag on the target, audited, in one transaction.
 */
export async function resolveFlag(
  ctx: AppContext,
  moderator: Member,
  flagId: number,
  input: ResolveFlagInput,
) {
  const result = await ctx.sequelize.transaction(async (transaction) => {
    const flag = await Flag.findByPk(flagId, { transaction });
    if (!flag) throw notFound('There is no flag with this number.');
    if (flag.status !== 'open')
      throw conflict(
        'ALREADY_RESOLVED',
        'Another moderator has already resolved this flag. Reload the queue.',
      );
    const doc = (await Document.findByPk(flag.documentId, { transaction }))!;
    const reply = flag.replyId ? await Reply.findByPk(flag.replyId, { transaction }) : null;
    const ownerId = reply ? reply.authorId : doc.ownerId;
    if (ownerId === moderator.id)
      throw forbidden(
        'This flag is about your own writing, so another moderator has to resolve it.',
      );
    if (input.action === 'hide-reply' && flag.targetType !== 'reply')
      throw new HttpError(
        400,
        'VALIDATION',
        'Only a flag on a reply can hide a reply. Dismiss it or return the document instead.',
        [{ path: 'action', message: 'This flag is about a document.' }],
      );
    if (input.action === 'return-document' && flag.targetType !== 'document')
      throw new HttpError(
        400,
        'VALIDATION',
        'Only a flag on a document can return the document. Hide the reply or dismiss the flag instead.',
        [{ path: 'action', message: 'This flag is about a reply.' }],
      );

    const title = await documentTitle(doc, transaction);
    const note = input.note?.trim() || null;
    let changed = false;
    let link = `/documents/${encodeURIComponent(doc.slug)}`;

    if (input.action === 'hide-reply' && reply) {
      link = replyLink(ctx, doc.slug, reply.id).path;
      changed = await hideReplyTx(ctx, moderator, reply, note!, transaction, { flagId: flag.id });
    } else if (input.action === 'return-document') {
      const returned = await returnPublishedDocument(
        { documentId: doc.id, moderatorId: moderator.id, note: note! },
        transaction,
      );
      changed = true;
      link = '/me/documents';
      const owner = await User.findByPk(doc.ownerId, { transaction });
      const mod = await User.findByPk(moderator.id, { transaction });
      await notify(
        {
          userId: doc.ownerId,
          kind: 'moderation',
          title: `Returned after a flag: ${title}`,
          body: note,
          link: '/me/documents',
        },
        transaction,
      );
      if (owner?.emailVerifiedAt) {
        const mail = documentReturnedMail({
          documentTitle: title,
          note: note!,
          moderator: mod?.displayName ?? 'A moderator',
          url: `${ctx.config.publicUrl}/me/documents`,
        });
        await enqueueMail(
          { ...mail, to: owner.email, kind: 'flag.return' },
          { transaction, domain: mailDomain(ctx) },
        );
      }
      await audit(
        {
          actorId: moderator.id,
          action: 'review.return',
          targetType: 'revision',
          targetId: returned.revisionId,
          details: {
            documentId: doc.id,
            slug: doc.slug,
            number: returned.number,
            note,
            flagId: flag.id,
          },
        },
        transaction,
      );
    }

    const closed = await closeOpenFlags(
      flag.targetKey,
      {
        action: input.action,
        note,
        moderatorId: moderator.id,
        title,
        link: input.action === 'return-document' ? null : link,
      },
      transaction,
    );
    await audit(
      {
        actorId: moderator.id,
        action: `flag.${input.action}`,
        targetType: 'flag',
        targetId: flag.id,
        details: {
          target: flag.targetKey,
          documentId: doc.id,
          slug: doc.slug,
          replyId: flag.replyId,
          reason: flag.reason,
          note,
          changed,
          closed: closed.map((f) => f.id),
        },
      },
      transaction,
    );
    const after = (await Flag.findByPk(flag.id, { transaction }))!;
    return {
      flag: {
        id: after.id,
        status: after.status,
        action: after.action,
        resolutionNote: after.resolutionNote,
        resolvedAt: after.resolvedAt,
      },
      closed: closed.length,
      changed,
    };
  });
  void ctx.outbox.flush();
  return result;
}
