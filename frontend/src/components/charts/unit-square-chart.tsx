import { CartesianGrid, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import { ChartBox, chartColors, percentTick } from './chart-frame';

export type UnitSquareChartProps<T extends object> = {
  data: readonly T[];
  xKey: string;
  yKey: string;
  xLabel: string;
  lineName: string;
  xTicks?: number[];
  formatValue: (value: number) => string;
  formatLabel: (x: number) => string;
  dots?: boolean;
  width?: number;
  height: number;
};

/**
 * A line on the unit square (both axes 0–100 %) with the dashed diagonal of a random order:
 * the shared body of the ROC curve and the cumulative gains chart.
 */
export function UnitSquareChart<T extends object>(props: UnitSquareChartProps<T>) {
  const {
    data,
    xKey,
    yKey,
    xLabel,
    lineName,
    xTicks,
    formatValue,
    formatLabel,
    dots = true,
    width,
    height,
  } = props;
  return (
    <ChartBox width={width} height={height}>
      <LineChart data={data as T[]} margin={{ top: 8, right: 16, bottom: 20, left: 0 }}>
        <CartesianGrid stroke={chartColors.grid} />
        <XAxis
          dataKey={xKey}
          type="number"
          domain={[0, 1]}
          ticks={xTicks}
          tickFormatter={percentTick}
          tick={{ fill: chartColors.text, fontSize: 12 }}
          label={{
            value: xLabel,
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
          formatter={(value) => formatValue(Number(value))}
          labelFormatter={(v) => formatLabel(Number(v))}
        />
        <Line
          dataKey={yKey}
          name={lineName}
          type="linear"
          stroke={chartColors.moss}
          strokeWidth={2}
          isAnimationActive={false}
          {...(dots ? {} : { dot: false })}
        />
      </LineChart>
    </ChartBox>
  );
}
