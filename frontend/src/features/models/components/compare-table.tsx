import type { ModelRunDetail } from '../../../../../shared/models';

const num = (x: number | undefined, digits = 3) =>
  x === undefined || !Number.isFinite(x) ? '–' : x.toFixed(digits);

type Row = { label: string; value: (run: ModelRunDetail) => string };

const rows: Row[] = [
  { label: 'Dataset', value: (r) => r.datasetName ?? '–' },
  { label: 'Started', value: (r) => new Date(r.createdAt).toLocaleString('en-GB') },
  { label: 'Policy version', value: (r) => `${r.policyVersion}${r.needsReview ? ' (needs review)' : ''}` },
  { label: 'Criterion', value: (r) => r.settings.criterion },
  { label: 'Maximum depth', value: (r) => String(r.settings.maxDepth) },
  { label: 'Minimum leaf (used)', value: (r) => `${r.settings.minLeaf} (${r.settings.effectiveMinLeaf})` },
  { label: 'Class weights', value: (r) => r.settings.classWeight },
  {
    label: 'Pruning',
    value: (r) => (r.settings.pruning === 'cv' ? `cross-validated, ${r.settings.folds} folds` : 'none'),
  },
  { label: 'Seed', value: (r) => String(r.settings.seed) },
  { label: 'Features used', value: (r) => String(r.features.length) },
  { label: 'Segments', value: (r) => String(r.result?.segments.length ?? '–') },
  {
    label: 'ROC AUC',
    value: (r) => {
      const cv = r.result?.crossValidation?.metrics.auc;
      return cv ? `${num(cv.mean)} ± ${num(cv.sd)}` : num(r.result?.metrics.auc);
    },
  },
  { label: 'Recall on leavers', value: (r) => num(r.result?.metrics.recall) },
  { label: 'Precision on leavers', value: (r) => num(r.result?.metrics.precision) },
  { label: 'Brier score', value: (r) => num(r.result?.metrics.brier) },
  {
    label: 'Top drivers',
    value: (r) =>
      r.result?.drivers
        .slice(0, 3)
        .map((d) => `${d.feature} (${Math.round(d.importance * 100)}%)`)
        .join(', ') || '–',
  },
];

/** Two or more runs side by side: settings, metrics and top drivers. */
export function CompareTable({ runs }: { runs: readonly ModelRunDetail[] }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-sand-200 bg-white">
      <table className="min-w-full text-sm">
        <caption className="sr-only">Model runs side by side</caption>
        <thead className="bg-sand-50">
          <tr>
            <th scope="col" className="px-3 py-2 text-left font-medium">
              Setting or figure
            </th>
            {runs.map((r, i) => (
              <th key={r.id} scope="col" className="px-3 py-2 text-left font-medium">
                Run {i + 1}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.label} className="border-t border-sand-100">
              <th scope="row" className="px-3 py-2 text-left font-medium text-slate-700">
                {row.label}
              </th>
              {runs.map((r) => (
                <td key={r.id} className="px-3 py-2 tabular-nums">
                  {row.value(r)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
