import type { ReactNode } from 'react';

interface PageHeaderProps {
  title: string;
  /** A short line under the heading: whose page this is, or what it is for. */
  lead?: ReactNode;
  actions?: ReactNode;
}

export function PageHeader({ title, lead, actions }: PageHeaderProps) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-3">
      <div>
        <h1 className="text-2xl font-bold text-ink-900 sm:text-3xl">{title}</h1>
        {lead ? <p className="mt-1 text-base text-ink-600">{lead}</p> : null}
      </div>
      {actions}
    </header>
  );
}
