import '@fontsource/work-sans/400.css';
import '@fontsource/work-sans/500.css';
import '@fontsource/work-sans/600.css';
import '@fontsource/work-sans/700.css';
import './styles.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App, createAppRuntime, whenSignedInAndSettled } from './app/app';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element');

const runtime = createAppRuntime();
createRoot(container).render(
  <StrictMode>
    <App runtime={runtime} />
  </StrictMode>,
);

// The offline copy of the app is set up once someone is signed in and their page has shown, never
// while the first page or the one after signing in is still arriving over a slow line.
if (import.meta.env.PROD && 'serviceWorker' in navigator) {
  whenSignedInAndSettled(runtime, () => void import('./lib/register-service-worker').then((m) => m.registerServiceWorker()));
}
