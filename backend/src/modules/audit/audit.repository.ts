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
