import { useNavigate } from 'react-router-dom';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { useDatasets } from '../../features/datasets/api/get-datasets';
import { DatasetsTable } from '../../features/datasets/components/datasets-table';
import { UploadPanel } from '../../features/datasets/components/upload-panel';
import { hasRole, useMe } from '../../lib/auth';

export function DatasetsRoute() {
  const me = useMe().data;
  const datasets = useDatasets();
  const navigate = useNavigate();
  const analyst = hasRole(me, 'analyst');
  return (
    <>
      <PageHeader
        title="Datasets"
        description="Staff exports from the HR system. Each is checked and profiled when it arrives; nothing identifying is stored."
      />
      <div className="space-y-6">
        {analyst && <UploadPanel onUploaded={(dataset) => navigate(paths.dataset.href(dataset.id))} />}
        {datasets.isPending && <p className="text-slate-600">Loading datasets…</p>}
        {datasets.isError && <ErrorNotice error={datasets.error} title="The datasets could not be loaded" />}
        {datasets.data && <DatasetsTable datasets={datasets.data} />}
      </div>
    </>
  );
}
