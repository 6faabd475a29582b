import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import type { ReactElement } from 'react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import type { RouteObject } from 'react-router-dom';
import { vi } from 'vitest';
import { ToastProvider } from '../components/ui/toast';

/** A query client for one test: no retries, nothing kept between tests. */
export function createTestQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: { queries: { retry: false, gcTime: Infinity }, mutations: { retry: false } },
  });
}

interface RenderOptions {
  path?: string;
  routes?: RouteObject[];
  queryClient?: QueryClient;
}

/**
 * Renders a memory router at `path` inside the app's providers. `routes` may be a function of the
 * query client, as the app's own route table is (`appRoutes`), so its loaders share the test's client.
 */
export function renderRoutes(routes: RouteObject[] | ((queryClient: QueryClient) => RouteObject[]), { path = '/', queryClient = createTestQueryClient() }: { path?: string; queryClient?: QueryClient } = {}) {
  const router = createMemoryRouter(typeof routes === 'function' ? routes(queryClient) : routes, { initialEntries: [path] });
  const result = render(
    <QueryClientProvider client={queryClient}>
      <ToastProvider>
        <RouterProvider router={router} />
      </ToastProvider>
    </QueryClientProvider>,
  );
  return { ...result, router, queryClient };
}

/** Renders `ui` at `path` inside the app's providers and a memory router. */
export function renderWithProviders(ui: ReactElement, { path = '/', routes = [], queryClient }: RenderOptions = {}) {
  return renderRoutes([{ path: '*', element: ui }, ...routes], { path, queryClient });
}

export interface MockResponse {
  status: number;
  body?: unknown;
}

/** Answers each fetch from a table keyed by "METHOD /path"; every call is recorded. */
export function stubFetch(routes: Record<string, MockResponse | MockResponse[]>) {
  const queues = new Map(Object.entries(routes).map(([key, value]) => [key, Array.isArray(value) ? [...value] : [value]]));
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
    const path = url.replace(/^https?:\/\/[^/]+/, '');
    const key = `${(init?.method ?? 'GET').toUpperCase()} ${path}`;
    const queue = queues.get(key);
    if (!queue || queue.length === 0) throw new Error(`No mocked answer for ${key}`);
    const answer = queue.length > 1 ? queue.shift()! : queue[0];
    const text = answer.body === undefined ? '' : JSON.stringify(answer.body);
    return new Response(answer.status === 204 ? null : text, {
      status: answer.status,
      headers: { 'Content-Type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}
