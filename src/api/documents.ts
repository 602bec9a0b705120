/** Documents (connector sheets, adapter sheets, write-ups) and their revisions. */
import { api, type RequestOptions } from './client';
import type { EntityId } from './types';
import type { DocumentKind, RevisionStatus } from '@shared/schemas/document';

export type { DocumentKind, RevisionStatus };

export interface PersonRef {
  id: EntityId;
  displayName: string;
}

/** The automatic findings of a revision: errors, warnings and the cautions its page shows. */
export interface DocumentFindings {
  ok: boolean;
  errors: Array<{ code: string; message: string; [key: string]: unknown }>;
  warnings: Array<{ code: string; message: string; [key: string]: unknown }>;
  cautions: string[];
  summary?: unknown;
  report?: unknown;
}

export interface RevisionRef {
  id: EntityId;
  number: number;
  status: RevisionStatus;
  version: number;
}

/** A revision as the editor holds it. */
export interface EditorRevision extends RevisionRef {
  title: string;
  content: unknown;
  note?: string | null;
  updatedAt?: string;
  submittedAt?: string | null;
  decidedAt?: string | null;
  publishedAt?: string | null;
  authorId?: EntityId;
  author?: PersonRef | null;
  reviewer?: PersonRef | null;
  claimedBy?: PersonRef | null;
}

/** `GET /api/documents/:idOrSlug`: what a reader sees. */
export interface DocumentView {
  id: EntityId;
  slug: string;
  kind: DocumentKind;
  title: string;
  content: unknown;
  summary?: string | null;
  owner: PersonRef;
  revision: RevisionRef & {
    publishedAt: string | null;
    updatedAt?: string;
    reviewer: PersonRef | null;
  };
  publishedRevisionId?: EntityId | null;
  findings?: DocumentFindings;
}

export interface EditorDocument {
  id: EntityId;
  slug: string;
  kind: DocumentKind;
  ownerId?: EntityId;
  publishedRevisionId?: EntityId | null;
  /** The published revision, when one is published. */
  published?: { id: EntityId; number: number; version: number; publishedAt: string | null } | null;
}

export interface EditorState {
  document: EditorDocument;
  /** Null only for a document with no revision at all (which the server never makes). */
  revision: EditorRevision | null;
}

export interface CreatedDocument {
  id: EntityId;
  slug: string;
  kind: DocumentKind;
  revision: RevisionRef;
}

/** One line of a document's history (`GET /api/documents/:id/revisions`), newest first. */
export interface RevisionSummary extends RevisionRef {
  title: string;
  /** The moderator's note on the decision, if any. */
  note: string | null;
  /** Who decided it (null while undecided). */
  reviewer: PersonRef | null;
  submittedAt: string | null;
  decidedAt: string | null;
  publishedAt?: string | null;
  /** Last saved. */
  updatedAt?: string;
}

export interface MyDocument {
  id: EntityId;
  slug: string;
  kind: DocumentKind;
  title: string;
  published: boolean;
  latest: {
    id: EntityId;
    number: number;
    status: RevisionStatus;
    note: string | null;
    version?: number;
    submittedAt?: string | null;
    decidedAt?: string | null;
    updatedAt: string;
  };
}

const enc = (id: EntityId) => encodeURIComponent(String(id));

export function createDocument(
  input: { kind: DocumentKind; title: string; content: unknown },
  options?: RequestOptions,
): Promise<CreatedDocument> {
  return api.post<CreatedDocument>('/api/documents', input, options);
}

export function getDocument(
  idOrSlug: EntityId,
  revision?: number,
  options: RequestOptions = {},
): Promise<DocumentView> {
  return api.get<DocumentView>(`/api/documents/${enc(idOrSlug)}`, {
    ...options,
    query: { ...options.query, revision },
  });
}

export function getEditor(id: EntityId, options?: RequestOptions): Promise<EditorState> {
  return api.get<EditorState>(`/api/documents/${enc(id)}/editor`, options);
}

export async function saveDraft(
  id: EntityId,
  input: { title: string; content: unknown; version: number },
  options?: RequestOptions,
): Promise<EditorRevision> {
  const body = await api.put<{ revision: EditorRevision }>(
    `/api/documents/${enc(id)}/draft`,
    input,
    options,
  );
  return body.revision;
}

/**
 * Sends the open revision to review. `version` is the version the editor last saved:
 * when the stored revision is newer (saved in another tab) the server answers 409
 * `VERSION_CONFLICT` and submits nothing.
 */
export async function submitDocument(
  id: EntityId,
  input: { version?: number } = {},
  options?: RequestOptions,
): Promise<EditorRevision> {
  const body = await api.post<{ revision: EditorRevision }>(
    `/api/documents/${enc(id)}/submit`,
    input.version === undefined ? {} : { version: input.version },
    options,
  );
  return body.revision;
}

export async function withdrawDocument(
  id: EntityId,
  options?: RequestOptions,
): Promise<EditorRevision> {
  const body = await api.post<{ revision: EditorRevision }>(
    `/api/documents/${enc(id)}/withdraw`,
    {},
    options,
  );
  return body.revision;
}

/** Every revision of a document, newest first: for its author and moderators. */
export function listRevisions(id: EntityId, options?: RequestOptions): Promise<RevisionSummary[]> {
  return api.get<RevisionSummary[]>(`/api/documents/${enc(id)}/revisions`, options);
}

export function listMyDocuments(options?: RequestOptions): Promise<MyDocument[]> {
  return api.get<MyDocument[]>('/api/me/documents', options);
}

/** Words for statuses, the same everywhere (the product's own names). */
export const STATUS_LABELS: Record<RevisionStatus, string> = {
  draft: 'draft',
  submitted: 'submitted',
  returned: 'returned',
  published: 'published',
  declined: 'declined',
  superseded: 'superseded',
};

export const KIND_LABELS: Record<DocumentKind, string> = {
  connector: 'Connector sheet',
  adapter: 'Adapter sheet',
  writeup: 'Write-up',
};
