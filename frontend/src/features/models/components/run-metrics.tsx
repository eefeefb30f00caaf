import { useId, useState } from 'react';
import type { ModelResultView } from '../../../../../shared/models';
import { formatPercent, StatFigure } from '../../../components/stat-figure';
import { WithheldBox } from '../../../components/withheld';

type RocView = ModelResultView['roc'][number];

/** Recall, precision and the four counts when everyone at or above a ROC point's threshold is flagged. */
export function atRocPoint(point: RocView, positives: number, negatives: number, k: number) {
  const truePositive = Math.round(point.truePositiveRate * positives);
  const falsePositive = Math.round(point.falsePositiveRate * negatives);
  const flagged = truePositive + falsePositive;
  const cell = (n: number) => (n > 0 && n < k ? ({ withheld: true } as const) : n);
  return {
    threshold: point.threshold,
    recall: point.truePositiveRate,
    precision: flagged > 0 ? truePositive / flagged : Number.NaN,
    flaggedShare: flagged / (positives + negatives),
    cells: {
      truePositive: cell(truePositive),
      falseNegative: cell(positives - truePositive),
      falsePositive: cell(falsePositive),
      trueNegative: cell(negatives - falsePositive),
    },
  };
}

const fmt = (x: number) => (Number.isFinite(x) ? formatPercent(x) : '–');
const spread = (mean: number, sd: number) =>
  Number.isFinite(sd) ? `${mean.toFixed(3)} ± ${sd.toFixed(3)}` : mean.toFixed(3);

export type RunMetricsProps = { result: ModelResultView; k: number };

/** Headline figures with their cross-validation spread, and a threshold the analyst can move. */
export function RunMetrics({ result, k }: RunMetricsProps) {
  const sliderId = useId();
  const points = result.roc.filter((p) => p.truePositiveRate > 0 || p.falsePositiveRate > 0);
  // Start at the point nearest the base rate threshold the server used.
  const initial = Math.max(
    0,
    points.findIndex((p) => Number.isFinite(p.threshold) && p.threshold <= result.baseRate),
  );
  const [index, setIndex] = useState(initial);
  const positives = result.positive;
  const negatives = result.rowCount - result.positive;
  const at =
    points.length > 0
      ? atRocPoint(points[Math.min(index, points.length - 1)], positives, negatives, k)
      : null;
  const cv = result.crossValidation;
  const source =
    result.metricsSource === 'cross-validation'
      ? `${cv?.folds}-fold cross-validation`
      : 'training data (too few leavers to cross-validate)';
  return (
    <div className="space-y-4">
      <p className="text-sm text-slate-600">Figures from {source}.</p>
      <div className="grid gap-3 sm:grid-cols-4">
        <StatFigure
          label="ROC AUC"
          value={cv ? spread(cv.metrics.auc.mean, cv.metrics.auc.sd) : result.metrics.auc.toFixed(3)}
          hint={cv ? 'mean ± standard deviation across folds' : undefined}
        />
        <StatFigure label="Base rate (leaver share)" value={result.baseRate} format={formatPercent} />
        <StatFigure
          label="Recall on leavers"
          value={cv ? spread(cv.metrics.recall.mean, cv.metrics.recall.sd) : fmt(result.metrics.recall)}
          hint="at the base-rate threshold"
        />
        <StatFigure
          label="Precision on leavers"
          value={
            cv ? spread(cv.metrics.precision.mean, cv.metrics.precision.sd) : fmt(result.metrics.precision)
          }
          hint="at the base-rate threshold"
        />
      </div>
      {at && (
        <div className="rounded-lg border border-sand-200 bg-white p-4">
          <label htmlFor={sliderId} className="block text-sm font-medium text-slate-800">
            Flag employees whose predicted leaver share is at least{' '}
            <span className="tabular-nums">{fmt(at.threshold)}</span>
          </label>
          <input
            id={sliderId}
            type="range"
            min={0}
            max={points.length - 1}
            step={1}
            value={Math.min(index, points.length - 1)}
            onChange={(e) => setIndex(Number(e.target.value))}
            className="mt-2 w-full accent-moss-700"
          />
          <p className="mt-2 text-sm text-slate-700">
            Recall {fmt(at.recall)} · precision {fmt(at.precision)} · {fmt(at.flaggedShare)} of employees
            flagged
          </p>
          <table className="mt-3 text-sm">
            <caption className="text-left font-medium text-slate-800">
              Confusion matrix at this threshold
            </caption>
            <thead>
              <tr>
                <th />
                <th className="px-3 text-left font-medium">Flagged</th>
                <th className="px-3 text-left font-medium">Not flagged</th>
              </tr>
            </thead>
            <tbody>
              {(
                [
                  ['Leavers', at.cells.truePositive, at.cells.falseNegative],
                  ['Stayers', at.cells.falsePositive, at.cells.trueNegative],
                ] as const
              ).map(([label, a, b]) => (
                <tr key={label}>
                  <th className="pr-3 text-left font-medium">{label}</th>
                  {(
                    [
                      ['flagged', a],
                      ['not-flagged', b],
                    ] as const
                  ).map(([column, cell]) => (
                    <td key={column} className="px-3 py-1 tabular-nums">
                      {typeof cell === 'number' ? cell.toLocaleString('en-GB') : <WithheldBox />}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
