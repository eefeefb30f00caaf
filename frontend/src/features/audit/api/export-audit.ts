import type { AuditQueryInput } from '../../../../../shared/audit';
import { auditSearchParams } from './get-audit';

/** The CSV export is a plain download: the browser sends the session cookie with the link. */
export function auditExportHref(query: AuditQueryInput): string {
  const { page: _page, pageSize: _pageSize, ...filters } = query;
  const search = auditSearchParams(filters).toString();
  return `/api/audit/export.csv${search ? `?${search}` : ''}`;
}
