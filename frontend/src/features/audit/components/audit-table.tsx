import { AUDIT_ACTION_LABELS, type AuditEventView } from '../../../../../shared/audit';
import { DataTable, type DataTableColumn } from '../../../components/data-table';

function formatValue(value: unknown): string {
  if (Array.isArray(value)) return value.length ? value.map(formatValue).join(', ') : 'none';
  if (value && typeof value === 'object' && 'from' in value && 'to' in value) {
    const { from, to } = value as { from: unknown; to: unknown };
    return from === to ? formatValue(to) : `${formatValue(from)} → ${formatValue(to)}`;
  }
  return typeof value === 'string' ? value : JSON.stringify(value);
}

export function formatDetails(details: Record<string, unknown>): string {
  return Object.entries(details)
    .map(([key, value]) => `${key}: ${formatValue(value)}`)
    .join('; ');
}

const columns: DataTableColumn<AuditEventView>[] = [
  {
    key: 'at',
    header: 'When',
    cell: (e) => (
      <time dateTime={e.at} className="whitespace-nowrap">
        {new Date(e.at).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'medium' })}
      </time>
    ),
  },
  { key: 'who', header: 'Who', cell: (e) => e.actorEmail ?? 'Coppice' },
  {
    key: 'what',
    header: 'What',
    cell: (e) => (
      <span>
        {AUDIT_ACTION_LABELS[e.action] ?? e.action}
        <span className="block font-mono text-xs text-slate-500">{e.action}</span>
      </span>
    ),
  },
  {
    key: 'object',
    header: 'Object',
    cell: (e) =>
      e.objectType ? (
        <span>
          {e.objectType}
          {e.objectId && (
            <span className="block font-mono text-xs break-all text-slate-500">{e.objectId}</span>
          )}
        </span>
      ) : (
        '–'
      ),
  },
  {
    key: 'details',
    header: 'Details',
    cell: (e) => (
      <span className="text-xs break-words text-slate-700">{formatDetails(e.details) || '–'}</span>
    ),
  },
];

export function AuditTable({ events }: { events: readonly AuditEventView[] }) {
  return (
    <DataTable
      caption="Audit trail, newest first"
      hideCaption
      columns={columns}
      rows={events}
      rowKey={(e) => e.id}
      empty="No audit lines match these filters."
    />
  );
}
