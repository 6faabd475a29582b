import { hashKey } from '@tanstack/react-query';
import { RouterProvider } from 'react-router-dom';
import { UpdateBanner } from '../components/layout/update-banner';
import { authKeys } from '../features/auth/api/keys';
import { startPhoneOutbox } from '../features/deliveries/lib/phone-outbox';
import { apiClient, signInPathWithNext } from '../lib/api-client';
import { clearPersistedQueries, persistOptions } from '../lib/persisted-queries';
import { createQueryClient } from '../lib/query-client';
import { AppProviders } from './providers';
import { createAppRouter } from './router';

/** The service worker's network-first copies of API answers (see vite.config.ts). */
const API_CACHE = 'ridgeload-api';

/** One query client and one router for the life of the tab. */
export function createAppRuntime() {
  const queryClient = createQueryClient();
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
  startPhoneOutbox(queryClient);
  return { queryClient, router, persist: persistOptions() };
}

type AppRuntime = ReturnType<typeof createAppRuntime>;

export function App({ runtime }: { runtime: AppRuntime }) {
  return (
    <AppProviders queryClient={runtime.queryClient} persist={runtime.persist}>
      <RouterProvider router={runtime.router} />
      <UpdateBanner />
    </AppProviders>
  );
}
