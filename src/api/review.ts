/** The moderators' review queue and decisions. */
import type { RevisionDiff } from '@shared/diff/revisions';
import { api, type RequestOptions } from './client';
import type { EntityId } from './types';
import type { DocumentFindings, DocumentKind, EditorRevision, PersonRef } from './documents';

export interface QueueItem {
  revisionId: EntityId;
  documentId: EntityId;
  slug: string | null;
  kind: DocumentKind;
  number: number;
  title: string;
  author: PersonRef | null;
  submittedAt: string;
  claimedBy: PersonRef | null;
  /** A published revision exists: this is an update to it. */
  isUpdate: boolean;
  /** The signed-in moderator wrote it, so they cannot decide on it. */
  own: boolean;
}

/** One line of the checklist; `ok` is null for what only a person can judge. */
export interface ChecklistItem {
  key: string;
  label: string;
  auto: boolean;
  ok: boolean | null;
  detail?: string;
}

export interface ReviewDocument {
  id: EntityId;
  slug: string;
  kind: DocumentKind;
  kindLabel?: string;
  owner: PersonRef | null;
  publishedRevisionId: EntityId | null;
}

/** `GET /api/review/:revisionId`. */
export interface ReviewView {
  document: ReviewDocument;
  revision: EditorRevision;
  previous: EditorRevision | null;
  diff: RevisionDiff;
  findings: DocumentFindings;
  checklist: ChecklistItem[];
  actions?: { canClaim: boolean; canDecide: boolean; reason: string | null };
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

export async function claim(
  revisionId: EntityId,
  options?: RequestOptions,
): Promise<EditorRevision> {
  const body = await api.post<{ revision: EditorRevision }>(
    `/api/review/${enc(revisionId)}/claim`,
    {},
    options,
  );
  return body.revision;
}

export async function release(
  revisionId: EntityId,
  options?: RequestOptions,
): Promise<EditorRevision> {
  const body = await api.post<{ revision: EditorRevision }>(
    `/api/review/${enc(revisionId)}/release`,
    {},
    options,
  );
  return body.revision;
}

export function getReview(revisionId: EntityId, options?: RequestOptions): Promise<ReviewView> {
  return api.get<ReviewView>(`/api/review/${enc(revisionId)}`, options);
}

export async function decide(
  revisionId: EntityId,
  decision: Decision,
  note: string,
  options?: RequestOptions,
  /** Images of a write-up sent back with a return, each with its note. */
  imageNotes?: Array<{ image: number; uploadId?: string; note: string }>,
): Promise<EditorRevision> {
  const body: Record<string, unknown> =
    decision === 'publish' && !note.trim() ? {} : { note: note.trim() };
  if (decision === 'return' && imageNotes?.length) body.imageNotes = imageNotes;
  const answer = await api.post<{ revision: EditorRevision }>(
    `/api/review/${enc(revisionId)}/${decision}`,
    body,
    options,
  );
  return answer.revision;
}
