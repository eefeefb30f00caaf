import { useQueryClient } from '@tanstack/react-query';
import { Link, useLocation, useParams } from 'react-router-dom';
import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { PublishBriefsPanel } from '../../features/briefs/components/publish-briefs-panel';
import { useCancelModel } from '../../features/models/api/cancel-model';
import { useModel } from '../../features/models/api/get-model';
import { modelKeys } from '../../features/models/api/model-keys';
import { useRequestPublication } from '../../features/models/api/request-publication';
import { useSaveDriverAction } from '../../features/models/api/save-driver-action';
import { useSendBack } from '../../features/models/api/send-back';
import { DriversPanel } from '../../features/models/components/drivers-panel';
import { PublicationPanel } from '../../features/models/components/publication-panel';
import { RunCharts } from '../../features/models/components/run-charts';
import { RunMetrics } from '../../features/models/components/run-metrics';
import { RunStatus, STATUS_WORDS } from '../../features/models/components/run-status';
import { SegmentsTable } from '../../features/models/components/segments-table';
import { TreePanel } from '../../features/models/components/tree-panel';
import { hasRole, useMe } from '../../lib/auth';

export function Component() {
  const { id = '' } = useParams();
  const location = useLocation();
  const notices = (location.state as { notices?: string[] } | null)?.notices ?? [];
  const me = useMe().data;
  const analyst = hasRole(me, 'analyst');
  const run = useModel(id);
  const cancel = useCancelModel();
  const saveAction = useSaveDriverAction();
  const request = useRequestPublication();
  const sendBack = useSendBack();
  const queryClient = useQueryClient();
  const data = run.data;
  const result = data?.result;
  return (
    <>
      <PageHeader
        title={data ? `Model run on ${data.datasetName ?? 'a dataset'}` : 'Model run'}
        description={
          data
            ? `${STATUS_WORDS[data.status]} · started ${new Date(data.createdAt).toLocaleString('en-GB')} by ${data.createdBy} · policy version ${data.policyVersion}, k = ${data.k}`
            : undefined
        }
        actions={
          data?.status === 'done' ? (
            <Link
              to={paths.modelCard.href(id)}
              className="rounded-md border border-moss-300 bg-white px-4 py-2 text-sm font-medium text-moss-800 hover:bg-moss-50"
            >
              Model card
            </Link>
          ) : undefined
        }
      />
      {run.isError && <ErrorNotice error={run.error} title="The run could not be loaded" />}
      {data && (
        <div className="space-y-6">
          {notices.length > 0 && (
            <ul role="status" className="rounded-md bg-moss-50 px-4 py-3 text-sm text-moss-900">
              {notices.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          )}
          {data.needsReview && (
            <p role="alert" className="rounded-md bg-signal-50 px-4 py-3 text-sm text-signal-800">
              Needs review: the privacy policy changed after this run was trained.
            </p>
          )}
          <RunStatus
            run={data}
            onCancel={analyst ? () => cancel.mutate(id) : undefined}
            cancelling={cancel.isPending}
          />
          {cancel.isError && <ErrorNotice error={cancel.error} title="The run could not be cancelled" />}
          {result && (
            <>
              <Card title="How well the tree separates leavers from stayers">
                <RunMetrics result={result} k={data.k} />
              </Card>
              <RunCharts result={result} />
              <Card title="Tree">
                <TreePanel
                  tree={result.tree}
                  label={`Tree of the model run on ${data.datasetName ?? 'a dataset'}`}
                />
              </Card>
              <Card title="Segments">
                <SegmentsTable segments={result.segments} />
              </Card>
              <Card title="Drivers and suggested actions">
                <DriversPanel
                  drivers={result.drivers}
                  editable={
                    analyst && data.publicationState !== 'requested' && data.publicationState !== 'published'
                  }
                  onSave={(feature, text) => saveAction.mutateAsync({ id, feature, text })}
                />
              </Card>
              <Card title="Publication">
                <PublicationPanel
                  run={data}
                  canRequest={analyst}
                  canSendBack={hasRole(me, 'privacy_officer')}
                  onRequest={(comment) => request.mutateAsync({ id, comment })}
                  onSendBack={(comment) => sendBack.mutateAsync({ id, comment })}
                />
              </Card>
              <Card title="Team briefs">
                <PublishBriefsPanel
                  runId={id}
                  publicationState={data.publicationState}
                  canPublish={hasRole(me, 'privacy_officer')}
                  onPublished={() => queryClient.invalidateQueries({ queryKey: modelKeys.all })}
                />
              </Card>
            </>
          )}
          <Card title="Features">
            <p className="text-sm">Used: {data.features.join(', ')}.</p>
            {data.excludedFeatures.length > 0 && (
              <ul className="mt-2 list-disc pl-5 text-sm text-slate-700">
                {data.excludedFeatures.map((e) => (
                  <li key={e.name}>
                    {e.name}: {e.reason}
                  </li>
                ))}
              </ul>
            )}
          </Card>
        </div>
      )}
    </>
  );
}
