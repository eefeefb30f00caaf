import type { Policy } from '../../../../shared/policy';
import type { FairnessReportView } from '../../../../shared/privacy';
import { fairnessScreen } from '../../analysis/fairness';
import { conflict, notFound } from '../../lib/errors';
import { predict } from '../../modeling/tree-json';
import { recordAudit } from '../audit/audit.repository';
import type { SessionUser } from '../auth/session-types';
import { loadDatasetColumns } from '../datasets/datasets.repository';
import type { DatasetColumnsForEngine } from '../datasets/engine-columns';
import { findModelRun } from '../models/models.repository';
import { trainingTable } from '../models/train-run';
import { currentPolicy } from '../policy/policy.service';

/**
 * The fairness screen of a model run: for every blocked field present in the dataset, per group
 * headcount, attrition and mean predicted risk, with the four-fifths check and small groups
 * withheld. A blocked date of birth is grouped by age, as the engine derives it. For privacy
 * officers only: nothing of it reaches a manager.
 */
export function fairnessReports(
  columns: DatasetColumnsForEngine,
  predicted: readonly number[],
  policy: Pick<Policy, 'k' | 'blockedFields'>,
): FairnessReportView[] {
  if (predicted.length !== columns.rowCount) {
    throw new Error(`expected ${columns.rowCount} predictions, got ${predicted.length}`);
  }
  const left = columns.labels.map((label) => label === 1);
  const reports: FairnessReportView[] = [];
  for (const field of policy.blockedFields) {
    const feature = columns.features.find((f) => f.name === field || f.derivedFrom === field);
    if (!feature) continue;
    reports.push(
      fairnessScreen({
        field,
        values: feature.values,
        left,
        predicted,
        k: policy.k,
        kind: feature.kind === 'numeric' ? 'numeric' : 'categorical',
      }),
    );
  }
  return reports;
}

export type ModelRunFairness = {
  modelRunId: string;
  datasetId: string;
  policyVersion: number;
  k: number;
  reports: FairnessReportView[];
};

/**
 * The fairness screen of a finished model run: its tree's predictions on the dataset's rows,
 * grouped by every blocked field of the policy in force. Reads employee-level data, so it is
 * audited; only aggregated figures leave this function.
 */
export async function modelRunFairness(actor: SessionUser, modelRunId: string): Promise<ModelRunFairness> {
  const run = await findModelRun(modelRunId);
  if (!run) throw notFound('The model run');
  if (run.status !== 'done' || !run.result) {
    throw conflict('The fairness screen needs a finished model run; this one is not done.', {
      status: run.status,
    });
  }
  const [columns, policy] = await Promise.all([loadDatasetColumns(run.datasetId), currentPolicy()]);
  const predicted = Array.from(predict(run.result.tree, trainingTable(columns, run.features)));
  const k = Math.max(policy.k, run.k);
  const reports = fairnessReports(columns, predicted, { k, blockedFields: policy.blockedFields });
  await recordAudit({
    actor,
    action: 'model.fairness_viewed',
    objectType: 'model',
    objectId: modelRunId,
    details: { fields: reports.map((r) => r.field), policyVersion: policy.version, k },
  });
  return { modelRunId, datasetId: run.datasetId, policyVersion: policy.version, k, reports };
}
