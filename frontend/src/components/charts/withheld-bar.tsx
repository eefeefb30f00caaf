import { useId } from 'react';
import {
  Bar,
  BarChart,
  type BarShapeProps,
  CartesianGrid,
  LabelList,
  Rectangle,
  XAxis,
  YAxis,
} from 'recharts';
import { HatchPattern, svgId } from '../withheld';
import { ChartBox, ChartFrame, chartColors } from './chart-frame';

/**
 * Draws one bar for recharts' `shape` prop. Withheld entries (payload `withheld: true`) become a
 * hatched column over the whole plot height, so they read as "not shown" rather than as a value.
 */
export function renderWithheldAwareBar(
  props: BarShapeProps,
  hatchId: string,
  fillFor: (payload: Record<string, unknown>, index: number) => string,
) {
  const payload = (props.payload ?? {}) as Record<string, unknown>;
  if (payload.withheld === true) {
    const background = props.background as { y?: number; height?: number } | undefined;
    return (
      <Rectangle
        x={props.x}
        width={props.width}
        y={background?.y ?? props.y}
        height={background?.height ?? props.height}
        fill={`url(#${hatchId})`}
        stroke="#a2afb5"
      />
    );
  }
  return (
    <Rectangle
      x={props.x}
      y={props.y}
      width={props.width}
      height={props.height}
      fill={fillFor(payload, props.index)}
    />
  );
}

/** One bar: a withheld bar is drawn at `value` = the axis top, hatched, and labelled "withheld". */
export type WithheldBarDatum = { label: string; value: number; withheld: boolean; text: string } & Record<
  string,
  unknown
>;

export type WithheldBarChartProps = {
  title: string;
  description?: string;
  /** one line per bar for screen readers and the text alternative */
  summary: string[];
  data: WithheldBarDatum[];
  /** the value axis runs from 0 to here */
  top: number;
  fillFor: (payload: Record<string, unknown>, index: number) => string;
  tickFormatter?: (value: number) => string;
  /** the value axis's ticks; by default recharts chooses */
  ticks?: number[];
  allowDecimals?: boolean;
  height: number;
  width?: number;
};

/** A labelled bar chart in which withheld bars are hatched columns (rates, band counts). */
export function WithheldBarChart({
  title,
  description,
  summary,
  data,
  top,
  fillFor,
  tickFormatter,
  ticks,
  allowDecimals,
  height,
  width,
}: WithheldBarChartProps) {
  const hatchId = svgId(useId(), 'hatch');
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
            tickFormatter={tickFormatter}
            ticks={ticks}
            allowDecimals={allowDecimals}
            tick={{ fill: chartColors.text, fontSize: 12 }}
            width={44}
          />
          <Bar
            dataKey="value"
            isAnimationActive={false}
            shape={(props: BarShapeProps) => renderWithheldAwareBar(props, hatchId, fillFor)}
          >
            <LabelList dataKey="text" position="top" fill={chartColors.text} fontSize={12} />
          </Bar>
        </BarChart>
      </ChartBox>
    </ChartFrame>
  );
}
