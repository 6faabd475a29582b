import type { ReactNode } from 'react';
import { Link, useLocation } from 'react-router-dom';
import { ToastOutlet } from '../ui/toast';
import { Wordmark } from '../ui/logo';
import { CautionSlot } from './caution-slot';
import { SiteFooter } from './site-footer';
import { SkipLink } from './skip-link';

interface PublicLayoutProps {
  children: ReactNode;
  footerLinks?: ReactNode;
  /** Wide pages (the outbox) drop the narrow card column. */
  wide?: boolean;
}

/** The frame of pages used before signing in: the mark, one column, a footer. */
export function PublicLayout({ children, footerLinks, wide = false }: PublicLayoutProps) {
  const location = useLocation();
  return (
    <div className="flex min-h-dvh flex-col">
      <SkipLink />
      <header className="surface-dark bg-ink-900 text-white">
        <div className={`mx-auto flex min-h-tap-lg items-center px-4 ${wide ? 'max-w-page' : 'max-w-xl'}`}>
          <Link to="/" className="inline-flex min-h-tap items-center rounded-md">
            <Wordmark markClassName="h-8 w-8" />
          </Link>
        </div>
      </header>
      <main id="main" tabIndex={-1} className={`mx-auto w-full flex-1 px-4 py-8 outline-none sm:py-12 ${wide ? 'max-w-page' : 'max-w-xl'}`}>
        <CautionSlot />
        <ToastOutlet pageKey={location.pathname} />
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
