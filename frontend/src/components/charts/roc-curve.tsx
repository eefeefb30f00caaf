import { ChartFrame, percentTick } from './chart-frame';
import { UnitSquareChart } from './unit-square-chart';

export type RocPoint = {
  /** false positive rate, 0 to 1 */
  fpr: number;
  /** true positive rate (recall on leavers), 0 to 1 */
  tpr: number;
};

export type RocCurveProps = {
  points: readonly RocPoint[];
  /** area under the curve, shown in the title when given */
  auc?: number;
  title?: string;
  height?: number;
  width?: number;
};

export function RocCurve({ points, auc, title = 'ROC curve', height = 280, width }: RocCurveProps) {
  const data = [...points].sort((a, b) => a.fpr - b.fpr || a.tpr - b.tpr);
  const heading = auc === undefined ? title : `${title} (AUC ${auc.toFixed(3)})`;
  const summary = [
    auc === undefined ? 'Area under the curve not given.' : `Area under the curve: ${auc.toFixed(3)}.`,
    `${data.length} points from (0, 0) to (1, 1); the diagonal is a model no better than chance.`,
  ];
  return (
    <ChartFrame
      title={heading}
      description="Leavers found (true positive rate) against stayers wrongly flagged (false positive rate) as the threshold moves."
      summary={summary}
    >
      <UnitSquareChart
        data={data}
        xKey="fpr"
        yKey="tpr"
        xLabel="False positive rate"
        lineName="True positive rate"
        formatValue={percentTick}
        formatLabel={(x) => `FPR ${percentTick(x)}`}
        dots={false}
        width={width}
        height={height}
      />
    </ChartFrame>
  );
}
