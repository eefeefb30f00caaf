import type { Policy } from '../../../../../shared/policy';
import { DataTable, type DataTableColumn } from '../../../components/data-table';

export function formatDateTime(iso: string): string {
  return new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
}

const columns: DataTableColumn<Policy>[] = [
  { key: 'version', header: 'Version', cell: (p) => p.version, sortValue: (p) => p.version, align: 'right' },
  { key: 'when', header: 'When', cell: (p) => formatDateTime(p.createdAt), sortValue: (p) => p.createdAt },
  { key: 'who', header: 'By', cell: (p) => p.authorEmail ?? 'Coppice (installation)' },
  { key: 'k', header: 'k', cell: (p) => p.k, align: 'right' },
  {
    key: 'blocked',
    header: 'Blocked fields',
    cell: (p) => (p.blockedFields.length ? p.blockedFields.join(', ') : 'none'),
  },
  { key: 'threshold', header: 'Proxy threshold', cell: (p) => p.proxyThreshold.toFixed(2), align: 'right' },
  { key: 'retention', header: 'Retention (days)', cell: (p) => p.retentionDays, align: 'right' },
  { key: 'reason', header: 'Reason', cell: (p) => p.reason },
];

export function PolicyHistory({ versions }: { versions: readonly Policy[] }) {
  return (
    <DataTable
      caption="Version history, newest first"
      columns={columns}
      rows={versions}
      rowKey={(p) => String(p.version)}
      initialSort={{ key: 'version', direction: 'descending' }}
    />
  );
}
