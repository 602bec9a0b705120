/**
 * The daily digest: for each member who chose it, one e-mail with the replies of the
 * last day in the threads they follow. A job in the server process looks every few
 * minutes for members whose digest is due.
 */
import { Op } from 'sequelize';
import type { AppContext } from '../context';
import {
  Document,
  NotificationSetting,
  Reply,
  Revision,
  ThreadSubscription,
  User,
} from '../models';
import { digestMail, type DigestEntry } from '../mail/replyMail';
import { enqueueMail } from './outbox';
import { unsubscribeToken } from './subscriptions';
import { mailDomain, replyLink } from './moderation';

const DAY = 24 * 60 * 60 * 1000;
const CHECK_EVERY_MS = 5 * 60 * 1000;

/** Documents whose thread `userId` follows: rows that say so, and their own published documents. */
async function followedDocumentIds(userId: number) {
  const rows = await ThreadSubscription.findAll({ where: { userId } });
  const optedOut = new Set(rows.filter((r) => !r.active).map((r) => r.documentId));
  const ids = new Set(rows.filter((r) => r.active).map((r) => r.documentId));
  const owned = await Document.findAll({
    attributes: ['id'],
    where: { ownerId: userId, publishedRevisionId: { [Op.ne]: null } },
  });
  for (const d of owned) if (!optedOut.has(d.id)) ids.add(d.id);
  return [...ids];
}

/**
 * Queues the digests that are due at `now`: for every member on the digest whose last
 * one covered up to a day or more ago, the visible replies by others since then, in one
 * e-mail (none when there were none). Each member's window then starts at `now`, in
 * the same transaction as their e-mail, so no reply is sent twice. Resolves with how
 * many e-mails were queued.
 */
export async function sendDigests(ctx: AppContext, now: Date = new Date()): Promise<number> {
  const due = await NotificationSetting.findAll({
    where: {
      emailMode: 'digest',
      [Op.or]: [
        { digestSince: null },
        { digestSince: { [Op.lte]: new Date(now.getTime() - DAY) } },
      ],
    },
  });
  let queued = 0;
  for (const setting of due) {
    const since = setting.digestSince ?? new Date(now.getTime() - DAY);
    const docIds = await followedDocumentIds(setting.userId);
    const sent = await ctx.sequelize.transaction(async (transaction) => {
      // Another run may have sent it meanwhile: move the window only from where we read it.
      const [moved] = await NotificationSetting.update(
        { digestSince: now },
        {
          where: {
            userId: setting.userId,
            emailMode: 'digest',
            digestSince: setting.digestSince ?? null,
          },
          transaction,
        },
      );
      if (!moved) return false;
      const user = await User.findByPk(setting.userId, { transaction });
      if (!user?.emailVerifiedAt || !docIds.length) return false;
      const replies = await Reply.findAll({
        where: {
          documentId: { [Op.in]: docIds },
          authorId: { [Op.ne]: user.id },
          status: 'visible',
          createdAt: { [Op.gt]: since, [Op.lte]: now },
        },
        include: [
          { model: User, as: 'author', attributes: ['id', 'displayName'] },
          {
            model: Document,
            as: 'document',
            attributes: ['id', 'slug', 'publishedRevisionId'],
            include: [{ model: Revision, as: 'publishedRevision', attributes: ['id', 'title'] }],
          },
        ],
        order: [
          ['documentId', 'ASC'],
          ['createdAt', 'ASC'],
        ],
        transaction,
      });
      const entries: DigestEntry[] = [];
      for (const r of replies) {
        const rr = r as Reply & {
          author?: User;
          document?: Document & { publishedRevision?: Revision | null };
        };
        if (!rr.document?.publishedRevisionId) continue;
        entries.push({
          documentTitle: rr.document.publishedRevision?.title || 'Untitled',
          replier: rr.author?.displayName ?? 'A member',
          text: r.body,
          url: replyLink(ctx, rr.document.slug, r.id).url,
          at: r.createdAt,
        });
      }
      if (!entries.length) return false;
      const token = unsubscribeToken(ctx, user.id, 0);
      const mail = digestMail(
        entries,
        `${ctx.config.publicUrl}/unsubscribe?token=${encodeURIComponent(token)}`,
        `${ctx.config.publicUrl}/account/notifications`,
      );
      await enqueueMail(
        {
          ...mail,
          to: user.email,
          kind: 'digest',
          headers: {
            'List-Unsubscribe': `<${ctx.config.publicUrl}/api/unsubscribe?token=${encodeURIComponent(token)}>`,
            'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
          },
        },
        { transaction, domain: mailDomain(ctx) },
      );
      return true;
    });
    if (sent) queued++;
  }
  if (queued) void ctx.outbox.flush();
  return queued;
}

/**
 * Starts the digest job: a check shortly after start (a restarted server catches up)
 * and then every few minutes. Returns the function that stops it.
 */
export function startDigestJob(ctx: AppContext, everyMs = CHECK_EVERY_MS): () => Promise<void> {
  let running: Promise<unknown> = Promise.resolve();
  const run = () => {
    running = running
      .then(() => sendDigests(ctx))
      .catch((err) => ctx.logger.error({ err }, 'the daily digest run failed; it will try again'));
  };
  const first = setTimeout(run, Math.min(everyMs, 30_000));
  const timer = setInterval(run, everyMs);
  first.unref();
  timer.unref();
  return async () => {
    clearTimeout(first);
    clearInterval(timer);
    await running;
  };
}
