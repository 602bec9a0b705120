/** Replies under a document, following its thread, and flags. */
import { api, type RequestOptions } from './client';
import type { EntityId } from './types';
import type { PersonRef } from './documents';
import type { EmailMode, FlagReason } from '@shared/schemas/replies';

export type { EmailMode, FlagReason };

export type ReplyStatus = 'visible' | 'hidden' | 'deleted';

/** A reply as the viewer may see it (`body` is null where they may not read it). */
export interface Reply {
  id: number;
  documentId: number;
  parentId: number | null;
  author: PersonRef;
  status: ReplyStatus;
  notice: string | null;
  body: string | null;
  bodyHtml: string | null;
  hidden: { reason: string | null; at: string | null; by: PersonRef | null } | null;
  isAnswer: boolean;
  createdAt: string;
  editedAt: string | null;
  editableUntil: string;
  can: {
    edit: boolean;
    delete: boolean;
    hide: boolean;
    unhide: boolean;
    markAnswer: boolean;
    unmarkAnswer: boolean;
    reply: boolean;
    flag: boolean;
  };
}

export interface Subscription {
  documentId: number;
  subscribed: boolean;
  source: 'author' | 'replied' | 'manual' | null;
  emailMode: EmailMode;
}

const enc = (id: EntityId) => encodeURIComponent(String(id));

export function listReplies(documentId: EntityId, options?: RequestOptions): Promise<Reply[]> {
  return api.get<Reply[]>(`/api/documents/${enc(documentId)}/replies`, options);
}

export function postReply(
  documentId: EntityId,
  input: { body: string; parentId?: number | null },
  options?: RequestOptions,
): Promise<Reply> {
  return api.post<Reply>(`/api/documents/${enc(documentId)}/replies`, input, options);
}

export function editReply(id: number, body: string, options?: RequestOptions): Promise<Reply> {
  return api.patch<Reply>(`/api/replies/${id}`, { body }, options);
}

export function deleteReply(id: number, options?: RequestOptions): Promise<Reply> {
  return api.delete<Reply>(`/api/replies/${id}`, options);
}

export function hideReply(id: number, reason: string, options?: RequestOptions): Promise<Reply> {
  return api.post<Reply>(`/api/replies/${id}/hide`, { reason }, options);
}

export function unhideReply(id: number, options?: RequestOptions): Promise<Reply> {
  return api.post<Reply>(`/api/replies/${id}/unhide`, {}, options);
}

export function markAnswer(id: number, options?: RequestOptions): Promise<Reply> {
  return api.post<Reply>(`/api/replies/${id}/answer`, {}, options);
}

export function unmarkAnswer(id: number, options?: RequestOptions): Promise<Reply> {
  return api.delete<Reply>(`/api/replies/${id}/answer`, options);
}

export function getSubscription(documentId: EntityId, options?: RequestOptions) {
  return api.get<Subscription>(`/api/documents/${enc(documentId)}/subscription`, options);
}

export function setSubscription(
  documentId: EntityId,
  subscribed: boolean,
  options?: RequestOptions,
) {
  return api.put<Subscription>(
    `/api/documents/${enc(documentId)}/subscription`,
    { subscribed },
    options,
  );
}

export function createFlag(
  input: { targetType: 'document' | 'reply'; targetId: number; reason: FlagReason; note?: string },
  options?: RequestOptions,
) {
  return api.post<{ flag: { id: number; status: string } }>('/api/flags', input, options);
}
