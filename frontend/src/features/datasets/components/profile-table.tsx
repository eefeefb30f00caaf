import type { ColumnProfile } from '../../../../../shared/datasets';
import { DataTable } from '../../../components/data-table';

const TYPE_LABELS: Record<ColumnProfile['type'], string> = {
  number: 'Number',
  category: 'Category',
  date: 'Date',
  'yes-no': 'Yes / no',
  identifier: 'Identifier',
  'free-text': 'Free text',
};

function MissingBar({ share }: { share: number }) {
  const percent = Math.round(share * 1000) / 10;
  return (
    <span className="inline-flex items-center gap-2">
      <span className="inline-block h-2 w-16 overflow-hidden rounded-full bg-sand-200" aria-hidden="true">
        <span className="block h-full bg-slate-500" style={{ width: `${Math.min(100, percent)}%` }} />
      </span>
      <span className="tabular-nums">{percent}%</span>
    </span>
  );
}

function summary(column: ColumnProfile): string {
  if (column.type === 'number' || column.type === 'date') {
    if (column.min === undefined) return column.dateOrder === 'ambiguous' ? 'day/month order unclear' : '–';
    return `${column.min} · ${column.median} · ${column.max}`;
  }
  if (column.topCategories?.length) {
    const shown = column.topCategories.slice(0, 3).map((c) => `${c.value} (${c.count})`);
    return column.topCategories.length > 3 ? `${shown.join(', ')}, …` : shown.join(', ');
  }
  return '–';
}

export type ProfileTableProps = {
  columns: readonly ColumnProfile[];
  dropped: readonly string[];
};

/** The profile of every column: type, missing share, distinct values, range or top values, and flags. */
export function ProfileTable({ columns, dropped }: ProfileTableProps) {
  const droppedSet = new Set(dropped);
  return (
    <DataTable
      caption="Column profile"
      hideCaption
      rows={columns}
      rowKey={(c) => c.name}
      columns={[
        {
          key: 'name',
          header: 'Column',
          cell: (c) => <span className="font-medium">{c.name}</span>,
          sortValue: (c) => c.name,
        },
        { key: 'type', header: 'Type', cell: (c) => TYPE_LABELS[c.type], sortValue: (c) => c.type },
        {
          key: 'missing',
          header: 'Missing',
          cell: (c) => <MissingBar share={c.missingShare} />,
          sortValue: (c) => c.missingShare,
        },
        {
          key: 'distinct',
          header: 'Distinct',
          cell: (c) => c.distinct.toLocaleString('en-GB'),
          sortValue: (c) => c.distinct,
          align: 'right',
        },
        { key: 'values', header: 'Min · median · max / top values', cell: summary },
        {
          key: 'flags',
          header: 'Flags',
          cell: (c) => (
            <span className="flex flex-wrap gap-1">
              {droppedSet.has(c.name) && (
                <span className="rounded bg-slate-200 px-1.5 py-0.5 text-xs text-slate-800">
                  not stored{c.directIdentifier ? `: ${c.directIdentifier.kind.replace('-', ' ')}` : ''}
                </span>
              )}
              {c.protectedCharacteristic && (
                <span
                  className="rounded bg-sand-200 px-1.5 py-0.5 text-xs text-slate-900"
                  title={c.protectedCharacteristic.legalBasis}
                >
                  protected: {c.protectedCharacteristic.characteristic} (suggested to block)
                </span>
              )}
              {c.storage === 'keyed-hash' && (
                <span className="rounded bg-moss-100 px-1.5 py-0.5 text-xs text-moss-900">
                  stored as keyed hash
                </span>
              )}
            </span>
          ),
          sortValue: (c) => (droppedSet.has(c.name) ? 0 : c.protectedCharacteristic ? 1 : 2),
        },
      ]}
    />
  );
}
