/** The caution every manager-facing page and export carries (PRODUCT.md). Keep the wording in this one place. */
export const CAUTION_TEXT =
  'This brief describes groups of employees, not any one person. It is a starting point for conversation and must not be used for decisions about individuals (such as dismissal, promotion or pay). Local employment and data-protection law and agreements with employee representatives take precedence.';

export type CautionProps = {
  className?: string;
};

export function Caution({ className = '' }: CautionProps) {
  return (
    <aside
      aria-label="Caution"
      className={`rounded-md border-l-4 border-sand-500 bg-sand-100 px-4 py-3 text-sm text-slate-800 ${className}`}
    >
      <p>
        <strong className="font-semibold">Caution: </strong>
        {CAUTION_TEXT}
      </p>
    </aside>
  );
}
