import type { ReactNode } from 'react';

interface CardProps {
  title?: string;
  /** Heading level inside the page; section cards sit under the page's h1. */
  headingLevel?: 2 | 3;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
}

export function Card({ title, headingLevel = 2, actions, children, className = '' }: CardProps) {
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <section className={`rounded-lg border border-mortar-300 bg-white p-4 shadow-card sm:p-5 ${className}`}>
      {title || actions ? (
        <div className="mb-4 flex flex-wrap items-center justify-between gap-2">
          {title ? <Heading className="text-lg font-semibold text-ink-900">{title}</Heading> : null}
          {actions}
        </div>
      ) : null}
      {children}
    </section>
  );
}
