/**
 * Documents and their revisions: the request bodies of the document and review routes,
 * and the content schema of each kind. The client's forms use the same schemas.
 */
import { z } from 'zod';
import { connectorContentSchema } from './connector';
import { writeupContentSchema } from './writeup';
import { adapterCheckInputSchema } from './adapter';
import { imageNotesSchema } from '../writeup/imageNotes';

export const DOCUMENT_KINDS = ['connector', 'adapter', 'writeup'] as const;
export const REVISION_STATUSES = [
  'draft',
  'submitted',
  'returned',
  'published',
  'declined',
  'superseded',
] as const;

export const documentKindSchema = z.enum(DOCUMENT_KINDS, {
  error: 'must be "connector", "adapter" or "writeup"',
});
export const revisionStatusSchema = z.enum(REVISION_STATUSES);

export type DocumentKind = (typeof DOCUMENT_KINDS)[number];
export type RevisionStatus = (typeof REVISION_STATUSES)[number];

/** Statuses of a revision its author is still working on (at most one per document). */
export const OPEN_STATUSES: readonly RevisionStatus[] = ['draft', 'submitted', 'returned'];

export const MAX_TITLE = 160;
export const MAX_NOTE = 4000;

// The pin-to-pin check's input is an adapter sheet's content.
const adapterContentSchema = adapterCheckInputSchema;

const CONTENT_SCHEMAS = {
  connector: connectorContentSchema,
  adapter: adapterContentSchema,
  writeup: writeupContentSchema,
} as const;

/** The schema of a document's `content` for its kind. */
export function contentSchemaFor<K extends DocumentKind>(kind: K): (typeof CONTENT_SCHEMAS)[K] {
  return CONTENT_SCHEMAS[kind];
}

const titleSchema = z
  .string({ error: 'must be text' })
  .trim()
  .max(MAX_TITLE, { error: `must be at most ${MAX_TITLE} characters` });

/** Title of a new document: it names the slug, so it cannot be blank. */
export const newTitleSchema = titleSchema.min(1, {
  error: 'cannot be empty: give the document a title',
});

const versionSchema = z
  .number({ error: 'must be the number of the revision version you started from' })
  .int()
  .min(0);

/** `POST /api/documents`: the content is checked against the schema of `kind`. */
const newDocument = <K extends DocumentKind>(kind: K) =>
  z.strictObject({ kind: z.literal(kind), title: newTitleSchema, content: contentSchemaFor(kind) });

/** `POST /api/documents`: the content is checked against the schema of `kind`. */
export const createDocumentSchema = z.discriminatedUnion(
  'kind',
  [newDocument('connector'), newDocument('adapter'), newDocument('writeup')],
  { error: 'must be "connector", "adapter" or "writeup"' },
);

/** `PUT /api/documents/:id/draft` for a document of `kind`. A draft's title may be blank for a while. */
export function saveDraftSchemaFor(kind: DocumentKind) {
  return z.strictObject({
    title: titleSchema,
    content: contentSchemaFor(kind),
    version: versionSchema,
  });
}

/**
 * `POST /api/documents/:id/submit`: the version the editor last saved, so a save made
 * elsewhere since is not submitted unseen. Without it the stored revision is submitted.
 */
export const submitSchema = z.strictObject({ version: versionSchema.optional() });

/** The shape of a draft save whatever the kind (content is checked by {@link saveDraftSchemaFor}). */
export const saveDraftSchema = z.strictObject({
  title: titleSchema,
  content: z.record(z.string(), z.unknown()),
  version: versionSchema,
});

const noteText = z
  .string({ error: 'must be text' })
  .trim()
  .max(MAX_NOTE, { error: `must be at most ${MAX_NOTE} characters` });

/** `POST /api/review/:id/publish`: a note is optional. */
export const publishDecisionSchema = z.strictObject({ note: noteText.optional() });
/** `return` and `decline` tell the author why, so the note is required. */
export const noteRequiredDecisionSchema = z.strictObject({
  note: noteText.min(1, { error: 'is required: tell the author what to change or why' }),
});
/**
 * `return` may also send single images of a write-up back, each with its own note; they
 * become lines of the decision's note (see shared/writeup/imageNotes.ts). With image
 * notes the general note may be left out.
 */
export const returnDecisionSchema = z
  .strictObject({
    note: noteText.optional().default(''),
    imageNotes: imageNotesSchema.optional(),
  })
  .superRefine((body, ctx) => {
    if (!body.note && !body.imageNotes?.length)
      ctx.addIssue({
        code: 'custom',
        path: ['note'],
        message: 'is required: tell the author what to change or why',
      });
  });
export const declineDecisionSchema = noteRequiredDecisionSchema;

const blankToUndefined = (v: unknown) => (v === '' ? undefined : v);

/** `GET /api/review/queue?kind=`: an empty kind means every kind. */
export const reviewQueueQuerySchema = z.object({
  kind: z.preprocess(blankToUndefined, documentKindSchema.optional()),
});
/** `GET /api/documents/:idOrSlug?revision=N`. */
export const revisionQuerySchema = z.object({
  revision: z.preprocess(
    blankToUndefined,
    z.coerce
      .number({ error: 'must be a revision number' })
      .int({ error: 'must be a whole number' })
      .positive({ error: 'must be 1 or more' })
      .optional(),
  ),
});

export type CreateDocumentInput = z.infer<typeof createDocumentSchema>;
export type SaveDraftInput = z.infer<typeof saveDraftSchema>;
export type SubmitInput = z.infer<typeof submitSchema>;
export type DecisionInput = z.infer<typeof publishDecisionSchema>;
