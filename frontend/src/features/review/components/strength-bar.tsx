export type StrengthBarProps = {
  /** Cramér's V, 0 to 1 */
  value: number;
  /** the policy's proxy threshold, drawn as a mark */
  threshold: number;
  flagged: boolean;
};

const WIDTH = 128;

/** How strongly two columns go together, as a bar with the threshold marked. */
export function StrengthBar({ value, threshold, flagged }: StrengthBarProps) {
  const length = Math.min(1, Math.max(0, value)) * WIDTH;
  const mark = Math.min(1, Math.max(0, threshold)) * WIDTH;
  return (
    <span className="inline-flex items-center gap-2">
      <svg
        width={WIDTH}
        height={10}
        role="img"
        aria-label={`Cramér's V ${value.toFixed(2)}${flagged ? ', at or above the threshold' : ''}`}
        className="shrink-0"
      >
        <rect width={WIDTH} height={10} rx={5} className="fill-sand-200" />
        <rect width={length} height={10} rx={5} className={flagged ? 'fill-signal-500' : 'fill-moss-500'} />
        <rect x={Math.max(0, mark - 1)} width={2} height={10} className="fill-slate-800" />
      </svg>
      <span className="tabular-nums">{value.toFixed(2)}</span>
    </span>
  );
}
