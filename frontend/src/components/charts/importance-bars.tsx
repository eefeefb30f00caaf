import { Bar, BarChart, type BarShapeProps, CartesianGrid, Rectangle, XAxis, YAxis } from 'recharts';
import { ChartBox, ChartFrame, chartColors } from './chart-frame';

export type DriverDirection = 'raises' | 'lowers' | 'mixed';

export type ImportanceItem = {
  feature: string;
  /** relative importance; bars are drawn against the largest */
  importance: number;
  /** which way higher values move the leaver share, when known */
  direction?: DriverDirection;
};

export type ImportanceBarsProps = {
  items: readonly ImportanceItem[];
  title?: string;
  /** at most this many bars, largest first (default 12) */
  limit?: number;
  width?: number;
};

const directionFill: Record<DriverDirection | 'unknown', string> = {
  raises: chartColors.signal,
  lowers: chartColors.moss,
  mixed: chartColors.sand,
  unknown: chartColors.slate,
};

const directionWords: Record<DriverDirection, string> = {
  raises: 'raises the leaver share',
  lowers: 'lowers the leaver share',
  mixed: 'raises or lowers it depending on the segment',
};

export function ImportanceBars({
  items,
  title = 'Feature importance',
  limit = 12,
  width,
}: ImportanceBarsProps) {
  const data = [...items].sort((a, b) => b.importance - a.importance).slice(0, limit);
  const total = data.reduce((sum, d) => sum + d.importance, 0) || 1;
  const summary = data.map(
    (d) =>
      `${d.feature}: ${Math.round((d.importance / total) * 100)}% of the importance shown${d.direction ? `, ${directionWords[d.direction]}` : ''}`,
  );
  const hasDirections = data.some((d) => d.direction);
  return (
    <ChartFrame
      title={title}
      description={
        hasDirections ? (
          <span className="inline-flex flex-wrap gap-3">
            {(['raises', 'lowers', 'mixed'] as const).map((dir) => (
              <span key={dir} className="inline-flex items-center gap-1">
                <span
                  className="inline-block h-3 w-3 rounded-sm"
                  style={{ background: directionFill[dir] }}
                />
                {directionWords[dir]}
              </span>
            ))}
          </span>
        ) : (
          'How much each feature contributes to the tree’s splits.'
        )
      }
      summary={summary}
    >
      <ChartBox width={width} height={Math.max(120, data.length * 30 + 40)}>
        <BarChart data={data} layout="vertical" margin={{ top: 4, right: 16, bottom: 4, left: 8 }}>
          <CartesianGrid horizontal={false} stroke={chartColors.grid} />
          <XAxis type="number" hide domain={[0, 'dataMax']} />
          <YAxis
            type="category"
            dataKey="feature"
            width={170}
            tick={{ fill: chartColors.text, fontSize: 12 }}
          />
          <Bar
            dataKey="importance"
            isAnimationActive={false}
            shape={(props: BarShapeProps) => (
              <Rectangle
                x={props.x}
                y={props.y}
                width={props.width}
                height={props.height}
                fill={directionFill[(props.payload as ImportanceItem).direction ?? 'unknown']}
              />
            )}
          />
        </BarChart>
      </ChartBox>
    </ChartFrame>
  );
}
