import { formatPercent } from '../stat-figure';
import { ChartFrame, percentTick } from './chart-frame';
import { UnitSquareChart } from './unit-square-chart';

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
      <UnitSquareChart
        data={data}
        xKey="share"
        yKey="gain"
        xLabel="Share of employees, highest risk first"
        lineName="Leavers found"
        xTicks={[0, 0.2, 0.4, 0.6, 0.8, 1]}
        formatValue={formatPercent}
        formatLabel={(x) => `Top ${percentTick(x)}`}
        width={width}
        height={height}
      />
    </ChartFrame>
  );
}
