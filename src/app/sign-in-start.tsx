import { StrictMode } from 'react';
import type { MouseEvent } from 'react';
import { createRoot } from 'react-dom/client';
import type { Root } from 'react-dom/client';
import type { SessionBody } from '../../shared/schemas/auth.schema';
import { PublicLayout } from '../components/layout/public-layout';
import { InAppLinkProvider } from '../components/ui/in-app-link';
import type { InAppLinkProps } from '../components/ui/in-app-link';
import { fetchSession } from '../features/auth/api/fetch-session';
import { DevFooterLinks } from './dev-footer-links';
import { homePathForRole, safeNextPath } from './home-path';
import { SignInPage } from './sign-in-page';

/*
 * The sign-in page opened first shows on its own: React, the form's code and the shared schemas it
 * checks with, without the router, the query library or the signed-in frame. Those load while the
 * person types (and after, if they have not arrived), and take over the same root once someone signs
 * in or follows a link, at the address they go to. See DEVELOPERS.md, decision 34.
 */

const loadApp = () => import('./app-start');

let root: Root | null = null;

/** Opens `path` in the whole app, handing over what is known of the session. */
async function openInApp(path: string, how: 'push' | 'replace', session?: SessionBody | null): Promise<void> {
  const app = await loadApp();
  if (!root) throw new Error('The sign-in page has not started');
  if (how === 'push') window.history.pushState(null, '', path);
  else window.history.replaceState(null, '', path);
  app.startApp(root, { session });
}

/** A link of the sign-in page: loads the app and opens its address there (a new tab works as usual). */
function SignInPageLink({ to, className, children }: InAppLinkProps) {
  const follow = (event: MouseEvent<HTMLAnchorElement>) => {
    if (event.defaultPrevented || event.button !== 0 || event.metaKey || event.altKey || event.ctrlKey || event.shiftKey) return;
    event.preventDefault();
    // If the app cannot be fetched, the browser opens the address the ordinary way.
    openInApp(to, 'push', null).catch(() => window.location.assign(to));
  };
  return (
    <a href={to} className={className} onClick={follow}>
      {children}
    </a>
  );
}

const signInPageLink = (props: InAppLinkProps) => <SignInPageLink {...props} />;

function StandaloneSignIn({ next }: { next: string | null }) {
  return (
    <InAppLinkProvider value={signInPageLink}>
      <PublicLayout footerLinks={<DevFooterLinks />}>
        <SignInPage next={next} onSignedIn={(session) => openInApp(next ?? homePathForRole(session.user.role), 'replace', session)} />
      </PublicLayout>
    </InAppLinkProvider>
  );
}

/** Shows the sign-in page in `container`, or the signed-in person's page when someone already is. */
export async function startSignIn(container: HTMLElement): Promise<void> {
  root = createRoot(container);
  const next = safeNextPath(new URLSearchParams(window.location.search).get('next'));
  // index.html asked already; this takes that answer. No answer: the form shows, and says so on sending.
  const session = await fetchSession().catch(() => null);
  if (session) return openInApp(next ?? homePathForRole(session.user.role), 'replace', session);
  root.render(
    <StrictMode>
      <StandaloneSignIn next={next} />
    </StrictMode>,
  );
  // The rest of the app arrives while the person types, so their page follows the button at once. It is
  // asked for now rather than when the browser is idle: on 3G the line is free as soon as the form's
  // code is in, and a person who knows their password presses the button within a second or two.
  void loadApp().catch(() => undefined);
}
