import { CartesianGrid, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import { formatPercent } from '../stat-figure';
import { ChartBox, ChartFrame, chartColors, percentTick } from './chart-frame';

export type GainsPoint = {
  /** 1 to 10: the top `decile` tenths of employees by predicted risk */
  decile: number;
  /** share of all leavers found in those deciles, 0 to 1 */
  cumulativeGain: number;
};

export type GainsChartProps = {
  points: readonly GainsPoint[];
  title?: string;
  height?: number;
  width?: number;
};

export function GainsChart({ points, title = 'Cumulative gains', height = 280, width }: GainsChartProps) {
  const data = [
    { share: 0, gain: 0 },
    ...[...points]
      .sort((a, b) => a.decile - b.decile)
      .map((p) => ({ share: p.decile / 10, gain: p.cumulativeGain })),
  ];
  const summary = points.map(
    (p) =>
      `Top ${p.decile * 10}% of employees by predicted risk hold ${formatPercent(p.cumulativeGain)} of leavers`,
  );
  return (
    <ChartFrame
      title={title}
      description="Share of all leavers found when looking at the employees with the highest predicted risk first; the diagonal is random order."
      summary={summary}
    >
      <ChartBox width={width} height={height}>
        <LineChart data={data} margin={{ top: 8, right: 16, bottom: 20, left: 0 }}>
          <CartesianGrid stroke={chartColors.grid} />
          <XAxis
            dataKey="share"
            type="number"
            domain={[0, 1]}
            ticks={[0, 0.2, 0.4, 0.6, 0.8, 1]}
            tickFormatter={percentTick}
            tick={{ fill: chartColors.text, fontSize: 12 }}
            label={{
              value: 'Share of employees, highest risk first',
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
            formatter={(value) => formatPercent(Number(value))}
            labelFormatter={(v) => `Top ${percentTick(Number(v))}`}
          />
          <Line
            dataKey="gain"
            name="Leavers found"
            type="linear"
            stroke={chartColors.moss}
            strokeWidth={2}
            isAnimationActive={false}
          />
        </LineChart>
      </ChartBox>
    </ChartFrame>
  );
}
