import { CartesianGrid, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import { ChartBox, ChartFrame, chartColors, percentTick } from './chart-frame';

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
      <ChartBox width={width} height={height}>
        <LineChart data={data} margin={{ top: 8, right: 16, bottom: 20, left: 0 }}>
          <CartesianGrid stroke={chartColors.grid} />
          <XAxis
            dataKey="fpr"
            type="number"
            domain={[0, 1]}
            tickFormatter={percentTick}
            tick={{ fill: chartColors.text, fontSize: 12 }}
            label={{
              value: 'False positive rate',
              position: 'insideBottom',
              offset: -12,
              fill: chartColors.text,
              fontSize: 12,
            }}
          />
          <YAxis
            type="number"
            domain={[0, 1]}
            tickFormatter={percentTick}
            tick={{ fill: chartColors.text, fontSize: 12 }}
            width={44}
          />
          <ReferenceLine
            segment={[
              { x: 0, y: 0 },
              { x: 1, y: 1 },
            ]}
            stroke={chartColors.slate}
            strokeDasharray="4 4"
          />
          <Tooltip
            formatter={(value) => percentTick(Number(value))}
            labelFormatter={(v) => `FPR ${percentTick(Number(v))}`}
          />
          <Line
            dataKey="tpr"
            name="True positive rate"
            type="linear"
            stroke={chartColors.moss}
            strokeWidth={2}
            dot={false}
            isAnimationActive={false}
          />
        </LineChart>
      </ChartBox>
    </ChartFrame>
  );
}
