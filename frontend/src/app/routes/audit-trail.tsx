import { useSearchParams } from 'react-router-dom';
import type { AuditQueryInput } from '../../../../shared/audit';
import { Button } from '../../components/button';
import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { auditExportHref } from '../../features/audit/api/export-audit';
import { useAuditPage } from '../../features/audit/api/get-audit';
import { AuditFilters, type AuditFilterValues } from '../../features/audit/components/audit-filters';
import { AuditTable } from '../../features/audit/components/audit-table';

const FILTER_KEYS = ['actor', 'action', 'objectType', 'objectId', 'from', 'to'] as const;
const PAGE_SIZE = 50;

export function AuditTrailRoute() {
  const [params, setParams] = useSearchParams();
  const filters: AuditFilterValues = Object.fromEntries(
    FILTER_KEYS.map((key) => [key, params.get(key) ?? undefined]).filter(([, v]) => v),
  );
  const page = Math.max(1, Number(params.get('page')) || 1);
  const query: AuditQueryInput = { ...filters, page, pageSize: PAGE_SIZE };
  const audit = useAuditPage(query);

  const go = (next: AuditFilterValues, nextPage = 1) => {
    const search = new URLSearchParams();
    for (const key of FILTER_KEYS) if (next[key]) search.set(key, String(next[key]));
    if (nextPage > 1) search.set('page', String(nextPage));
    setParams(search);
  };
  const pages = audit.data ? Math.max(1, Math.ceil(audit.data.total / PAGE_SIZE)) : 1;

  return (
    <>
      <PageHeader
        title="Audit trail"
        description="Every sensitive action: sign-ins, uploads, mapping and policy changes, approvals, proxy decisions, model runs, publications, brief views, exports and deletions. Lines cannot be changed or removed, and hold no employee-level data."
        actions={
          <a
            href={auditExportHref(query)}
            download
            className="inline-flex items-center rounded-md border border-moss-300 bg-white px-4 py-2 text-sm font-medium text-moss-800 hover:bg-moss-50"
          >
            Export CSV
          </a>
        }
      />
      <Card className="mb-6">
        <AuditFilters value={filters} onApply={(next) => go(next)} />
      </Card>
      {audit.isError && <ErrorNotice error={audit.error} title="The audit trail could not be loaded" />}
      {audit.data && (
        <>
          <p className="mb-2 text-sm text-slate-600" role="status">
            {audit.data.total.toLocaleString('en-GB')} {audit.data.total === 1 ? 'line' : 'lines'}
            {pages > 1 && ` · page ${audit.data.page} of ${pages}`}
          </p>
          <AuditTable events={audit.data.items} />
          {pages > 1 && (
            <nav aria-label="Pages" className="mt-4 flex items-center gap-2">
              <Button
                variant="secondary"
                size="sm"
                disabled={page <= 1}
                onClick={() => go(filters, page - 1)}
              >
                Newer
              </Button>
              <Button
                variant="secondary"
                size="sm"
                disabled={page >= pages}
                onClick={() => go(filters, page + 1)}
              >
                Older
              </Button>
            </nav>
          )}
        </>
      )}
    </>
  );
}
