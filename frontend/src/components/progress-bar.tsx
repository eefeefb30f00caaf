export type ProgressBarProps = {
  /** 0 to 1; leave out while the amount of work is not known */
  value?: number;
  label: string;
  /** what is happening now ("cross-validating") */
  phase?: string;
};

export function ProgressBar({ value, label, phase }: ProgressBarProps) {
  const known = value !== undefined && Number.isFinite(value);
  const percent = known ? Math.round(Math.min(1, Math.max(0, value)) * 100) : undefined;
  return (
    <div className="w-full">
      <div className="mb-1 flex justify-between text-sm text-slate-700">
        <span>
          {label}
          {phase && <span className="text-slate-500"> · {phase}</span>}
        </span>
        {percent !== undefined && <span className="tabular-nums">{percent}%</span>}
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        aria-valuetext={phase ? `${percent ?? 'unknown'} percent, ${phase}` : undefined}
        className="h-2.5 w-full overflow-hidden rounded-full bg-sand-200"
      >
        <div
          className={`h-full rounded-full bg-moss-600 transition-[width] ${known ? '' : 'w-1/3 animate-pulse'}`}
          style={known ? { width: `${percent}%` } : undefined}
        />
      </div>
    </div>
  );
}
