import { useEffect, useId, useRef, useState } from 'react';
import type { ReactNode } from 'react';
import { Link, NavLink, useLocation } from 'react-router-dom';
import { ToastOutlet } from '../ui/toast';
import { Button } from '../ui/button';
import { Wordmark } from '../ui/logo';
import { CautionSlot } from './caution-slot';
import { NavIcon } from './nav-icon';
import type { NavIconName } from './nav-icon';
import { SiteFooter } from './site-footer';
import { SkipLink } from './skip-link';

export interface NavItem {
  to: string;
  label: string;
  icon: NavIconName;
  /** Starts loading the page's code ahead of a click (on pointing at, touching or focusing the link). */
  prefetch?: () => void;
}

interface AppShellProps {
  navItems: readonly NavItem[];
  homePath: string;
  person: { name: string; roleLabel: string; organisationName: string };
  onSignOut: () => void;
  signingOut?: boolean;
  footerLinks?: ReactNode;
  children: ReactNode;
}

function PersonCard({ person }: { person: AppShellProps['person'] }) {
  return (
    <div className="min-w-0">
      <p className="truncate font-semibold">{person.name}</p>
      <p className="truncate text-sm text-ink-300">
        {person.roleLabel} · {person.organisationName}
      </p>
    </div>
  );
}

function navLinkClasses({ isActive }: { isActive: boolean }, large: boolean): string {
  return [
    'flex items-center gap-3 rounded-md border-l-4 font-medium transition-colors',
    large ? 'min-h-tap-lg px-4 text-lg' : 'min-h-tap px-3',
    isActive ? 'border-clay-400 bg-ink-800 text-white' : 'border-transparent text-ink-100 hover:bg-ink-800',
  ].join(' ');
}

/**
 * The signed-in frame: a side navigation on wide screens; on a phone a compact top bar with a
 * menu of large targets (drivers work with gloves on).
 */
export function AppShell({ navItems, homePath, person, onSignOut, signingOut = false, footerLinks, children }: AppShellProps) {
  const location = useLocation();
  // The phone menu is open only on the page it was opened on, so a navigation closes it.
  const [menuOpenOn, setMenuOpenOn] = useState<string | null>(null);
  const menuOpen = menuOpenOn === location.pathname;
  const menuId = useId();
  const menuButton = useRef<HTMLButtonElement>(null);
  const menuPanel = useRef<HTMLDivElement>(null);
  const mainRef = useRef<HTMLElement>(null);
  const firstRender = useRef(true);

  // After a navigation, move focus to the new page so screen readers start there.
  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    mainRef.current?.focus();
  }, [location.pathname]);

  useEffect(() => {
    if (!menuOpen) return undefined;
    menuPanel.current?.querySelector<HTMLElement>('a, button')?.focus();
    function onKey(event: KeyboardEvent) {
      if (event.key === 'Escape') {
        setMenuOpenOn(null);
        menuButton.current?.focus();
      }
    }
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [menuOpen]);

  return (
    <div className="min-h-dvh lg:flex">
      <SkipLink />

      {/* Phone and tablet: top bar and menu. */}
      <header className="surface-dark sticky top-0 z-40 bg-ink-900 text-ink-100 lg:hidden">
        <div className="flex min-h-tap-lg items-center justify-between gap-3 px-3">
          <Link to={homePath} className="inline-flex min-h-tap items-center rounded-md px-1 text-white">
            <Wordmark markClassName="h-8 w-8" />
          </Link>
          <button
            ref={menuButton}
            type="button"
            aria-expanded={menuOpen}
            aria-controls={menuId}
            onClick={() => setMenuOpenOn(menuOpen ? null : location.pathname)}
            className="inline-flex min-h-tap min-w-tap items-center gap-2 rounded-md border border-ink-600 px-4 text-lg font-semibold text-white"
          >
            <svg viewBox="0 0 24 24" className="h-6 w-6" aria-hidden="true" focusable="false">
              <path d={menuOpen ? 'M6 6l12 12M18 6 6 18' : 'M4 7h16M4 12h16M4 17h16'} stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
            </svg>
            Menu
          </button>
        </div>
        <div id={menuId} ref={menuPanel} hidden={!menuOpen} className="border-t border-ink-700 px-3 pt-2 pb-4">
          <nav aria-label="Main">
            <ul className="space-y-1">
              {navItems.map((item) => (
                <li key={item.to}>
                  <NavLink to={item.to} end className={(state) => navLinkClasses(state, true)} onPointerEnter={item.prefetch} onFocus={item.prefetch}>
                    <NavIcon name={item.icon} className="h-6 w-6" />
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          <div className="mt-4 flex items-center justify-between gap-3 border-t border-ink-700 pt-4">
            <PersonCard person={person} />
            <Button variant="secondary" size="lg" busy={signingOut} onClick={onSignOut} className="shrink-0 whitespace-nowrap">
              Sign out
            </Button>
          </div>
        </div>
      </header>

      {/* Desktop: side navigation. */}
      <aside className="surface-dark sticky top-0 hidden h-dvh w-64 shrink-0 flex-col bg-ink-900 text-ink-100 lg:flex">
        <div className="px-5 pt-6 pb-8">
          <Link to={homePath} className="inline-flex rounded-md text-white">
            <Wordmark />
          </Link>
        </div>
        <nav aria-label="Main" className="flex-1 px-3">
          <ul className="space-y-1">
            {navItems.map((item) => (
              <li key={item.to}>
                <NavLink to={item.to} end className={(state) => navLinkClasses(state, false)} onPointerEnter={item.prefetch} onFocus={item.prefetch}>
                  <NavIcon name={item.icon} />
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <div className="space-y-3 border-t border-ink-700 px-5 py-5">
          <PersonCard person={person} />
          <Button variant="secondary" busy={signingOut} onClick={onSignOut} className="w-full">
            Sign out
          </Button>
        </div>
      </aside>

      <div className="flex min-w-0 flex-1 flex-col">
        <main id="main" ref={mainRef} tabIndex={-1} className="mx-auto w-full max-w-page flex-1 px-4 py-6 outline-none sm:px-6 lg:px-10 lg:py-10">
          <CautionSlot />
          <ToastOutlet pageKey={location.pathname} />
          {children}
        </main>
        <div className="mx-auto w-full max-w-page px-4 sm:px-6 lg:px-10">
          <SiteFooter links={footerLinks} />
        </div>
      </div>
    </div>
  );
}
