import type { AppContext } from '../context';
import type { User } from '../models';
import type { DocumentKind } from '../../shared/schemas/document';
import { slugify } from '../services/documents';
import { audit } from '../services/audit';
import { indexPublished } from '../services/search';

const DAY = 24 * 60 * 60 * 1000;

/** One demo revision: where it stands in the review workflow, and when. */
export interface DemoRevision {
  title: string;
  content: Record<string, unknown>;
  state: 'draft' | 'submitted' | 'returned' | 'published' | 'declined';
  /** Days before now the revision was submitted. */
  daysAgo: number;
  reviewer?: User;
  note?: string;
}

export interface DemoDocument {
  kind: DocumentKind;
  author: User;
  /** Oldest first. A published revision followed by a later published one becomes superseded. */
  revisions: DemoRevision[];
  /** Defaults to the slug of the first title. */
  slug?: string;
}

/**
 * Writes a demo document with its revision history straight to the database, as if it
 * had gone through the workflow: statuses, reviewer, dates, the published pointer and
 * the moderator's audit lines. Sends no e-mail. Returns the document's id and slug.
 */
export async function seedDocument(ctx: AppContext, doc: DemoDocument) {
  const { Document, Revision } = ctx.models;
  const slug = doc.slug ?? slugify(doc.revisions[0].title, doc.kind);
  return ctx.sequelize.transaction(async (transaction) => {
    const first = new Date(Date.now() - (doc.revisions[0].daysAgo + 1) * DAY);
    const document = await Document.create(
      {
        kind: doc.kind,
        slug,
        ownerId: doc.author.id,
        publishedRevisionId: null,
        createdAt: first,
        updatedAt: first,
      },
      { transaction, silent: true },
    );
    let published: InstanceType<typeof Revision> | null = null;
    for (const [i, r] of doc.revisions.entries()) {
      const submittedAt = new Date(Date.now() - r.daysAgo * DAY);
      const decided = r.state === 'published' || r.state === 'returned' || r.state === 'declined';
      const decidedAt = decided ? new Date(submittedAt.getTime() + DAY / 3) : null;
      const laterPublished = doc.revisions.slice(i + 1).some((x) => x.state === 'published');
      const status = r.state === 'published' && laterPublished ? 'superseded' : r.state;
      const rev = await Revision.create(
        {
          documentId: document.id,
          kind: doc.kind,
          number: i + 1,
          title: r.title,
          content: r.content,
          status,
          authorId: doc.author.id,
          reviewerId: decided ? (r.reviewer?.id ?? null) : null,
          note: r.note ?? null,
          submittedAt: r.state === 'draft' ? null : submittedAt,
          decidedAt,
          publishedAt: r.state === 'published' ? decidedAt : null,
          claimedById: decided ? (r.reviewer?.id ?? null) : null,
          claimedAt: decided ? submittedAt : null,
          version: i + 1,
          createdAt: new Date(submittedAt.getTime() - DAY / 2),
          updatedAt: decidedAt ?? submittedAt,
        },
        { transaction, silent: true },
      );
      if (status === 'published') published = rev;
      if (decided && r.reviewer) {
        const action =
          r.state === 'published' ? 'publish' : r.state === 'returned' ? 'return' : 'decline';
        await audit(
          {
            actorId: r.reviewer.id,
            action: `review.${action}`,
            targetType: 'revision',
            targetId: rev.id,
            details: {
              documentId: document.id,
              slug,
              kind: doc.kind,
              number: rev.number,
              note: r.note ?? null,
            },
          },
          transaction,
        );
      }
    }
    if (published) {
      await document.update({ publishedRevisionId: published.id }, { transaction, silent: true });
      await indexPublished(document, published, transaction);
    }
    return { id: document.id, slug };
  });
}
