import { cloneElement, type ReactElement, type ReactNode } from 'react';
import { ResponsiveContainer } from 'recharts';
import { WITHHELD_TEXT } from '../withheld';

/** Palette for charts, matching the theme in index.css. */
export const chartColors = {
  moss: '#3b5932',
  mossLight: '#8fae83',
  sand: '#c9a870',
  sandDark: '#987441',
  slate: '#76858d',
  slateLight: '#c8d0d4',
  grid: '#e3e8ea',
  text: '#46525a',
  signal: '#c4532c',
};

export type ChartFrameProps = {
  title: string;
  /** one line on how to read the chart */
  description?: ReactNode;
  /** the chart's figures as sentences, read by screen readers instead of the drawing */
  summary: string[];
  /** shows the hatch key under the chart */
  hasWithheld?: boolean;
  children: ReactNode;
};

export function ChartFrame({ title, description, summary, hasWithheld = false, children }: ChartFrameProps) {
  return (
    <figure className="rounded-lg border border-sand-200 bg-white p-4">
      <figcaption className="mb-2">
        <span className="block font-semibold text-slate-900">{title}</span>
        {description && <span className="block text-sm text-slate-600">{description}</span>}
      </figcaption>
      <div aria-hidden="true">{children}</div>
      {hasWithheld && (
        <p className="mt-2 flex items-center gap-2 text-xs text-slate-600">
          <span className="hatch-withheld inline-block h-3 w-5 rounded-sm border border-slate-300" />
          Hatched: {WITHHELD_TEXT}
        </p>
      )}
      <ul className="sr-only">
        {summary.map((line) => (
          <li key={line}>{line}</li>
        ))}
      </ul>
    </figure>
  );
}

export function percentTick(value: number): string {
  return `${Math.round(value * 100)}%`;
}

/** A y-axis top a little above the largest value, on a round step. */
export function niceTop(values: number[], step = 0.05): number {
  const max = Math.max(0, ...values);
  return Math.max(step, Math.ceil((max * 1.15) / step) * step);
}

/** Round percentage ticks from 0 up to `top` (5, 10 or 20 points apart), rather than quarters of it. */
export function shareTicks(top: number): number[] {
  const step = top <= 0.2 ? 0.05 : top <= 0.5 ? 0.1 : 0.2;
  const ticks: number[] = [];
  for (let i = 0; i * step <= top + 1e-9; i += 1) ticks.push(Math.round(i * step * 100) / 100);
  return ticks;
}

export type ChartBoxProps = {
  /** a fixed width in pixels; without it the chart fills its container's width */
  width?: number;
  height: number;
  children: ReactElement<{ width?: number; height?: number }>;
};

/** Sizes a recharts chart: responsive by default, fixed when a width is given (print, tests). */
export function ChartBox({ width, height, children }: ChartBoxProps) {
  if (width !== undefined) return cloneElement(children, { width, height });
  return (
    <ResponsiveContainer width="100%" height={height}>
      {children}
    </ResponsiveContainer>
  );
}
