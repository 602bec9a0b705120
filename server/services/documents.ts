/**
 * Documents and their revisions, from the author's side: create, save a draft with
 * optimistic locking, submit, withdraw; and what readers may see.
 *
 * One revision per document at most is open (draft, submitted or returned); the
 * published one stays visible while the next is worked on. `version` rises with every
 * save across all revisions of a document, so a version names one saved state.
 */
import { Op, UniqueConstraintError, literal, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { HttpError, conflict, forbidden, notFound } from '../errors';
import { hasRole } from '../http/access';
import { Document, Revision, User } from '../models';
import type { DocumentKind, RevisionStatus } from '../../shared/schemas/document';
import { OPEN_STATUSES } from '../../shared/schemas/document';
import { findingsFor, kindOf, submitGate } from './kinds';
import { removeFromIndex } from './search';

type Viewer = Pick<Express.User, 'id' | 'role'> | null | undefined;
type Content = Record<string, unknown>;

const EDITABLE: RevisionStatus[] = ['draft', 'returned'];
const RESERVED_SLUGS = new Set(['new', 'edit', 'mine', 'me', 'search', 'queue', 'review']);
const MAX_SLUG = 80;

const NOT_FOUND = 'There is no document at this address, or it is not published yet.';

/** A user as other people see them. */
export function userRef(u: User | null | undefined) {
  return u ? { id: u.id, displayName: u.displayName } : null;
}

/** True for moderators and admins. */
export function isModerator(viewer: Viewer): boolean {
  return !!viewer && hasRole(viewer.role, 'moderator');
}

/**
 * A URL slug from a title: lower case, letters and digits joined by hyphens, accents
 * dropped. Never empty and never all digits (those would read as an id).
 */
export function slugify(title: string, kind: DocumentKind): string {
  const base = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/&/g, ' and ')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, MAX_SLUG)
    .replace(/-+$/, '');
  if (!base) return kind;
  if (/^\d+$/.test(base) || RESERVED_SLUGS.has(base)) return `${kind}-${base}`;
  return base;
}

