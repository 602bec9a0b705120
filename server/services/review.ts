/**
 * Moderator review: the queue, claims, the review view and the three decisions.
 *
 * A moderator never claims or decides their own submission. A claim keeps other
 * moderators from deciding the same item; deciding an unclaimed item claims it in the
 * same statement. Each decision, its audit line and the author's e-mail are one
 * transaction; publishing also supersedes the previously published revision and moves
 * the document's pointer in that transaction.
 */
import { Op, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { conflict, forbidden, notFound } from '../errors';
import { Document, Revision, User } from '../models';
import type { DocumentKind } from '../../shared/schemas/document';
import { diffRevisions } from '../../shared/diff/revisions';
import { composeMail } from '../mail/templates';
import { enqueueMail } from './outbox';
import { audit } from './audit';
import { notify } from './notifications';
import { findingsFor, kindOf, reviewChecklist } from './kinds';
import { revisionJson, userRef } from './documents';
import { indexPublished } from './search';

export type Decision = 'publish' | 'return' | 'decline';

type Moderator = Pick<Express.User, 'id' | 'role'>;

const STATUS_OF: Record<Decision, 'published' | 'returned' | 'declined'> = {
  publish: 'published',
  return: 'returned',
  decline: 'declined',
};

const withPeople = [
  { model: User, as: 'author', attributes: ['id', 'displayName'] },
  { model: User, as: 'reviewer', attributes: ['id', 'displayName'] },
  { model: User, as: 'claimedBy', attributes: ['id', 'displayName'] },
];

const NO_REVISION = 'There is no revision with this number in the review system.';

async function loadRevision(id: number, transaction?: Transaction) {
  const rev = await Revision.findByPk(id, { include: withPeople, transaction });
  if (!rev) throw notFound(NO_REVISION);
  return rev as Revision & {
    author?: User | null;
    claimedBy?: User | null;
    reviewer?: User | null;
  };
}

function ownSubmission(action: string) {
  return forbidden(
    `You wrote this revision, so you cannot ${action} it. Another moderator has to review it.`,
  );
}

function notInReview(rev: Revision) {
  return conflict(
    'NOT_IN_REVIEW',
    rev.status === 'draft'
      ? 'The author withdrew this submission; it is no longer in the queue.'
      : `This revision is no longer waiting for review (it is ${rev.status}). Reload the queue.`,
    { status: rev.status },
  );
}

function claimedByOther(rev: Revision & { claimedBy?: User | null }) {
  const who = rev.claimedBy?.displayName ?? 'another moderator';
  return conflict(
    'CLAIMED',
    `${who} is reviewing this revision. Pick another item from the queue.`,
    {
      claimedBy: userRef(rev.claimedBy),
    },
  );
}

/** Revisions waiting for review, oldest submission first, optionally of one kind. */
export async function listQueue(viewer: Moderator, kind?: DocumentKind) {
  const rows = await Revision.findAll({
    where: { status: 'submitted', ...(kind ? { kind } : {}) },
    order: [
      ['submittedAt', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: 500,
    include: [
      { model: User, as: 'author', attributes: ['id', 'displayName'] },
      { model: User, as: 'claimedBy', attributes: ['id', 'displayName'] },
      { model: Document, as: 'document', attributes: ['id', 'slug', 'publishedRevisionId'] },
    ],
  });
  return rows.map((r) => {
    const rr = r as Revision & { author?: User; claimedBy?: User | null; document?: Document };
    return {
      revisionId: r.id,
      documentId: r.documentId,
      slug: rr.document?.slug ?? null,
      kind: r.kind,
      number: r.number,
      title: r.title,
      author: userRef(rr.author),
      submittedAt: r.submittedAt,
      claimedBy: userRef(rr.claimedBy),
      isUpdate: !!rr.document?.publishedRevisionId,
      own: r.authorId === viewer.id,
    };
  });
}

/** Claims a submission for `moderator`; a claim they already hold is kept. */
export async function claim(ctx: AppContext, moderator: Moderator, revisionId: number) {
  return ctx.sequelize.transaction(async (transaction) => {
    const rev = await loadRevision(revisionId, transaction);
    if (rev.authorId === moderator.id) throw ownSubmission('claim');
    if (rev.status !== 'submitted') throw notInReview(rev);
    const [changed] = await Revision.update(
      { claimedById: moderator.id, claimedAt: new Date() },
      {
        where: {
          id: rev.id,
          status: 'submitted',
          [Op.or]: [{ claimedById: null }, { claimedById: moderator.id }],
        },
        transaction,
      },
    );
    if (changed !== 1) throw claimedByOther(await loadRevision(revisionId, transaction));
    return { revision: revisionJson(await loadRevision(revisionId, transaction)) };
  });
}

/** Gives a claim back to the queue. Releasing what nobody holds is a no-op. */
export async function release(ctx: AppContext, moderator: Moderator, revisionId: number) {
  return ctx.sequelize.transaction(async (transaction) => {
    const rev = await loadRevision(revisionId, transaction);
    if (rev.authorId === moderator.id) throw ownSubmission('release');
    if (rev.claimedById && rev.claimedById !== moderator.id) throw claimedByOther(rev);
    if (rev.claimedById === moderator.id) {
      await Revision.update(
        { claimedById: null, claimedAt: null },
        { where: { id: rev.id, claimedById: moderator.id }, transaction },
      );
    }
    return { revision: revisionJson(await loadRevision(revisionId, transaction)) };
  });
}

/** The revision that was published before `rev`: what a reviewer compares against. */
async function previousPublished(rev: Revision) {
  return Revision.findOne({
    where: {
      documentId: rev.documentId,
      number: { [Op.lt]: rev.number },
      publishedAt: { [Op.ne]: null },
    },
    order: [['number', 'DESC']],
    include: withPeople,
  });
}

/** Everything the review page shows for one revision. */
export async function getReview(ctx: AppContext, moderator: Moderator, revisionId: number) {
  const rev = await loadRevision(revisionId);
  const doc = (await Document.findByPk(rev.documentId, {
    include: [{ model: User, as: 'owner', attributes: ['id', 'displayName'] }],
  }))!;
  const previous = await previousPublished(rev);
  const findings = await findingsFor(ctx, doc.kind, rev.content);
  const own = rev.authorId === moderator.id;
  const claimedByOtherMod = !!rev.claimedById && rev.claimedById !== moderator.id;
  const open = rev.status === 'submitted';
  return {
    document: {
      id: doc.id,
      slug: doc.slug,
      kind: doc.kind,
      kindLabel: kindOf(doc.kind).label,
      owner: userRef((doc as Document & { owner?: User }).owner),
      publishedRevisionId: doc.publishedRevisionId,
    },
    revision: revisionJson(rev, { content: true }),
    previous: previous ? revisionJson(previous, { content: true }) : null,
    diff: diffRevisions(
      doc.kind,
      previous ? { title: previous.title, content: previous.content } : null,
      {
        title: rev.title,
        content: rev.content,
      },
    ),
    findings,
    checklist: reviewChecklist(doc.kind, rev.content, findings),
    actions: {
      canClaim: open && !own && !claimedByOtherMod && rev.claimedById !== moderator.id,
      canDecide: open && !own && !claimedByOtherMod,
      reason: own
        ? 'You wrote this revision; another moderator has to review it.'
        : !open
          ? `This revision is ${rev.status}.`
          : claimedByOtherMod
            ? `${rev.claimedBy?.displayName ?? 'Another moderator'} is reviewing it.`
            : null,
    },
  };
}

function decisionMail(
  ctx: AppContext,
  decision: Decision,
  info: {
    kindLabel: string;
    title: string;
    slug: string;
    number: number;
    note: string | null;
    reviewer: string;
  },
) {
  const docUrl = `${ctx.config.publicUrl}/documents/${encodeURIComponent(info.slug)}`;
  const mineUrl = `${ctx.config.publicUrl}/me/documents`;
  const noteLines = info.note ? [`${info.reviewer} wrote:`, info.note] : [];
  const what = `your ${info.kindLabel} "${info.title}" (revision ${info.number})`;
  switch (decision) {
    case 'publish':
      return composeMail(`Published: ${info.title}`, {
        paragraphs: [
          `Good news: ${info.reviewer} reviewed ${what} and published it. Readers can find it now.`,
          ...noteLines,
        ],
        action: { label: 'Open the published page', url: docUrl },
      });
    case 'return':
      return composeMail(`Returned with a note: ${info.title}`, {
        paragraphs: [
          `${info.reviewer} reviewed ${what} and sent it back to you with a note. Change what it asks for and submit it again.`,
          ...noteLines,
        ],
        action: { label: 'Open my documents', url: mineUrl },
      });
    case 'decline':
      return composeMail(`Declined: ${info.title}`, {
        paragraphs: [`${info.reviewer} reviewed ${what} and declined it.`, ...noteLines],
        action: { label: 'Open my documents', url: mineUrl },
      });
  }
}

/**
 * Publishes, returns or declines a submitted revision. Refused (403) for its own author,
 * (409 CLAIMED) while another moderator holds the claim, and (409 NOT_IN_REVIEW) once
 * it is no longer submitted. Audited and e-mailed to the author in the same transaction.
 */
export async function decide(
  ctx: AppContext,
  moderator: Moderator,
  revisionId: number,
  decision: Decision,
  note: string | undefined,
) {
  const result = await ctx.sequelize.transaction(async (transaction) => {
    const rev = await loadRevision(revisionId, transaction);
    if (rev.authorId === moderator.id) throw ownSubmission(decision);
    if (rev.status !== 'submitted') throw notInReview(rev);
    if (rev.claimedById && rev.claimedById !== moderator.id) throw claimedByOther(rev);
    const doc = (await Document.findByPk(rev.documentId, { transaction }))!;
    const now = new Date();
    const cleanNote = note?.trim() ? note.trim() : null;

    // At most one revision per document is published (a unique index): the old one
    // steps down first; if the decision below is refused, the transaction undoes it.
    let superseded: number | null = null;
    if (decision === 'publish') {
      const [n] = await Revision.update(
        { status: 'superseded' },
        {
          where: { documentId: doc.id, status: 'published', id: { [Op.ne]: rev.id } },
          transaction,
        },
      );
      if (n) superseded = doc.publishedRevisionId;
    }

    const [changed] = await Revision.update(
      {
        status: STATUS_OF[decision],
        reviewerId: moderator.id,
        note: cleanNote,
        decidedAt: now,
        claimedById: moderator.id,
        claimedAt: rev.claimedAt ?? now,
        ...(decision === 'publish' ? { publishedAt: now } : {}),
      },
      {
        where: {
          id: rev.id,
          status: 'submitted',
          [Op.or]: [{ claimedById: null }, { claimedById: moderator.id }],
        },
        transaction,
      },
    );
    if (changed !== 1) {
      const current = await loadRevision(revisionId, transaction);
      if (current.status !== 'submitted') throw notInReview(current);
      throw claimedByOther(current);
    }

    if (decision === 'publish') {
      await doc.update({ publishedRevisionId: rev.id }, { transaction });
      // Readers find it the moment the decision commits, and never before.
      await indexPublished(
        doc,
        { id: rev.id, title: rev.title, content: rev.content, publishedAt: now },
        transaction,
      );
    }

    await audit(
      {
        actorId: moderator.id,
        action: `review.${decision}`,
        targetType: 'revision',
        targetId: rev.id,
        details: {
          documentId: doc.id,
          slug: doc.slug,
          kind: doc.kind,
          number: rev.number,
          authorId: rev.authorId,
          note: cleanNote,
          ...(superseded ? { supersededRevisionId: superseded } : {}),
        },
      },
      transaction,
    );

    const author = await User.findByPk(rev.authorId, { transaction });
    const reviewer = await User.findByPk(moderator.id, { transaction });
    if (author) {
      const mail = decisionMail(ctx, decision, {
        kindLabel: kindOf(doc.kind).label,
        title: rev.title || 'Untitled',
        slug: doc.slug,
        number: rev.number,
        note: cleanNote,
        reviewer: reviewer?.displayName ?? 'A moderator',
      });
      await enqueueMail(
        { ...mail, to: author.email, kind: `review.${decision}` },
        { transaction, domain: new URL(ctx.config.publicUrl).hostname || undefined },
      );
      await notify(
        {
          userId: author.id,
          kind: 'review',
          title: mail.subject,
          body: cleanNote,
          link:
            decision === 'publish' ? `/documents/${encodeURIComponent(doc.slug)}` : '/me/documents',
        },
        transaction,
      );
    }
    return { revision: revisionJson(await loadRevision(revisionId, transaction)) };
  });
  void ctx.outbox.flush();
  return result;
}
