import type { Transaction } from 'sequelize';
import { AuditEntry, User } from '../models';

export interface AuditInput {
  actorId: number | null;
  action: string;
  targetType: string;
  targetId?: string | number | null;
  details?: unknown;
}

/** Writes one line to the audit log, inside the caller's transaction when given. */
export async function audit(entry: AuditInput, transaction?: Transaction) {
  return AuditEntry.create(
    {
      actorId: entry.actorId,
      action: entry.action,
      targetType: entry.targetType,
      targetId: entry.targetId == null ? null : String(entry.targetId),
      details: entry.details ?? null,
    },
    { transaction },
  );
}

/** A page of the audit log, newest first, with the actor's display name. */
export async function listAudit(limit: number, offset: number) {
  const { rows, count } = await AuditEntry.findAndCountAll({
    order: [['id', 'DESC']],
    limit,
    offset,
    include: [{ model: User, as: 'actor', attributes: ['id', 'displayName'] }],
  });
  return {
    total: count,
    items: rows.map((r) => {
      const actor = (r as unknown as { actor?: User }).actor;
      return {
        id: r.id,
        actor: actor ? { id: actor.id, displayName: actor.displayName } : null,
        action: r.action,
        targetType: r.targetType,
        targetId: r.targetId,
        details: r.details,
        createdAt: r.createdAt,
      };
    }),
  };
}
