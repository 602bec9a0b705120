/** The bell's notifications, the member's e-mail settings and unsubscribe links. */
import { api, type RequestOptions } from './client';
import type { DocumentKind } from './documents';
import type { EmailMode } from '@shared/schemas/replies';

export interface AppNotification {
  id: number;
  kind: 'reply' | 'review' | 'flag' | 'answer' | 'moderation';
  title: string;
  body: string | null;
  link: string | null;
  read: boolean;
  createdAt: string;
}

export interface NotificationList {
  unread: number;
  items: AppNotification[];
}

export interface NotificationSettings {
  emailMode: EmailMode;
  emailVerified: boolean;
  subscriptions: Array<{
    documentId: number;
    slug: string;
    kind: DocumentKind;
    title: string;
    source: 'author' | 'replied' | 'manual';
    since: string;
  }>;
}

export interface UnsubscribeState {
  scope: 'thread' | 'all';
  displayName: string;
  document: { id: number; slug: string; title: string | null } | null;
  subscribed: boolean;
  emailMode: EmailMode;
}

export function listNotifications(options?: RequestOptions): Promise<NotificationList> {
  return api.get<NotificationList>('/api/notifications', options);
}

export function markNotificationsRead(ids?: number[], options?: RequestOptions) {
  return api.post<{ unread: number }>('/api/notifications/read', ids ? { ids } : {}, options);
}

export function getNotificationSettings(options?: RequestOptions) {
  return api.get<NotificationSettings>('/api/me/notifications', options);
}

export function setEmailMode(emailMode: EmailMode, options?: RequestOptions) {
  return api.put<NotificationSettings>('/api/me/notifications', { emailMode }, options);
}

export function describeUnsubscribe(token: string, options: RequestOptions = {}) {
  return api.get<UnsubscribeState>('/api/unsubscribe', {
    ...options,
    query: { ...options.query, token },
  });
}

export function unsubscribe(token: string, options?: RequestOptions) {
  return api.post<UnsubscribeState & { ok: true }>('/api/unsubscribe', { token }, options);
}
