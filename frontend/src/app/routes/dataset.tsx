import { useNavigate, useParams } from 'react-router-dom';
import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { useDataset } from '../../features/datasets/api/get-dataset';
import { formatWhen, STATUS_LABELS } from '../../features/datasets/components/datasets-table';
import { DeleteDatasetButton } from '../../features/datasets/components/delete-dataset-button';
import { MappingForm } from '../../features/datasets/components/mapping-form';
import { ProfileTable } from '../../features/datasets/components/profile-table';
import { hasRole, useMe } from '../../lib/auth';

export function DatasetRoute() {
  const { id = '' } = useParams();
  const me = useMe().data;
  const dataset = useDataset(id);
  const navigate = useNavigate();
  if (dataset.isPending) return <p className="text-slate-600">Loading the dataset…</p>;
  if (dataset.isError) return <ErrorNotice error={dataset.error} title="The dataset could not be loaded" />;
  const d = dataset.data;
  return (
    <>
      <PageHeader
        title={d.name}
        description={`${d.rowCount.toLocaleString('en-GB')} rows · ${d.uploadedBy} · ${formatWhen(d.uploadedAt)} · ${STATUS_LABELS[d.status]}`}
        actions={
          <DeleteDatasetButton id={d.id} name={d.name} onDeleted={() => navigate(paths.datasets.href())} />
        }
      />
      <div className="space-y-6">
        {d.warnings.length > 0 && (
          <Card title="Notes from reading the file" headingLevel={2}>
            <ul className="list-disc space-y-1 pl-5 text-sm text-slate-700">
              {d.warnings.map((warning) => (
                <li key={warning}>{warning}</li>
              ))}
            </ul>
          </Card>
        )}
        <Card title="Mapping">
          <MappingForm key={`${d.id}-${d.status}`} dataset={d} canEdit={hasRole(me, 'analyst')} />
        </Card>
        <Card title="Profile">
          {d.droppedColumns.length > 0 && (
            <p className="mb-3 text-sm text-slate-700">
              Not stored: {d.droppedColumns.join(', ')}. Direct identifiers and free text are dropped before
              anything is stored; likely protected characteristics are suggested to the privacy officer as
              blocked fields.
            </p>
          )}
          <ProfileTable columns={d.columns} dropped={d.droppedColumns} />
        </Card>
      </div>
    </>
  );
}
