import { formatCount } from '../stat-figure';
import { isWithheldValue, WITHHELD_TEXT, type Withheld } from '../withheld';
import { chartColors } from './chart-frame';
import { WithheldBarChart } from './withheld-bar';

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
    <WithheldBarChart
      title={title}
      description={description}
      summary={summary}
      data={data}
      top={top}
      fillFor={(payload) => bandFill[payload.band as RiskBand]}
      allowDecimals={false}
      height={height}
      width={width}
    />
  );
}
