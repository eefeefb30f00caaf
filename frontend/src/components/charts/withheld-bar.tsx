import { type BarShapeProps, Rectangle } from 'recharts';

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
