/**
 * What moderators do to replies and what closes flags, shared by the reply routes and
 * the flag queue. Every function here runs inside the caller's transaction.
 */
import { Op, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { Document, Flag, Reply, Revision, User } from '../models';
import type { FlagAction } from '../../shared/schemas/replies';
import { replyHiddenMail } from '../mail/replyMail';
import { audit } from './audit';
import { enqueueMail } from './outbox';
import { notify } from './notifications';

type Moderator = Pick<Express.User, 'id'>;

/** The domain Message-IDs are made in: the public URL's host. */
export function mailDomain(ctx: AppContext) {
  try {
    return new URL(ctx.config.publicUrl).hostname || undefined;
  } catch {
    return undefined;
  }
}

/** The title readers see for a document: its published revision's, or its newest one's. */
export async function documentTitle(doc: Document, transaction?: Transaction): Promise<string> {
  const rev = doc.publishedRevisionId
    ? await Revision.findByPk(doc.publishedRevisionId, { attributes: ['title'], transaction })
    : await Revision.findOne({
        where: { documentId: doc.id },
        order: [['number', 'DESC']],
        attributes: ['title'],
        transaction,
      });
  return rev?.title || 'Untitled';
}

/** The page address of a reply, as a path and as a full URL. */
export function replyLink(ctx: AppContext, slug: string, replyId: number) {
  const path = `/documents/${encodeURIComponent(slug)}#reply-${replyId}`;
  return { path, url: `${ctx.config.publicUrl}${path}` };
}

/**
 * Hides a reply with a reason: readers see "hidden by a moderator". Audited; the
 * reply's author is told in the app and by e-mail. A hidden reply stops being the
 * answer. Returns false when it was not visible (nothing changed).
 */
export async function hideReplyTx(
  ctx: AppContext,
  moderator: Moderator,
  reply: Reply,
  reason: string,
  transaction: Transaction,
  via: { flagId?: number } = {},
): Promise<boolean> {
  if (reply.status !== 'visible') return false;
  await reply.update(
    {
      status: 'hidden',
      hiddenReason: reason,
      hiddenById: moderator.id,
      hiddenAt: new Date(),
      isAnswer: false,
    },
    { transaction },
  );
  const doc = (await Document.findByPk(reply.documentId, { transaction }))!;
  const title = await documentTitle(doc, transaction);
  await audit(
    {
      actorId: moderator.id,
      action: 'reply.hide',
      targetType: 'reply',
      targetId: reply.id,
      details: { documentId: doc.id, slug: doc.slug, authorId: reply.authorId, reason, ...via },
    },
    transaction,
  );
  if (reply.authorId !== moderator.id) {
    const link = replyLink(ctx, doc.slug, reply.id);
    await notify(
      {
        userId: reply.authorId,
        kind: 'moderation',
        title: `A moderator hid your reply under "${title}"`,
        body: reason,
        link: link.path,
      },
      transaction,
    );
    const author = await User.findByPk(reply.authorId, { transaction });
    const mod = await User.findByPk(moderator.id, { transaction });
    if (author?.emailVerifiedAt) {
      const mail = replyHiddenMail({
        documentTitle: title,
        reason,
        moderator: mod?.displayName ?? 'A moderator',
        url: link.url,
      });
      await enqueueMail(
        { ...mail, to: author.email, kind: 'reply.hidden' },
        { transaction, domain: mailDomain(ctx) },
      );
    }
  }
  return true;
}

const OUTCOME: Record<FlagAction, string> = {
  dismiss: 'a moderator looked and left it as it is',
  'hide-reply': 'a moderator hid the reply',
  'return-document': 'a moderator returned the document to its author',
};

/**
 * Resolves every open flag on one target with the same outcome and tells each reporter
 * what came of it. Returns the flags it closed.
 */
export async function closeOpenFlags(
  targetKey: string,
  outcome: {
    action: FlagAction;
    note: string | null;
    moderatorId: number;
    title: string;
    link: string | null;
  },
  transaction: Transaction,
) {
  const open = await Flag.findAll({ where: { targetKey, status: 'open' }, transaction });
  if (!open.length) return [];
  await Flag.update(
    {
      status: 'resolved',
      action: outcome.action,
      resolutionNote: outcome.note,
      resolvedById: outcome.moderatorId,
      resolvedAt: new Date(),
    },
    { where: { id: { [Op.in]: open.map((f) => f.id) } }, transaction },
  );
  const reporters = [...new Set(open.map((f) => f.reporterId))];
  await notify(
    reporters.map((userId) => ({
      userId,
      kind: 'flag' as const,
      title: `Your flag on "${outcome.title}": ${OUTCOME[outcome.action]}`,
      body: outcome.action === 'dismiss' ? null : outcome.note,
      link: outcome.link,
    })),
    transaction,
  );
  return open;
}
