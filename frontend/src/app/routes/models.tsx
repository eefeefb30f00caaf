import { useCallback, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { useCreateModel } from '../../features/models/api/create-model';
import { useDatasetsForModels } from '../../features/models/api/get-datasets';
import { useFeatureOptions } from '../../features/models/api/get-feature-options';
import { useModels } from '../../features/models/api/get-models';
import { useProxiesForModels } from '../../features/models/api/get-proxies';
import { RunForm } from '../../features/models/components/run-form';
import { RunList } from '../../features/models/components/run-list';
import { hasRole, useMe } from '../../lib/auth';

export function ModelsRoute() {
  const me = useMe().data;
  const analyst = hasRole(me, 'analyst');
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const [datasetId, setDatasetId] = useState(params.get('datasetId') ?? '');
  const onDatasetChange = useCallback((id: string) => setDatasetId(id), []);
  const runs = useModels();
  const datasets = useDatasetsForModels();
  const options = useFeatureOptions(analyst ? datasetId : '');
  const proxyReport = useProxiesForModels(analyst ? datasetId : '');
  const proxies = Object.fromEntries(
    (proxyReport.data?.rows ?? [])
      .filter((row) => row.flagged)
      .map((row) => [row.feature, `Proxy of ${row.blockedField} (Cramér's V ${row.cramersV.toFixed(2)})`]),
  );
  const create = useCreateModel();
  return (
    <>
      <PageHeader
        title="Model runs"
        description="Classification trees trained on a dataset to find what goes with leaving. Each run trains in the background; its settings and seed are kept so it can be trained again."
      />
      <div className="space-y-6">
        {analyst && (
          <Card title="New model run">
            {datasets.isError && (
              <ErrorNotice error={datasets.error} title="The datasets could not be loaded" />
            )}
            {options.isError && (
              <ErrorNotice error={options.error} title="The dataset's columns could not be read" />
            )}
            {datasets.data && (
              <RunForm
                datasets={datasets.data}
                featureOptions={options.data}
                proxies={proxies}
                initialDatasetId={datasetId}
                onDatasetChange={onDatasetChange}
                error={create.error}
                onSubmit={async (body) => {
                  const created = await create.mutateAsync(body);
                  navigate(paths.modelRun.href(created.id), { state: { notices: created.notices } });
                }}
              />
            )}
          </Card>
        )}
        <Card title="Runs">
          {runs.isError && <ErrorNotice error={runs.error} title="The runs could not be loaded" />}
          {runs.data && (
            <RunList
              runs={runs.data}
              hrefOf={paths.modelRun.href}
              onCompare={(ids) => navigate(paths.modelCompare.href(ids))}
            />
          )}
        </Card>
      </div>
    </>
  );
}
