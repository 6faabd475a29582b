import '@fontsource/work-sans/400.css';
import '@fontsource/work-sans/500.css';
import '@fontsource/work-sans/600.css';
import '@fontsource/work-sans/700.css';
import './styles.css';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element');

// This script imports nothing itself, so it runs as soon as it arrives and asks at once for what the
// address needs (React arrives alongside: index.html preloads it). The sign-in page comes alone;
// every other address starts the whole app. See DEVELOPERS.md, decision 34.
const start = window.location.pathname.replace(/\/$/, '') === '/sign-in' ? import('./app/sign-in-start').then((m) => m.startSignIn(container)) : import('./app/app-start').then((m) => m.startAppIn(container));
start.catch(() => {
  container.textContent = 'Ridgeload could not load. Check the connection and reload the page.';
});
