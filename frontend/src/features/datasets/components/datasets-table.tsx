import { Link } from 'react-router-dom';
import type { DatasetSummary } from '../../../../../shared/datasets';
import { DataTable } from '../../../components/data-table';
import { paths } from '../../../config/paths';

export const STATUS_LABELS: Record<DatasetSummary['status'], string> = {
  profiled: 'Profiled: needs a mapping',
  mapped: 'Mapped',
};

export function formatWhen(iso: string): string {
  return new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
}

export function DatasetsTable({ datasets }: { datasets: readonly DatasetSummary[] }) {
  return (
    <DataTable
      caption="Datasets"
      hideCaption
      rows={datasets}
      rowKey={(d) => d.id}
      initialSort={{ key: 'when', direction: 'descending' }}
      empty="No datasets yet. Upload a staff export to begin."
      columns={[
        {
          key: 'name',
          header: 'Name',
          cell: (d) => (
            <Link
              to={paths.dataset.href(d.id)}
              className="font-medium text-moss-800 underline-offset-2 hover:underline"
            >
              {d.name}
            </Link>
          ),
          sortValue: (d) => d.name,
        },
        {
          key: 'rows',
          header: 'Rows',
          cell: (d) => d.rowCount.toLocaleString('en-GB'),
          sortValue: (d) => d.rowCount,
          align: 'right',
        },
        { key: 'by', header: 'Uploaded by', cell: (d) => d.uploadedBy, sortValue: (d) => d.uploadedBy },
        {
          key: 'when',
          header: 'When',
          cell: (d) => formatWhen(d.uploadedAt),
          sortValue: (d) => d.uploadedAt,
        },
        { key: 'status', header: 'Status', cell: (d) => STATUS_LABELS[d.status], sortValue: (d) => d.status },
      ]}
    />
  );
}
