import { hashKey } from '@tanstack/react-query';
import { RouterProvider } from 'react-router-dom';
import { UpdateBanner } from '../components/layout/update-banner';
import type { SessionBody } from '../../shared/schemas/auth.schema';
import { rememberSession } from '../features/auth/api/get-session';
import { authKeys } from '../features/auth/api/keys';
import { apiClient, signInPathWithNext } from '../lib/api-client';
import { clearPersistedQueries, persistOptions } from '../lib/persisted-queries';
import { createQueryClient } from '../lib/query-client';
import { AppProviders } from './providers';
import { createAppRouter } from './router';

/** The service worker's network-first copies of API answers (see vite.config.ts). */
const API_CACHE = 'ridgeload-api';

/**
 * One query client and one router for the life of the tab. A session already known (the sign-in page
 * asked, or someone just signed in there) is kept before the router starts its first page's loaders.
 */
export function createAppRuntime({ session }: { session?: SessionBody | null } = {}) {
  const queryClient = createQueryClient();
  if (session !== undefined) rememberSession(queryClient, session);
  const router = createAppRouter(queryClient);
  // A 401 anywhere means the session ended: forget it and ask to sign in, coming back here after.
  apiClient.setOnUnauthenticated((nextPath) => {
    queryClient.removeQueries();
    queryClient.setQueryData(authKeys.session(), null);
    if (!window.location.pathname.startsWith('/sign-in')) void router.navigate(signInPathWithNext(nextPath), { replace: true });
  });
  // Nobody signed in: the copies kept for working without signal go, so the next person on this
  // device never sees them. The outbox stays: what a driver recorded is sent once they sign in again.
  queryClient.getQueryCache().subscribe((event) => {
    if (event.type !== 'updated' || event.query.queryHash !== hashKey(authKeys.session())) return;
    if (event.query.state.status === 'success' && event.query.state.data === null) {
      void clearPersistedQueries().catch(() => undefined);
      if (typeof caches !== 'undefined') void caches.delete(API_CACHE).catch(() => undefined);
    }
  });
  // What a driver recorded without signal is sent once someone is signed in; its code waits until then.
  whenSignedInAndSettled({ queryClient, router }, () => void import('../features/deliveries/lib/phone-outbox').then((m) => m.startPhoneOutbox(queryClient)));
  return { queryClient, router, persist: persistOptions() };
}

type AppRuntime = ReturnType<typeof createAppRuntime>;

/**
 * Calls `then` once, when the page has loaded, someone is signed in, the router has shown their page
 * (no navigation or page code still loading) and the browser is idle: work that can wait (setting up
 * the offline copy) then never competes with what the person is waiting for.
 */
export function whenSignedInAndSettled(runtime: Pick<AppRuntime, 'queryClient' | 'router'>, then: () => void): void {
  let done = false;
  const settled = () => {
    const { initialized, navigation } = runtime.router.state;
    return initialized && navigation.state === 'idle' && Boolean(runtime.queryClient.getQueryData(authKeys.session())) && document.readyState === 'complete';
  };
  const unsubscribers: (() => void)[] = [];
  const check = () => {
    if (done || !settled()) return;
    done = true;
    for (const unsubscribe of unsubscribers) unsubscribe();
    const idle = window.requestIdleCallback ?? ((callback: () => void) => window.setTimeout(callback, 200));
    idle(() => then(), { timeout: 5_000 });
  };
  unsubscribers.push(runtime.router.subscribe(check));
  unsubscribers.push(runtime.queryClient.getQueryCache().subscribe(check));
  if (document.readyState !== 'complete') {
    const onLoad = () => check();
    window.addEventListener('load', onLoad, { once: true });
    unsubscribers.push(() => window.removeEventListener('load', onLoad));
  }
  check();
}

export function App({ runtime }: { runtime: AppRuntime }) {
  return (
    <AppProviders queryClient={runtime.queryClient} persist={runtime.persist}>
      <RouterProvider router={runtime.router} />
      <UpdateBanner />
    </AppProviders>
  );
}
