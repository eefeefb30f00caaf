import { useId } from 'react';
import { Bar, BarChart, type BarShapeProps, CartesianGrid, LabelList, XAxis, YAxis } from 'recharts';
import { formatPercent } from '../stat-figure';
import { HatchPattern, isWithheldValue, svgId, WITHHELD_TEXT, type Withheld } from '../withheld';
import { ChartBox, ChartFrame, chartColors, niceTop, percentTick } from './chart-frame';
import { renderWithheldAwareBar } from './withheld-bar';

export type RateEntry = {
  /** "Team Riverside", "Department North", "Organisation" */
  label: string;
  /** attrition rate as a share, 0 to 1 */
  rate: number | Withheld;
};

export type RateComparisonProps = {
  rates: readonly RateEntry[];
  title?: string;
  description?: string;
  height?: number;
  /** fixed width in pixels; default: the container's width */
  width?: number;
};

const fills = [chartColors.moss, chartColors.sand, chartColors.slate];

/** Attrition rate bars, e.g. team vs department vs organisation; the first bar is the subject. */
export function RateComparison({
  rates,
  title = 'Attrition rate compared',
  description,
  height = 220,
  width,
}: RateComparisonProps) {
  const hatchId = svgId(useId(), 'hatch');
  const shown = rates.flatMap((r) => (isWithheldValue(r.rate) ? [] : [r.rate]));
  const top = niceTop(shown);
  const data = rates.map((r) =>
    isWithheldValue(r.rate)
      ? { label: r.label, value: top, withheld: true, text: 'withheld' }
      : { label: r.label, value: r.rate, withheld: false, text: formatPercent(r.rate) },
  );
  const summary = rates.map(
    (r) => `${r.label}: ${isWithheldValue(r.rate) ? WITHHELD_TEXT : formatPercent(r.rate)}`,
  );
  return (
    <ChartFrame
      title={title}
      description={description}
      summary={summary}
      hasWithheld={data.some((d) => d.withheld)}
    >
      <ChartBox width={width} height={height}>
        <BarChart data={data} margin={{ top: 20, right: 8, bottom: 4, left: 0 }}>
          <defs>
            <HatchPattern id={hatchId} />
          </defs>
          <CartesianGrid vertical={false} stroke={chartColors.grid} />
          <XAxis dataKey="label" tick={{ fill: chartColors.text, fontSize: 12 }} />
          <YAxis
            domain={[0, top]}
            tickFormatter={percentTick}
            tick={{ fill: chartColors.text, fontSize: 12 }}
            width={44}
          />
          <Bar
            dataKey="value"
            isAnimationActive={false}
            shape={(props: BarShapeProps) =>
              renderWithheldAwareBar(props, hatchId, (_, i) => fills[Math.min(i, fills.length - 1)])
            }
          >
            <LabelList dataKey="text" position="top" fill={chartColors.text} fontSize={12} />
          </Bar>
        </BarChart>
      </ChartBox>
    </ChartFrame>
  );
}
