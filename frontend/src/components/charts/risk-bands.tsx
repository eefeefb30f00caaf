import { useId } from 'react';
import { Bar, BarChart, type BarShapeProps, CartesianGrid, LabelList, XAxis, YAxis } from 'recharts';
import { formatCount } from '../stat-figure';
import { HatchPattern, isWithheldValue, svgId, WITHHELD_TEXT, type Withheld } from '../withheld';
import { ChartBox, ChartFrame, chartColors } from './chart-frame';
import { renderWithheldAwareBar } from './withheld-bar';

export type RiskBand = 'low' | 'medium' | 'high';

export type RiskBandEntry = {
  band: RiskBand;
  /** employees in the band */
  count: number | Withheld;
};

export type RiskBandsProps = {
  bands: readonly RiskBandEntry[];
  title?: string;
  description?: string;
  height?: number;
  /** fixed width in pixels; default: the container's width */
  width?: number;
};

const bandLabel: Record<RiskBand, string> = { low: 'Low', medium: 'Medium', high: 'High' };
const bandFill: Record<RiskBand, string> = {
  low: chartColors.mossLight,
  medium: chartColors.sand,
  high: chartColors.signal,
};

/** Employees by predicted risk band; bands about fewer than k employees are hatched. */
export function RiskBands({
  bands,
  title = 'Employees by risk band',
  description = 'Bands group employees by the model’s expected leaver share; no individual is shown.',
  height = 220,
  width,
}: RiskBandsProps) {
  const hatchId = svgId(useId(), 'hatch');
  const shown = bands.flatMap((b) => (isWithheldValue(b.count) ? [] : [b.count]));
  const top = Math.max(5, Math.ceil(Math.max(0, ...shown) * 1.15));
  const data = bands.map((b) =>
    isWithheldValue(b.count)
      ? { label: bandLabel[b.band], band: b.band, value: top, withheld: true, text: 'withheld' }
      : {
          label: bandLabel[b.band],
          band: b.band,
          value: b.count,
          withheld: false,
          text: formatCount(b.count),
        },
  );
  const summary = bands.map(
    (b) =>
      `${bandLabel[b.band]} risk: ${isWithheldValue(b.count) ? WITHHELD_TEXT : `${formatCount(b.count)} employees`}`,
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
            allowDecimals={false}
            tick={{ fill: chartColors.text, fontSize: 12 }}
            width={44}
          />
          <Bar
            dataKey="value"
            isAnimationActive={false}
            shape={(props: BarShapeProps) =>
              renderWithheldAwareBar(props, hatchId, (payload) => bandFill[payload.band as RiskBand])
            }
          >
            <LabelList dataKey="text" position="top" fill={chartColors.text} fontSize={12} />
          </Bar>
        </BarChart>
      </ChartBox>
    </ChartFrame>
  );
}
