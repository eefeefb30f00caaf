import { Bar, BarChart, CartesianGrid, Legend, Tooltip, XAxis, YAxis } from 'recharts';
import { formatPercent } from '../stat-figure';
import { ChartBox, ChartFrame, chartColors, niceTop, percentTick } from './chart-frame';

export type CalibrationDecile = {
  /** 1 = lowest predicted risk, 10 = highest */
  decile: number;
  /** mean predicted leaver share in the decile, 0 to 1 */
  predicted: number;
  /** observed leaver share in the decile, 0 to 1 */
  observed: number;
};

export type CalibrationChartProps = {
  deciles: readonly CalibrationDecile[];
  title?: string;
  height?: number;
  width?: number;
};

export function CalibrationChart({
  deciles,
  title = 'Calibration by decile',
  height = 280,
  width,
}: CalibrationChartProps) {
  const data = [...deciles].sort((a, b) => a.decile - b.decile);
  const top = niceTop(
    data.flatMap((d) => [d.predicted, d.observed]),
    0.1,
  );
  const summary = data.map(
    (d) =>
      `Decile ${d.decile}: predicted ${formatPercent(d.predicted)}, observed ${formatPercent(d.observed)}`,
  );
  return (
    <ChartFrame
      title={title}
      description="Employees in ten equal groups by predicted risk: a well-calibrated model’s predicted and observed leaver shares match."
      summary={summary}
    >
      <ChartBox width={width} height={height}>
        <BarChart data={data} margin={{ top: 8, right: 8, bottom: 20, left: 0 }}>
          <CartesianGrid vertical={false} stroke={chartColors.grid} />
          <XAxis
            dataKey="decile"
            tick={{ fill: chartColors.text, fontSize: 12 }}
            label={{
              value: 'Decile of predicted risk',
              position: 'insideBottom',
              offset: -12,
              fill: chartColors.text,
              fontSize: 12,
            }}
          />
          <YAxis
            domain={[0, top]}
            tickFormatter={percentTick}
            tick={{ fill: chartColors.text, fontSize: 12 }}
            width={44}
          />
          <Tooltip
            formatter={(value) => formatPercent(Number(value))}
            labelFormatter={(v) => `Decile ${v}`}
          />
          <Legend verticalAlign="top" height={28} />
          <Bar dataKey="predicted" name="Predicted" fill={chartColors.sand} isAnimationActive={false} />
          <Bar dataKey="observed" name="Observed" fill={chartColors.moss} isAnimationActive={false} />
        </BarChart>
      </ChartBox>
    </ChartFrame>
  );
}
