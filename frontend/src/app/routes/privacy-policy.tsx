import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { datasetQueryOptions } from '../../features/datasets/api/get-dataset';
import { useDatasets } from '../../features/datasets/api/get-datasets';
import { usePolicy } from '../../features/policy/api/get-policy';
import { usePolicyVersions } from '../../features/policy/api/get-policy-versions';
import { useUpdatePolicy } from '../../features/policy/api/update-policy';
import { PolicyForm } from '../../features/policy/components/policy-form';
import { formatDateTime, PolicyHistory } from '../../features/policy/components/policy-history';
import { hasRole, useMe } from '../../lib/auth';

export function PrivacyPolicyRoute() {
  const me = useMe().data;
  const policy = usePolicy();
  const versions = usePolicyVersions();
  const update = useUpdatePolicy();
  const [saved, setSaved] = useState<number | null>(null);
  const canEdit = hasRole(me, 'privacy_officer');
  // The newest upload's columns: its likely protected characteristics are suggested, with their legal basis.
  const newest = useDatasets().data?.[0]?.id;
  const columns = useQuery({ ...datasetQueryOptions(newest ?? ''), enabled: canEdit && Boolean(newest) }).data
    ?.columns;
  const suggestions = columns
    ?.filter((c) => c.protectedCharacteristic)
    .map((c) => ({
      name: c.name,
      note: `${c.protectedCharacteristic!.characteristic}: ${c.protectedCharacteristic!.legalBasis}`,
    }));

  return (
    <>
      <PageHeader
        title="Privacy policy"
        description="What Coppice may show, and to whom: the minimum group size, the blocked fields, when an allowed field counts as a proxy, and how long data is kept. Every change is a new version with its author and reason."
      />
      {policy.isError && <ErrorNotice error={policy.error} title="The privacy policy could not be loaded" />}
      {policy.data && (
        <div className="space-y-6">
          <Card title={`Version ${policy.data.version}`} className="max-w-3xl">
            <p className="mb-4 text-sm text-slate-600">
              Set {policy.data.authorEmail ? `by ${policy.data.authorEmail} ` : ''}on{' '}
              {formatDateTime(policy.data.createdAt)}: “{policy.data.reason}”
            </p>
            {saved !== null && saved === policy.data.version && (
              <p role="status" className="mb-4 rounded-md bg-moss-50 px-3 py-2 text-sm text-moss-900">
                Saved as version {saved}.
              </p>
            )}
            {!canEdit && (
              <p className="mb-4 text-sm text-slate-600">Only a privacy officer can change the policy.</p>
            )}
            <PolicyForm
              policy={policy.data}
              canEdit={canEdit}
              suggestions={suggestions}
              knownColumns={columns?.map((c) => c.name)}
              onSubmit={async (body) => setSaved((await update.mutateAsync(body)).version)}
            />
          </Card>
          <Card title="Version history">
            {versions.isError && (
              <ErrorNotice error={versions.error} title="The history could not be loaded" />
            )}
            {versions.data && <PolicyHistory versions={versions.data} />}
          </Card>
        </div>
      )}
    </>
  );
}
