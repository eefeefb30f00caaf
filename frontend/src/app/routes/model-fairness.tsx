import { useParams } from 'react-router-dom';
import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { useModelFairness } from '../../features/fairness/api/get-model-fairness';
import { FairnessTable } from '../../features/fairness/components/fairness-table';

export function ModelFairnessRoute() {
  const { id = '' } = useParams();
  const fairness = useModelFairness(id);
  return (
    <>
      <PageHeader
        title="Fairness screen"
        description="How attrition and the model's predicted risk differ between the groups of each blocked field. Blocked fields are used here only, to audit the model, never to train it; nothing on this page reaches managers."
      />
      {fairness.isPending && <p className="text-slate-600">Computing the fairness screen…</p>}
      {fairness.isError && (
        <ErrorNotice error={fairness.error} title="The fairness screen could not be computed" />
      )}
      {fairness.data && (
        <div className="space-y-6">
          <p className="text-sm text-slate-600">
            Under privacy policy version {fairness.data.policyVersion}; groups of fewer than {fairness.data.k}{' '}
            employees are withheld.
          </p>
          {fairness.data.reports.length === 0 ? (
            <Card>
              <p className="text-sm text-slate-700">
                No blocked field of the policy is in this model run's dataset.
              </p>
            </Card>
          ) : (
            fairness.data.reports.map((report) => (
              <Card key={report.field}>
                <FairnessTable report={report} />
              </Card>
            ))
          )}
        </div>
      )}
    </>
  );
}
