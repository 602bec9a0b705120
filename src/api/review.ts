/** The moderators' review queue and decisions. */
import { api, type RequestOptions } from './client';
import type { EntityId } from './types';
import type { DocumentKind, EditorRevision, Finding, PersonRef, RevisionStatus } from './documents';

export interface QueueItem {
  revisionId: EntityId;
  documentId: EntityId;
  kind: DocumentKind;
  title: string;
  author: PersonRef | string;
  submittedAt: string;
  claimedBy: PersonRef | null;
}

export interface ChecklistItem {
  id?: string;
  key?: string;
  label: string;
  /** What the automatic checks say, when they can tell. */
  auto?: boolean | null;
  [key: string]: unknown;
}

export interface ReviewRevision extends EditorRevision {
  author?: PersonRef;
  claimedBy?: PersonRef | null;
}

export interface ReviewDocument {
  id: EntityId;
  slug: string;
  kind: DocumentKind;
  title?: string;
  owner: PersonRef;
}

/** `GET /api/review/:revisionId`. `diff` follows shared/diff/revisions.ts. */
export interface ReviewView {
  document: ReviewDocument;
  revision: ReviewRevision;
  previous: (EditorRevision & { status: RevisionStatus }) | null;
  diff: unknown;
  findings: Finding[];
  checklist: ChecklistItem[] | unknown;
}

export type Decision = 'publish' | 'return' | 'decline';

const enc = (id: EntityId) => encodeURIComponent(String(id));

export function listQueue(
  kind: DocumentKind | '',
  options: RequestOptions = {},
): Promise<QueueItem[]> {
  return api.get<QueueItem[]>('/api/review/queue', {
    ...options,
    query: { ...options.query, kind },
  });
}

export function claim(revisionId: EntityId, options?: RequestOptions): Promise<unknown> {
  return api.post(`/api/review/${enc(revisionId)}/claim`, {}, options);
}

export function release(revisionId: EntityId, options?: RequestOptions): Promise<unknown> {
  return api.post(`/api/review/${enc(revisionId)}/release`, {}, options);
}

export function getReview(revisionId: EntityId, options?: RequestOptions): Promise<ReviewView> {
  return api.get<ReviewView>(`/api/review/${enc(revisionId)}`, options);
}

export async function decide(
  revisionId: EntityId,
  decision: Decision,
  note: string,
  options?: RequestOptions,
): Promise<EditorRevision> {
  const body = await api.post<{ revision: EditorRevision }>(
    `/api/review/${enc(revisionId)}/${decision}`,
    decision === 'publish' && !note.trim() ? {} : { note },
    options,
  );
  return body.revision;
}

/** The author's name whether the server sends a person or a plain name. */
export function personName(p: PersonRef | string | null | undefined): string {
  if (!p) return '—';
  return typeof p === 'string' ? p : p.displayName;
}
