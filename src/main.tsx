import '@fontsource/work-sans/400.css';
import '@fontsource/work-sans/500.css';
import '@fontsource/work-sans/600.css';
import '@fontsource/work-sans/700.css';
import './styles.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App, createAppRuntime } from './app/app';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element');

createRoot(container).render(
  <StrictMode>
    <App runtime={createAppRuntime()} />
  </StrictMode>,
);

// The offline copy of the app is set up once the page is in use, never ahead of the first paint.
if (import.meta.env.PROD && 'serviceWorker' in navigator) {
  const register = () => void import('./lib/register-service-worker').then((m) => m.registerServiceWorker());
  if (document.readyState === 'complete') register();
  else window.addEventListener('load', register, { once: true });
}
