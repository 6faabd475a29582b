import { cleanup } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// jsdom has no scrolling; the router's scroll restoration calls it on every navigation. (A test file
// may ask for the node environment, where there is no window.)
if (typeof window !== 'undefined') window.scrollTo = () => {};

// Vitest runs without globals here, so Testing Library cannot register its own cleanup.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});
