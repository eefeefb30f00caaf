import type { Policy } from '../../../../shared/policy';
import type { FairnessReportView } from '../../../../shared/privacy';
import { fairnessScreen } from '../../analysis/fairness';
import type { DatasetColumnsForEngine } from '../datasets/engine-columns';

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
