import { Link } from 'react-router-dom';
import type { DatasetQueueItem } from '../../../../../shared/privacy';
import { DataTable, type DataTableColumn } from '../../../components/data-table';
import { ApprovalStateBadge } from './approval-state';

export type ReviewQueueTableProps = {
  items: readonly DatasetQueueItem[];
  /** where one item is reviewed */
  hrefOf: (item: DatasetQueueItem) => string;
};

/** Mapped datasets waiting for approval for modelling. */
export function ReviewQueueTable({ items, hrefOf }: ReviewQueueTableProps) {
  const columns: DataTableColumn<DatasetQueueItem>[] = [
    {
      key: 'name',
      header: 'Dataset',
      cell: (item) => (
        <Link to={hrefOf(item)} className="font-medium text-moss-800 underline-offset-2 hover:underline">
          {item.name}
        </Link>
      ),
      sortValue: (item) => item.name,
    },
    {
      key: 'rows',
      header: 'Rows',
      cell: (item) => item.rowCount.toLocaleString('en-GB'),
      sortValue: (item) => item.rowCount,
      align: 'right',
    },
    { key: 'by', header: 'Uploaded by', cell: (item) => item.uploadedBy },
    {
      key: 'mapped',
      header: 'Mapped',
      cell: (item) =>
        item.mappedAt
          ? new Date(item.mappedAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })
          : '–',
      sortValue: (item) => item.mappedAt,
    },
    {
      key: 'state',
      header: 'Why it waits',
      cell: (item) => (
        <span>
          <ApprovalStateBadge state={item.state} />
          {item.reasons.map((reason) => (
            <span key={reason} className="mt-1 block text-xs text-slate-600">
              {reason}
            </span>
          ))}
        </span>
      ),
    },
  ];
  return (
    <DataTable
      caption="Waiting for a privacy officer"
      hideCaption
      columns={columns}
      rows={items}
      rowKey={(item) => `${item.kind}-${item.id}`}
      empty="No dataset waits for approval."
    />
  );
}
