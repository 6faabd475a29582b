import { registerSW } from 'virtual:pwa-register';
import { setUpdateReady } from './app-update';

/**
 * Registers the service worker that keeps the app shell (and the driver's day) on the device. Called
 * once the page has loaded and is usable, so it never competes with the first paint. A new build
 * waits until the person chooses to reload.
 */
export function registerServiceWorker(): void {
  const update = registerSW({
    immediate: true,
    onNeedRefresh() {
      setUpdateReady(() => void update(true));
    },
    onRegisterError(error: unknown) {
      console.warn('The offline copy of Ridgeload could not be set up', error);
    },
  });
}
