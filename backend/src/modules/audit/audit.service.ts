import type { AuditPage, AuditQuery } from '../../../../shared/audit';
import { toCsv } from '../../analysis/safe-csv';
import { AppError } from '../../lib/errors';
import type { SessionUser } from '../auth/session-types';
import { type AuditFilter, findAuditEvents, listAuditEvents, recordAudit } from './audit.repository';

export const MAX_EXPORT_ROWS = 50_000;

function filterOf(query: AuditFilter): AuditFilter {
  const { actor, action, objectType, objectId, from, to } = query;
  if (from && to && from > to)
    throw new AppError('bad_request', 400, 'from must not be after to.', [
      { path: 'from', message: 'from is after to' },
    ]);
  return { actor, action, objectType, objectId, from, to };
}

export async function searchAudit(query: AuditQuery): Promise<AuditPage> {
  const { items, total } = await findAuditEvents(filterOf(query), query.page, query.pageSize);
  return { items, total, page: query.page, pageSize: query.pageSize };
}

/** The filtered audit trail as CSV whose cells cannot run as formulas; the export is itself audited. */
export async function exportAudit(
  actor: SessionUser,
  query: AuditFilter,
): Promise<{ csv: string; rows: number }> {
  const filter = filterOf(query);
  const rows = await listAuditEvents(filter, MAX_EXPORT_ROWS + 1);
  if (rows.length > MAX_EXPORT_ROWS) {
    throw new AppError(
      'too_many_rows',
      422,
      `The export would hold more than ${MAX_EXPORT_ROWS.toLocaleString('en-GB')} lines; narrow the time range or the filters.`,
    );
  }
  const csv = toCsv(
    ['id', 'time (UTC)', 'actor', 'action', 'object type', 'object id', 'details'],
    rows.map((r) => [
      r.id,
      r.at,
      r.actorEmail,
      r.action,
      r.objectType,
      r.objectId,
      JSON.stringify(r.details),
    ]),
  );
  await recordAudit({
    actor,
    action: 'audit.export',
    objectType: 'audit',
    details: { rows: rows.length, filter: Object.fromEntries(Object.entries(filter).filter(([, v]) => v)) },
  });
  return { csv, rows: rows.length };
}
