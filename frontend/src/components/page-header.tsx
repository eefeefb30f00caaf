import type { ReactNode } from 'react';

export type PageHeaderProps = {
  title: string;
  /** one or two sentences on what the page is for */
  description?: ReactNode;
  /** buttons or links for the page's main actions */
  actions?: ReactNode;
};

export function PageHeader({ title, description, actions }: PageHeaderProps) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-sand-200 pb-4">
      <div className="max-w-3xl">
        <h1 className="text-2xl font-semibold tracking-tight text-moss-900">{title}</h1>
        {description && <div className="mt-1 text-slate-600">{description}</div>}
      </div>
      {actions && <div className="print:hidden flex gap-2">{actions}</div>}
    </header>
  );
}
