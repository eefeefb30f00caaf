import { Link } from 'react-router-dom';
import type { PublicationQueueItem } from '../../../../../shared/privacy';
import { DataTable, type DataTableColumn } from '../../../components/data-table';

export type PublicationRequestsTableProps = {
  items: readonly PublicationQueueItem[];
  /** the model run page, where the privacy officer publishes the run or sends it back */
  hrefOf: (item: PublicationQueueItem) => string;
};

const when = (iso: string | null) =>
  iso ? new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' }) : '–';

/** Model runs an analyst asked to publish, not yet published or sent back. */
export function PublicationRequestsTable({ items, hrefOf }: PublicationRequestsTableProps) {
  const columns: DataTableColumn<PublicationQueueItem>[] = [
    {
      key: 'run',
      header: 'Model run',
      cell: (item) => (
        <span>
          <Link to={hrefOf(item)} className="font-medium text-moss-800 underline-offset-2 hover:underline">
            Model run on {item.datasetName ?? 'a deleted dataset'}
          </Link>
          <span className="mt-1 block font-mono text-xs text-slate-600">run {item.id.slice(0, 8)}</span>
        </span>
      ),
      sortValue: (item) => item.datasetName,
    },
    { key: 'by', header: 'Asked by', cell: (item) => item.requestedBy ?? '–' },
    {
      key: 'when',
      header: 'Asked on',
      cell: (item) => when(item.requestedAt),
      sortValue: (item) => item.requestedAt,
    },
    {
      key: 'note',
      header: "Analyst's note",
      cell: (item) =>
        item.note ? (
          <span className="text-slate-800">“{item.note}”</span>
        ) : (
          <span className="text-slate-500">No note</span>
        ),
    },
    {
      key: 'policy',
      header: 'Trained under policy',
      cell: (item) => (
        <span>
          Version {item.policyVersion}
          {item.needsReview && (
            <span className="mt-1 block text-xs text-signal-800">
              The policy has changed since: send it back for a new run.
            </span>
          )}
        </span>
      ),
      sortValue: (item) => item.policyVersion,
      align: 'right',
    },
  ];
  return (
    <DataTable
      caption="Publication requests"
      hideCaption
      columns={columns}
      rows={items}
      rowKey={(item) => item.id}
      empty="No model run waits for publication."
    />
  );
}
