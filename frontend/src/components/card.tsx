import type { ReactNode } from 'react';

export type CardProps = {
  /** a heading for the card; rendered as h2 unless `headingLevel` says otherwise */
  title?: ReactNode;
  headingLevel?: 2 | 3 | 4;
  /** small controls shown at the right of the heading */
  actions?: ReactNode;
  className?: string;
  children?: ReactNode;
};

export function Card({ title, headingLevel = 2, actions, className = '', children }: CardProps) {
  const Heading = `h${headingLevel}` as const;
  return (
    <section className={`rounded-lg border border-sand-200 bg-white p-5 shadow-sm ${className}`}>
      {(title || actions) && (
        <div className="mb-3 flex items-start justify-between gap-3">
          {title && <Heading className="text-base font-semibold text-slate-900">{title}</Heading>}
          {actions && <div className="flex shrink-0 gap-2">{actions}</div>}
        </div>
      )}
      {children}
    </section>
  );
}
