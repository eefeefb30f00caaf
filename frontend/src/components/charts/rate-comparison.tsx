import { formatPercent } from '../stat-figure';
import { isWithheldValue, WITHHELD_TEXT, type Withheld } from '../withheld';
import { chartColors, niceTop, percentTick, shareTicks } from './chart-frame';
import { WithheldBarChart } from './withheld-bar';

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
    <WithheldBarChart
      title={title}
      description={description}
      summary={summary}
      data={data}
      top={top}
      fillFor={(_, i) => fills[Math.min(i, fills.length - 1)]}
      tickFormatter={percentTick}
      ticks={shareTicks(top)}
      height={height}
      width={width}
    />
  );
}
