import type { ReactNode } from 'react';
import { InAppLink } from '../ui/in-app-link';
import { Wordmark } from '../ui/logo';
import { SiteFooter } from './site-footer';
import { SkipLink } from './skip-link';

interface PublicLayoutProps {
  children: ReactNode;
  footerLinks?: ReactNode;
  /** What the router shows above the page (cautions, notes carried over); the sign-in page has none before it loads. */
  notices?: ReactNode;
  /** Wide pages (the outbox) drop the narrow card column. */
  wide?: boolean;
}

/**
 * The frame of pages used before signing in: the mark, one column, a footer. It needs no router, so
 * the sign-in page shows in it before the router's code has arrived.
 */
export function PublicLayout({ children, footerLinks, notices, wide = false }: PublicLayoutProps) {
  return (
    <div className="flex min-h-dvh flex-col">
      <SkipLink />
      <header className="surface-dark bg-ink-900 text-white">
        <div className={`mx-auto flex min-h-tap-lg items-center px-4 ${wide ? 'max-w-page' : 'max-w-xl'}`}>
          <InAppLink to="/" className="inline-flex min-h-tap items-center rounded-md">
            <Wordmark markClassName="h-8 w-8" />
          </InAppLink>
        </div>
      </header>
      <main id="main" tabIndex={-1} className={`mx-auto w-full flex-1 px-4 py-8 outline-none sm:py-12 ${wide ? 'max-w-page' : 'max-w-xl'}`}>
        {notices}
        {children}
      </main>
      <div className={`mx-auto w-full px-4 ${wide ? 'max-w-page' : 'max-w-xl'}`}>
        <SiteFooter links={footerLinks} />
      </div>
    </div>
  );
}

interface AuthCardProps {
  title: string;
  lead?: ReactNode;
  children: ReactNode;
  after?: ReactNode;
}

/** The white card that holds a sign-in-style form, with its page heading. */
export function AuthCard({ title, lead, children, after }: AuthCardProps) {
  return (
    <>
      <section className="rounded-lg border border-mortar-300 bg-white p-5 shadow-card sm:p-8">
        <h1 className="text-2xl font-bold sm:text-3xl">{title}</h1>
        {lead ? <p className="mt-2 text-ink-600">{lead}</p> : null}
        <div className="mt-6">{children}</div>
      </section>
      {after ? <div className="mt-6 space-y-2 text-center">{after}</div> : null}
    </>
  );
}