async function uniqueSlug(base: string, transaction: Transaction): Promise<string> {
  const rows = await Document.findAll({
    attributes: ['slug'],
    where: { slug: { [Op.or]: [base, { [Op.like]: `${base}-%` }] } },
    transaction,
  });
  const taken = new Set(rows.map((r) => r.slug));
  if (!taken.has(base)) return base;
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`;
}

/** The fields of a revision every answer shows; `content` only when asked for. */
export function revisionJson(r: Revision, opts: { content?: boolean } = {}) {
  const rr = r as Revision & {
    reviewer?: User | null;
    author?: User | null;
    claimedBy?: User | null;
  };
  return {
    id: r.id,
    documentId: r.documentId,
    number: r.number,
    status: r.status,
    version: r.version,
    title: r.title,
    note: r.note,
    authorId: r.authorId,
    author: rr.author !== undefined ? userRef(rr.author) : undefined,
    reviewer: rr.reviewer !== undefined ? userRef(rr.reviewer) : undefined,
    claimedBy: rr.claimedBy !== undefined ? userRef(rr.claimedBy) : undefined,
    submittedAt: r.submittedAt,
    decidedAt: r.decidedAt,
    publishedAt: r.publishedAt,
    createdAt: r.createdAt,
    updatedAt: r.updatedAt,
    ...(opts.content ? { content: r.content } : {}),
  };
}

const withPeople = [
  { model: User, as: 'author', attributes: ['id', 'displayName'] },
  { model: User, as: 'reviewer', attributes: ['id', 'displayName'] },
  { model: User, as: 'claimedBy', attributes: ['id', 'displayName'] },
];

async function reload(id: number, transaction?: Transaction) {
  return (await Revision.findByPk(id, { include: withPeople, transaction }))!;
}

function parseIdOrSlug(idOrSlug: string): { id: number } | { slug: string } {
  return /^\d{1,12}$/.test(idOrSlug) ? { id: Number(idOrSlug) } : { slug: idOrSlug.toLowerCase() };
}

/** The open revision of a document (draft, submitted or returned), if any. */
export async function openRevision(documentId: number, transaction?: Transaction) {
  return Revision.findOne({
    where: { documentId, status: OPEN_STATUSES as RevisionStatus[] },
    transaction,
  });
}

async function latestRevision(documentId: number, transaction?: Transaction) {
  return Revision.findOne({ where: { documentId }, order: [['number', 'DESC']], transaction });
}

/**
 * The document for an author-only route. Someone else gets 404 while nothing is
 * published (a guessed id reveals nothing) and 403 once the document is public.
 */
async function loadOwned(user: Viewer, id: number, transaction?: Transaction): Promise<Document> {
  const doc = await Document.findByPk(id, { transaction });
  if (!doc || !user) throw notFound(NOT_FOUND);
  if (doc.ownerId !== user.id) {
    if (!doc.publishedRevisionId) throw notFound(NOT_FOUND);
    throw forbidden(
      'Only the author of this document can change it. Reply to it instead, or flag it for a moderator.',
    );
  }
  return doc;
}

/** The kind of a document its author is about to save (404/403 for anyone else). */
export async function ownedDocumentKind(user: Viewer, id: number): Promise<DocumentKind> {
  return (await loadOwned(user, id)).kind;
}

/** Creates a document and its first revision, a draft by `user`. */
export async function createDocument(
  ctx: AppContext,
  user: Pick<Express.User, 'id'>,
  input: { kind: DocumentKind; title: string; content: Content },
) {
  const base = slugify(input.title, input.kind);
  for (let attempt = 0; ; attempt++) {
    try {
      return await ctx.sequelize.transaction(async (transaction) => {
        const slug = await uniqueSlug(base, transaction);
        const doc = await Document.create(
          { kind: input.kind, slug, ownerId: user.id, publishedRevisionId: null },
          { transaction },
        );
        const rev = await Revision.create(
          {
            documentId: doc.id,
            kind: input.kind,
            number: 1,
            title: input.title,
            content: input.content,
            status: 'draft',
            authorId: user.id,
            version: 1,
          },
          { transaction },
        );
        return {
          id: doc.id,
          slug: doc.slug,
          kind: doc.kind,
          revision: { id: rev.id, number: rev.number, status: rev.status, version: rev.version },
        };
      });
    } catch (err) {
      // Another process took the same slug between the look-up and the insert.
      if (err instanceof UniqueConstraintError && attempt < 3) continue;
      throw err;
    }
  }
}

/**
 * The document view readers see: the published revision, or revision `number` for
 * its author and moderators. Drafts and submissions are 404 for everyone else.
 */
export async function getDocumentView(
  ctx: AppContext,
  viewer: Viewer,
  idOrSlug: string,
  number?: number,
) {
  const doc = await Document.findOne({
    where: parseIdOrSlug(idOrSlug),
    include: [{ model: User, as: 'owner', attributes: ['id', 'displayName'] }],
  });
  if (!doc) throw notFound(NOT_FOUND);
  const privileged = !!viewer && (viewer.id === doc.ownerId || isModerator(viewer));
  let rev: Revision | null;
  if (number !== undefined) {
    rev = await Revision.findOne({ where: { documentId: doc.id, number }, include: withPeople });
    if (rev && !privileged && rev.id !== doc.publishedRevisionId) rev = null;
    if (!rev)
      throw notFound(
        privileged
          ? `This document has no revision ${number}.`
          : 'That revision is not public. Open the document without a revision number to read the published one.',
      );
  } else {
    rev = doc.publishedRevisionId
      ? await Revision.findByPk(doc.publishedRevisionId, { include: withPeople })
      : null;
    if (!rev) throw notFound(NOT_FOUND);
  }
  const def = kindOf(doc.kind);
  const owner = (doc as Document & { owner?: User }).owner;
  const r = rev as Revision & { reviewer?: User | null };
  return {
    id: doc.id,
    slug: doc.slug,
    kind: doc.kind,
    title: rev.title,
    content: rev.content,
    summary: def.summary(rev.title, rev.content),
    owner: userRef(owner),
    revision: {
      id: rev.id,
      number: rev.number,
      status: rev.status,
      version: rev.version,
      publishedAt: rev.publishedAt,
      updatedAt: rev.updatedAt,
      reviewer: userRef(r.reviewer),
    },
    publishedRevisionId: doc.publishedRevisionId,
    findings: await findingsFor(ctx, doc.kind, rev.content),
  };
}

function documentJson(doc: Document, published: Revision | null) {
  return {
    id: doc.id,
    slug: doc.slug,
    kind: doc.kind,
    ownerId: doc.ownerId,
    publishedRevisionId: doc.publishedRevisionId,
    published: published
      ? {
          id: published.id,
          number: published.number,
          version: published.version,
          publishedAt: published.publishedAt,
        }
      : null,
    createdAt: doc.createdAt,
  };
}

/**
 * What the editor opens: the open revision, or when there is none the published one
 * (or the newest, for a document never published) to start the next draft from.
 */
export async function getEditor(user: Viewer, id: number) {
  const doc = await loadOwned(user, id);
  const published = doc.publishedRevisionId
    ? await Revision.findByPk(doc.publishedRevisionId)
    : null;
  const open = await openRevision(doc.id);
  const rev = open ?? published ?? (await latestRevision(doc.id));
  return {
    document: documentJson(doc, published),
    revision: rev ? revisionJson(await reload(rev.id), { content: true }) : null,
  };
}

function versionConflict(current: Revision) {
  return conflict(
    'VERSION_CONFLICT',
    'This document was saved somewhere else since you opened it (another tab or device). Nothing was overwritten: compare your changes with the saved version, then save again.',
    { current: revisionJson(current, { content: true }) },
  );
}

function notEditable(current: Revision) {
  return conflict(
    'NOT_EDITABLE',
    'This revision is waiting for review and cannot be changed. Withdraw the submission first if you want to edit it.',
    { current: revisionJson(current, { content: true }) },
  );
}

/**
 * Saves the author's draft. `version` is the version the editor started from; when it
 * is stale nothing is written and the stored revision comes back in the 409. The
 * compare-and-set is one UPDATE … WHERE version = ?, so of any number of saves from
 * the same version exactly one wins. With no open revision, a new draft starts from
 * the published (or newest) one.
 */
export async function saveDraft(
  ctx: AppContext,
  user: Viewer,
  id: number,
  input: { title: string; content: Content; version: number },
) {
  await loadOwned(user, id);
  try {
    return await ctx.sequelize.transaction(async (transaction) => {
      const open = await openRevision(id, transaction);
      if (open) {
        if (open.status === 'submitted') throw notEditable(await reload(open.id, transaction));
        const [changed] = await Revision.update(
          {
            title: input.title,
            content: input.content,
            version: literal('version + 1') as unknown as number,
          },
          { where: { id: open.id, version: input.version, status: EDITABLE }, transaction },
        );
        if (changed !== 1) throw versionConflict(await reload(open.id, transaction));
        return { revision: revisionJson(await reload(open.id, transaction), { content: true }) };
      }
      const doc = (await Document.findByPk(id, { transaction }))!;
      const base =
        (doc.publishedRevisionId
          ? await Revision.findByPk(doc.publishedRevisionId, { transaction })
          : null) ?? (await latestRevision(id, transaction));
      if (!base) throw notFound(NOT_FOUND);
      if (base.version !== input.version) throw versionConflict(await reload(base.id, transaction));
      const maxVersion =
        ((await Revision.max('version', { where: { documentId: id }, transaction })) as number) ??
        0;
      const maxNumber =
        ((await Revision.max('number', { where: { documentId: id }, transaction })) as number) ?? 0;
      const rev = await Revision.create(
        {
          documentId: id,
          kind: doc.kind,
          number: maxNumber + 1,
          title: input.title,
          content: input.content,
          status: 'draft',
          authorId: doc.ownerId,
          version: maxVersion + 1,
        },
        { transaction },
      );
      await doc.update({ updatedAt: new Date() }, { transaction });
      return { revision: revisionJson(await reload(rev.id, transaction), { content: true }) };
    });
  } catch (err) {
    // Another save opened the new draft first: that is a conflict, not a failure.
    if (err instanceof UniqueConstraintError) {
      const open = await openRevision(id);
      if (open) throw versionConflict(await reload(open.id));
    }
    throw err;
  }
}

/**
 * Sends the open revision to review. An adapter whose check has errors is refused (422).
 * With `version` (the version the editor last saved) a revision saved elsewhere since is
 * refused with 409 VERSION_CONFLICT and the stored revision, as a stale draft save is.
 */
export async function submit(
  ctx: AppContext,
  user: Viewer,
  id: number,
  input: { version?: number } = {},
) {
  const doc = await loadOwned(user, id);
  const open = await openRevision(doc.id);
  if (!open)
    throw conflict(
      'NOTHING_TO_SUBMIT',
      'There is no draft to submit: every revision of this document has been decided. Edit it to start a new draft.',
    );
  if (open.status === 'submitted')
    throw conflict('ALREADY_SUBMITTED', 'This revision is already waiting for review.', {
      current: revisionJson(await reload(open.id)),
    });
  if (input.version !== undefined && input.version !== open.version)
    throw versionConflict(await reload(open.id));
  if (!open.title.trim())
    throw new HttpError(422, 'TITLE_MISSING', 'Give the document a title before you submit it.', {
      field: 'title',
    });
  await submitGate(ctx, doc.kind, open.content);
  return ctx.sequelize.transaction(async (transaction) => {
    // Only the content that was checked may go to review.
    const [changed] = await Revision.update(
      { status: 'submitted', submittedAt: new Date(), claimedById: null, claimedAt: null },
      { where: { id: open.id, version: open.version, status: EDITABLE }, transaction },
    );
    if (changed !== 1) {
      const current = await reload(open.id, transaction);
      if (current.status === 'submitted')
        throw conflict('ALREADY_SUBMITTED', 'This revision is already waiting for review.', {
          current: revisionJson(current),
        });
      throw versionConflict(current);
    }
    return { revision: revisionJson(await reload(open.id, transaction)) };
  });
}

/** Takes a submission back to draft, so the author can change it. */
export async function withdraw(ctx: AppContext, user: Viewer, id: number) {
  const doc = await loadOwned(user, id);
  return ctx.sequelize.transaction(async (transaction) => {
    const open = await openRevision(doc.id, transaction);
    if (!open || open.status !== 'submitted')
      throw conflict(
        'NOT_SUBMITTED',
        'Nothing of this document is waiting for review, so there is nothing to withdraw.',
      );
    const [changed] = await Revision.update(
      { status: 'draft', submittedAt: null, claimedById: null, claimedAt: null },
      { where: { id: open.id, status: 'submitted' }, transaction },
    );
    if (changed !== 1)
      throw conflict(
        'NOT_SUBMITTED',
        'The submission was decided a moment ago; reload to see how.',
      );
    return { revision: revisionJson(await reload(open.id, transaction)) };
  });
}

/** Every revision of a document, newest first: for its author and moderators. */
export async function listRevisions(user: Viewer, id: number) {
  const doc = await Document.findByPk(id);
  if (!doc || !user) throw notFound(NOT_FOUND);
  if (doc.ownerId !== user.id && !isModerator(user)) {
    if (!doc.publishedRevisionId) throw notFound(NOT_FOUND);
    throw forbidden('Only the author and moderators can see the revisions of a document.');
  }
  const rows = await Revision.findAll({
    where: { documentId: id },
    order: [['number', 'DESC']],
    include: [{ model: User, as: 'reviewer', attributes: ['id', 'displayName'] }],
  });
  return rows.map((r) => ({
    id: r.id,
    number: r.number,
    status: r.status,
    title: r.title,
    note: r.note,
    reviewer: userRef((r as Revision & { reviewer?: User | null }).reviewer),
    submittedAt: r.submittedAt,
    decidedAt: r.decidedAt,
    publishedAt: r.publishedAt,
    updatedAt: r.updatedAt,
    version: r.version,
  }));
}

/** The signed-in member's documents with the state of each one's newest revision, most recently touched first. */
export async function listMine(user: Pick<Express.User, 'id'>) {
  const docs = await Document.findAll({ where: { ownerId: user.id } });
  if (!docs.length) return [];
  const revisions = await Revision.findAll({
    where: { documentId: docs.map((d) => d.id) },
    attributes: [
      'id',
      'documentId',
      'number',
      'status',
      'note',
      'title',
      'version',
      'updatedAt',
      'submittedAt',
      'decidedAt',
    ],
    order: [['number', 'DESC']],
  });
  const latest = new Map<number, Revision>();
  for (const r of revisions) if (!latest.has(r.documentId)) latest.set(r.documentId, r);
  return docs
    .map((d) => {
      const r = latest.get(d.id)!;
      return {
        id: d.id,
        slug: d.slug,
        kind: d.kind,
        title: r.title,
        published: d.publishedRevisionId !== null,
        latest: {
          id: r.id,
          number: r.number,
          status: r.status,
          note: r.note,
          version: r.version,
          submittedAt: r.submittedAt,
          decidedAt: r.decidedAt,
          updatedAt: r.updatedAt,
        },
      };
    })
    .sort((a, b) => +new Date(b.latest.updatedAt) - +new Date(a.latest.updatedAt));
}

/**
 * Takes a published document down and gives it back to its author with a moderator's
 * note (a flag upheld). With no open revision the published one becomes `returned`;
 * when a newer revision is already open, that one is returned and the published one
 * superseded. Readers see nothing until the author submits again and it is published.
 * Runs in the caller's transaction; the caller audits and tells the author.
 */
export async function returnPublishedDocument(
  input: { documentId: number; moderatorId: number; note: string },
  transaction: Transaction,
) {
  const doc = await Document.findByPk(input.documentId, { transaction });
  if (!doc?.publishedRevisionId)
    throw conflict(
      'NOT_PUBLISHED',
      'This document is no longer published, so there is nothing to return to its author.',
    );
  const published = (await Revision.findByPk(doc.publishedRevisionId, { transaction }))!;
  const open = await openRevision(doc.id, transaction);
  const decision = {
    status: 'returned' as const,
    reviewerId: input.moderatorId,
    note: input.note,
    decidedAt: new Date(),
    claimedById: null,
    claimedAt: null,
  };
  let returned: Revision;
  if (open) {
    await published.update({ status: 'superseded' }, { transaction });
    returned = await open.update(decision, { transaction });
  } else {
    returned = await published.update(decision, { transaction });
  }
  await doc.update({ publishedRevisionId: null }, { transaction });
  await removeFromIndex(doc.id, transaction);
  return {
    documentId: doc.id,
    revisionId: returned.id,
    number: returned.number,
    title: returned.title,
  };
}
