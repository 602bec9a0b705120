import { api, type RequestOptions } from './client';
import type { AdminUser, AuditPage, EntityId, Role } from './types';

export function listUsers(options?: RequestOptions): Promise<AdminUser[]> {
  return api.get<AdminUser[]>('/api/admin/users', options);
}

export async function setUserRole(
  id: EntityId,
  role: Role,
  options?: RequestOptions,
): Promise<AdminUser> {
  const body = await api.patch<{ user: AdminUser }>(
    `/api/admin/users/${encodeURIComponent(String(id))}`,
    { role },
    options,
  );
  return body.user;
}

export function listAudit(
  page: { limit: number; offset: number },
  options: RequestOptions = {},
): Promise<AuditPage> {
  return api.get<AuditPage>('/api/admin/audit', {
    ...options,
    query: { ...options.query, limit: page.limit, offset: page.offset },
  });
}
