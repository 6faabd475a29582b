import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import type { Root } from 'react-dom/client';
import type { SessionBody } from '../../shared/schemas/auth.schema';
import { App, createAppRuntime, whenSignedInAndSettled } from './app';

interface StartOptions {
  /** The session already known (the sign-in page asked, or someone just signed in): not asked again. */
  session?: SessionBody | null;
}

/**
 * Starts the whole app (router, queries, the signed-in frame) at the address in the address bar.
 * The sign-in page hands over its root and the session when someone signs in or follows a link.
 */
export function startApp(root: Root, { session }: StartOptions = {}): void {
  const runtime = createAppRuntime({ session });
  root.render(
    <StrictMode>
      <App runtime={runtime} />
    </StrictMode>,
  );

  // The offline copy of the app is set up once someone is signed in and their page has shown, never
  // while the first page or the one after signing in is still arriving over a slow line.
  if (import.meta.env.PROD && 'serviceWorker' in navigator) {
    whenSignedInAndSettled(runtime, () => void import('../lib/register-service-worker').then((m) => m.registerServiceWorker()));
  }
}

/** Any address but the sign-in page, opened first. */
export function startAppIn(container: HTMLElement): void {
  startApp(createRoot(container));
}
