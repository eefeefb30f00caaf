import type { EntityManager } from 'typeorm';
import { AuditEvent } from '../../entities/audit-event.entity';
import { db } from '../../lib/db';

export type AuditEntry = {
  actor: { id: string; email: string } | null;
  action: string;
  objectType?: string;
  objectId?: string;
  /** Counts, settings and names of columns: never employee-level data. */
  details?: Record<string, unknown>;
};

/**
 * Appends one line to the audit trail. Pass the transaction's manager when the audited change is
 * part of a transaction, so that the line and the change are stored together or not at all.
 */
export async function recordAudit(entry: AuditEntry, manager?: EntityManager): Promise<void> {
  const repo = (manager ?? db().manager).getRepository(AuditEvent);
  await repo.insert({
    actorId: entry.actor?.id ?? null,
    actorEmail: entry.actor?.email ?? null,
    action: entry.action,
    objectType: entry.objectType ?? null,
    objectId: entry.objectId ?? null,
    details: (entry.details ?? {}) as AuditEvent['details'] & object,
  });
}

export type AuditFilter = {
  actor?: string;
  action?: string;
  objectType?: string;
  objectId?: string;
  from?: string;
  to?: string;
};

export type AuditRow = {
  id: string;
  at: string;
  actorEmail: string | null;
  action: string;
  objectType: string | null;
  objectId: string | null;
  details: Record<string, unknown>;
};

function filtered(filter: AuditFilter) {
  const query = db().getRepository(AuditEvent).createQueryBuilder('e');
  const like = (text: string) => text.replace(/[\\%_]/g, (c) => `\\${c}`);
  if (filter.actor) query.andWhere('e.actor_email ILIKE :actor', { actor: `%${like(filter.actor)}%` });
  if (filter.action) query.andWhere('e.action LIKE :action', { action: `${like(filter.action)}%` });
  if (filter.objectType) query.andWhere('e.object_type = :objectType', { objectType: filter.objectType });
  if (filter.objectId) query.andWhere('e.object_id = :objectId', { objectId: filter.objectId });
  if (filter.from) query.andWhere('e.at >= :from', { from: filter.from });
  if (filter.to) query.andWhere('e.at <= :to', { to: filter.to });
  return query.orderBy('e.at', 'DESC').addOrderBy('e.id', 'DESC');
}

function toRow(event: AuditEvent): AuditRow {
  return {
    id: String(event.id),
    at: event.at.toISOString(),
    actorEmail: event.actorEmail,
    action: event.action,
    objectType: event.objectType,
    objectId: event.objectId,
    details: event.details ?? {},
  };
}

/** One page of the audit trail, newest first. */
export async function findAuditEvents(
  filter: AuditFilter,
  page: number,
  pageSize: number,
): Promise<{ items: AuditRow[]; total: number }> {
  const [events, total] = await filtered(filter)
    .skip((page - 1) * pageSize)
    .take(pageSize)
    .getManyAndCount();
  return { items: events.map(toRow), total };
}

/** Up to `limit` lines of the audit trail, newest first. */
export async function listAuditEvents(filter: AuditFilter, limit: number): Promise<AuditRow[]> {
  return (await filtered(filter).take(limit).getMany()).map(toRow);
}
