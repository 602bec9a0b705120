/** The moderators' flag queue and the admins' outbox page. */
import { api, type RequestOptions } from './client';
import type { DocumentKind, PersonRef } from './documents';
import type { FlagAction, FlagReason } from '@shared/schemas/replies';

export type { FlagAction };

export interface FlagItem {
  id: number;
  targetType: 'document' | 'reply';
  reason: FlagReason;
  reasonLabel: string;
  note: string | null;
  status: 'open' | 'resolved';
  action: FlagAction | null;
  resolutionNote: string | null;
  createdAt: string;
  resolvedAt: string | null;
  reporter: PersonRef | null;
  resolvedBy: PersonRef | null;
  openOnTarget: number;
  own: boolean;
  document: {
    id: number;
    slug: string;
    kind: DocumentKind;
    title: string;
    published: boolean;
    owner: PersonRef | null;
  } | null;
  reply: {
    id: number;
    status: 'visible' | 'hidden' | 'deleted';
    author: PersonRef | null;
    body: string;
    bodyHtml: string;
    createdAt: string;
  } | null;
}

export function listFlags(status: 'open' | 'resolved' | 'all', options: RequestOptions = {}) {
  return api.get<FlagItem[]>('/api/flags', { ...options, query: { ...options.query, status } });
}

export function resolveFlag(
  id: number,
  input: { action: FlagAction; note?: string },
  options?: RequestOptions,
) {
  return api.post<{ closed: number; changed: boolean }>(`/api/flags/${id}/resolve`, input, options);
}

export interface OutboxItem {
  id: number;
  messageId: string;
  to: string;
  subject: string;
  kind: string;
  status: 'queued' | 'sending' | 'sent' | 'failed';
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string;
  sentAt: string | null;
  createdAt: string;
}

export interface OutboxPage {
  counts: Record<OutboxItem['status'], number>;
  items: OutboxItem[];
}

export function listOutbox(
  status: 'failed' | 'queued' | 'sent' | 'all',
  options: RequestOptions = {},
): Promise<OutboxPage> {
  return api.get<OutboxPage>('/api/admin/mail', {
    ...options,
    query: { ...options.query, status },
  });
}

export function retryOutbox(id: number, options?: RequestOptions) {
  return api.post<{ message: OutboxItem }>(`/api/admin/mail/${id}/retry`, {}, options);
}
