import type { ModelResultView } from '../../../../../shared/models';
import { CalibrationChart } from '../../../components/charts/calibration-chart';
import { GainsChart } from '../../../components/charts/gains-chart';
import { ImportanceBars } from '../../../components/charts/importance-bars';
import { RocCurve } from '../../../components/charts/roc-curve';

/** ROC curve, calibration by decile, cumulative gains and importance: where people would rather look than read. */
export function RunCharts({ result }: { result: ModelResultView }) {
  const deciles = result.calibration.flatMap((bin) =>
    'withheld' in bin
      ? []
      : [{ decile: bin.decile, predicted: bin.meanPredicted, observed: bin.observedRate }],
  );
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <RocCurve
        points={result.roc.map((p) => ({ fpr: p.falsePositiveRate, tpr: p.truePositiveRate }))}
        auc={Number.isFinite(result.metrics.auc) ? result.metrics.auc : undefined}
      />
      {deciles.length > 0 && <CalibrationChart deciles={deciles} />}
      {result.gains.length > 0 && (
        <GainsChart
          points={result.gains.map((g) => ({ decile: g.decile, cumulativeGain: g.positiveShare }))}
        />
      )}
      <ImportanceBars
        items={result.drivers.map((d) => ({
          feature: d.feature,
          importance: d.importance,
          direction: d.trend,
        }))}
      />
    </div>
  );
}
