import type { ReactNode } from 'react';

interface EmptyStateProps {
  title: string;
  children?: ReactNode;
  action?: ReactNode;
}

export function EmptyState({ title, children, action }: EmptyStateProps) {
  return (
    <div className="rounded-md border border-dashed border-ink-300 bg-mortar-50 px-4 py-6 text-center">
      <p className="font-semibold text-ink-800">{title}</p>
      {children ? <div className="mt-1 text-sm text-ink-600">{children}</div> : null}
      {action ? <div className="mt-4">{action}</div> : null}
    </div>
  );
}
