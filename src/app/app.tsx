import { RouterProvider } from 'react-router-dom';
import { authKeys } from '../features/auth/api/keys';
import { apiClient, signInPathWithNext } from '../lib/api-client';
import { createQueryClient } from '../lib/query-client';
import { AppProviders } from './providers';
import { createAppRouter } from './router';

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
  return { queryClient, router };
}

type AppRuntime = ReturnType<typeof createAppRuntime>;

export function App({ runtime }: { runtime: AppRuntime }) {
  return (
    <AppProviders queryClient={runtime.queryClient}>
      <RouterProvider router={runtime.router} />
    </AppProviders>
  );
}
