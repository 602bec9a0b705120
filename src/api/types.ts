/** Shapes the client reads from the HTTP API (see the API notes for the stable parts). */

export type Role = 'member' | 'moderator' | 'admin';

export const ROLES: readonly Role[] = ['member', 'moderator', 'admin'];

/** The server decides the id type; the client only passes it back. */
export type EntityId = number | string;

export interface User {
  id: EntityId;
  email: string;
  displayName: string;
  role: Role;
  emailVerified: boolean;
}

export interface AdminUser extends User {
  createdAt: string;
}

export interface AuditActor {
  id: EntityId;
  displayName: string;
}

export interface AuditEntry {
  id: EntityId;
  actor: AuditActor | null;
  action: string;
  targetType: string;
  targetId: EntityId | null;
  details: unknown;
  createdAt: string;
}

export interface AuditPage {
  total: number;
  items: AuditEntry[];
}

export interface DevMail {
  id: EntityId;
  to: string;
  from: string;
  subject: string;
  text: string;
  html: string | null;
  date: string;
}

export interface SiteMeta {
  env: 'development' | 'test' | 'production';
  devMail: boolean;
}

export interface RegisterInput {
  email: string;
  displayName: string;
  password: string;
}
