import { useSyncExternalStore } from 'react';

/**
 * A new build of the app is ready (the service worker has it) and waits for the person to take it:
 * never swapped in under a driver halfway through a form.
 */
let applyUpdate: (() => void) | null = null;
const listeners = new Set<() => void>();

export function setUpdateReady(apply: (() => void) | null): void {
  applyUpdate = apply;
  for (const l of listeners) l();
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

/** The function that reloads into the new build, or null when there is none waiting. */
export function useAppUpdate(): (() => void) | null {
  return useSyncExternalStore(subscribe, () => applyUpdate);
}
