import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { ProxyDecisionBody, ProxyRowView } from '../../../../shared/privacy';
import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { useDataset } from '../../features/datasets/api/get-dataset';
import { OutcomePreviewPanel } from '../../features/datasets/components/outcome-preview';
import { usePolicy } from '../../features/policy/api/get-policy';
import { useDecideApproval } from '../../features/review/api/decide-approval';
import { useDecideProxy } from '../../features/review/api/decide-proxy';
import { useApproval } from '../../features/review/api/get-approval';
import { useProxyReport } from '../../features/review/api/get-proxy-report';
import { ApprovalPanel } from '../../features/review/components/approval-panel';
import { ProxyDecisionDialog } from '../../features/review/components/proxy-decision-dialog';
import { ProxyReportTable } from '../../features/review/components/proxy-report-table';
import { hasRole, useMe } from '../../lib/auth';

export function DatasetReviewRoute() {
  const { id = '' } = useParams();
  const me = useMe().data;
  const canDecide = hasRole(me, 'privacy_officer');
  const dataset = useDataset(id);
  const policy = usePolicy();
  const mapped = dataset.data?.status === 'mapped';
  const proxies = useProxyReport(id, mapped);
  const approval = useApproval(id);
  const decideProxy = useDecideProxy(id);
  const decideApproval = useDecideApproval(id);
  const [pending, setPending] = useState<{
    row: ProxyRowView;
    decision: ProxyDecisionBody['decision'];
  } | null>(null);

  if (dataset.isPending) return <p className="text-slate-600">Loading the dataset…</p>;
  if (dataset.isError) return <ErrorNotice error={dataset.error} title="The dataset could not be loaded" />;
  const d = dataset.data;
  const columnNames = new Set(d.columns.map((c) => c.name));
  const blockedNames = new Set((policy.data?.blockedFields ?? []).map((f) => f.toLowerCase()));
  const flagged = d.columns.filter((c) => c.protectedCharacteristic);
  const unblocked = flagged.filter((c) => !blockedNames.has(c.name.toLowerCase())).length;

  return (
    <>
      <PageHeader
        title={`Review: ${d.name}`}
        description={
          <>
            Check what the dataset holds before any model is trained on it.{' '}
            <Link to={paths.dataset.href(d.id)} className="text-moss-800 underline underline-offset-2">
              Open the dataset
            </Link>
          </>
        }
      />
      <div className="space-y-6">
        <Card title="Decision">
          {approval.isError && (
            <ErrorNotice error={approval.error} title="The review status could not be loaded" />
          )}
          {approval.data && (
            <ApprovalPanel
              status={approval.data}
              onDecide={canDecide ? (body) => decideApproval.mutate(body) : undefined}
              busy={decideApproval.isPending}
              error={decideApproval.error ?? undefined}
            />
          )}
        </Card>
        <div className="grid gap-6 md:grid-cols-2">
          <Card title="Blocked fields">
            {policy.data && policy.data.blockedFields.length > 0 ? (
              <ul className="space-y-1 text-sm text-slate-800">
                {policy.data.blockedFields.map((field) => (
                  <li key={field}>
                    {field}
                    <span className="text-slate-500">
                      {columnNames.has(field)
                        ? ' · in this dataset: never a split, never shown'
                        : ' · not in this dataset'}
                    </span>
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-slate-600">
                The privacy policy blocks no field yet.{' '}
                <Link to={paths.privacyPolicy.href()}>Set the policy</Link> first.
              </p>
            )}
          </Card>
          <Card title="Likely protected characteristics">
            {flagged.length > 0 ? (
              <ul className="space-y-1 text-sm text-slate-800">
                {flagged.map((column) => (
                  <li key={column.name}>
                    {column.name}
                    <span className="text-slate-500"> · {column.protectedCharacteristic?.legalBasis}</span>
                    {blockedNames.has(column.name.toLowerCase()) ? (
                      <span className="ml-1 text-moss-800">· blocked</span>
                    ) : (
                      <span className="ml-1 font-medium text-signal-700">
                        · not blocked: models may split on it
                      </span>
                    )}
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-slate-600">The intake flagged none.</p>
            )}
            {unblocked > 0 && (
              <p className="mt-2 text-xs text-slate-600">
                Block them in the <Link to={paths.privacyPolicy.href()}>privacy policy</Link> before
                approving, unless the employee representatives agreed to their use.
              </p>
            )}
          </Card>
          <Card title="Identifiers dropped at upload">
            {d.droppedColumns.length > 0 ? (
              <p className="text-sm text-slate-800">{d.droppedColumns.join(', ')}</p>
            ) : (
              <p className="text-sm text-slate-600">None.</p>
            )}
            <p className="mt-2 text-xs text-slate-500">Employee IDs are stored only as keyed hashes.</p>
          </Card>
        </div>
        {d.preview && (
          <Card title="Outcome">
            <OutcomePreviewPanel preview={d.preview} />
          </Card>
        )}
        <Card title="Proxy report">
          {!mapped && (
            <p className="text-sm text-slate-600">The proxy report is ready once the dataset is mapped.</p>
          )}
          {proxies.isError && (
            <ErrorNotice error={proxies.error} title="The proxy report could not be computed" />
          )}
          {proxies.data && (
            <ProxyReportTable
              rows={proxies.data.rows}
              threshold={proxies.data.threshold}
              bins={proxies.data.bins}
              onDecide={canDecide ? (row, decision) => setPending({ row, decision }) : undefined}
            />
          )}
          {decideProxy.isError && (
            <div className="mt-3">
              <ErrorNotice error={decideProxy.error} title="The decision was not saved" />
            </div>
          )}
        </Card>
      </div>
      <ProxyDecisionDialog
        row={pending?.row ?? null}
        decision={pending?.decision ?? 'accept'}
        busy={decideProxy.isPending}
        onCancel={() => setPending(null)}
        onConfirm={(reason) => {
          if (!pending) return;
          decideProxy.mutate(
            {
              feature: pending.row.feature,
              blockedField: pending.row.blockedField,
              decision: pending.decision,
              reason,
            },
            { onSettled: () => setPending(null) },
          );
        }}
      />
    </>
  );
}
