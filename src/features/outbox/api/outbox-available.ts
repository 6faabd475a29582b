import { useEffect, useState } from 'react';
import { apiClient } from '../../../lib/api-client';

let probe: Promise<boolean> | null = null;

/** Whether this server has the outbox (development only); asked once per page load. */
export function outboxAvailable(): Promise<boolean> {
  probe ??= apiClient.get('/api/dev/outbox', { redirectOnUnauthenticated: false }).then(
    () => true,
    () => false,
  );
  return probe;
}

/**
 * The same, for a footer link. Plain state rather than a query: the sign-in page shows the link
 * before the query library has loaded.
 */
export function useOutboxAvailable(): boolean {
  const [available, setAvailable] = useState(false);
  useEffect(() => {
    let live = true;
    void outboxAvailable().then((answer) => {
      if (live) setAvailable(answer);
    });
    return () => {
      live = false;
    };
  }, []);
  return available;
}
