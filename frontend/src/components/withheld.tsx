/** The words shown wherever a figure or group is withheld. */
export const WITHHELD_TEXT = 'withheld: fewer than k employees';

export type Withheld = { withheld: true };

export function isWithheldValue(value: unknown): value is Withheld {
  return typeof value === 'object' && value !== null && (value as { withheld?: unknown }).withheld === true;
}

export type HatchPatternProps = {
  /** the id to reference as `fill="url(#id)"`; must be unique on the page */
  id: string;
};

/** An SVG hatch for withheld shapes; put it inside an svg's `<defs>`. */
export function HatchPattern({ id }: HatchPatternProps) {
  return (
    <pattern id={id} width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
      <rect width="8" height="8" fill="#f4f6f7" />
      <line x1="0" y1="0" x2="0" y2="8" stroke="#a2afb5" strokeWidth="3" />
    </pattern>
  );
}

/** Turns React's useId() output into something safe inside `url(#...)`. */
export function svgId(reactId: string, suffix: string): string {
  return `${reactId.replace(/[^a-zA-Z0-9_-]/g, '')}-${suffix}`;
}

export type WithheldBoxProps = {
  className?: string;
};

/** A hatched box with the withheld words, for table cells, cards and figures. */
export function WithheldBox({ className = '' }: WithheldBoxProps) {
  return (
    <span
      data-withheld="true"
      className={`hatch-withheld inline-block rounded border border-slate-300 px-2 py-0.5 text-sm font-medium text-slate-700 ${className}`}
    >
      <span className="rounded bg-white/90 px-1">{WITHHELD_TEXT}</span>
    </span>
  );
}
