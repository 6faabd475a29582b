import { createMemoryRouter } from 'react-router-dom';
import { describe, expect, it, vi } from 'vitest';
import { authKeys } from '../features/auth/api/keys';
import { createTestQueryClient } from '../test-utils/render-with-providers';
import { whenSignedInAndSettled } from './app';

function deferred() {
  let resolve!: () => void;
  const promise = new Promise<void>((r) => (resolve = r));
  return { promise, resolve };
}

describe('work that waits until someone is signed in and their page has shown', () => {
  it('waits for a session, then for the page being opened to finish loading, and runs once', async () => {
    const queryClient = createTestQueryClient();
    const pageCode = deferred();
    const router = createMemoryRouter(
      [
        { path: '/', element: <p>home</p> },
        {
          path: '/slow',
          lazy: async () => {
            await pageCode.promise;
            return { element: <p>slow</p> };
          },
        },
      ],
      { initialEntries: ['/'] },
    );
    await vi.waitFor(() => expect(router.state.initialized).toBe(true));
    const then = vi.fn();
    whenSignedInAndSettled({ queryClient, router }, then);

    void router.navigate('/slow');
    queryClient.setQueryData(authKeys.session(), { user: { id: 1 } });
    await new Promise((r) => setTimeout(r, 400));
    expect(then, 'not while the page’s code is still loading').not.toHaveBeenCalled();

    pageCode.resolve();
    await vi.waitFor(() => expect(then).toHaveBeenCalledTimes(1));
    void router.navigate('/');
    queryClient.setQueryData(authKeys.session(), { user: { id: 2 } });
    await new Promise((r) => setTimeout(r, 400));
    expect(then).toHaveBeenCalledTimes(1);
  });

  it('never runs while nobody is signed in', async () => {
    const queryClient = createTestQueryClient();
    const router = createMemoryRouter([{ path: '/', element: <p>sign in</p> }]);
    await vi.waitFor(() => expect(router.state.initialized).toBe(true));
    const then = vi.fn();
    whenSignedInAndSettled({ queryClient, router }, then);
    queryClient.setQueryData(authKeys.session(), null);
    await new Promise((r) => setTimeout(r, 400));
    expect(then).not.toHaveBeenCalled();
  });
});
