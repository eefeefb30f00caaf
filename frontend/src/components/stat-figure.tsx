import { isWithheldValue, type Withheld, WithheldBox } from './withheld';

export type StatValue = number | string | Withheld | null;

export type StatFigureProps = {
  label: string;
  value: StatValue;
  /** formats a numeric value, e.g. `formatPercent` */
  format?: (value: number) => string;
  /** a short line under the figure ("organisation: 14.2%") */
  hint?: string;
};

export function formatPercent(share: number, digits = 1): string {
  return `${(share * 100).toFixed(digits)}%`;
}

export function formatCount(value: number): string {
  return value.toLocaleString('en-GB');
}

/** A headline number with its label; withheld figures are hatched and say so. */
export function StatFigure({ label, value, format = formatCount, hint }: StatFigureProps) {
  const withheld = isWithheldValue(value);
  return (
    <div
      className="rounded-lg border border-sand-200 bg-white px-4 py-3"
      data-withheld={withheld || undefined}
    >
      <dl>
        <dt className="text-sm font-medium text-slate-600">{label}</dt>
        <dd className="mt-1">
          {withheld ? (
            <WithheldBox />
          ) : (
            <span className="text-2xl font-semibold tabular-nums text-moss-900">
              {value === null ? '–' : typeof value === 'number' ? format(value) : value}
            </span>
          )}
        </dd>
        {hint && <dd className="mt-1 text-xs text-slate-500">{hint}</dd>}
      </dl>
    </div>
  );
}
