import type { ReactNode } from 'react';

interface SiteFooterProps {
  /** Extra small links, e.g. the development outbox. */
  links?: ReactNode;
}

export function SiteFooter({ links }: SiteFooterProps) {
  return (
    <footer className="mt-12 border-t border-mortar-300 py-6 text-sm text-ink-600">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p>Ridgeload · take-off, ordering and delivery between roofers and tile merchants</p>
        {links ? <nav aria-label="Footer">{links}</nav> : null}
      </div>
    </footer>
  );
}
