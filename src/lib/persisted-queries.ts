import { createAsyncStoragePersister } from '@tanstack/query-async-storage-persister';
import type { Query } from '@tanstack/react-query';
import type { PersistQueryClientOptions } from '@tanstack/react-query-persist-client';
import { createStore, del, get, set } from 'idb-keyval';
import type { UseStore } from 'idb-keyval';

/**
 * The query cache kept on the phone, so the driver's day shows without signal. Only queries that
 * ask for it (`meta: { persist: true }`) and have data are written, to IndexedDB, and a copy older
 * than a few days or from another build of the app is thrown away.
 */

/** How long a kept copy is trusted; a query kept this way needs a gcTime at least as long. */
export const PERSISTED_QUERY_MAX_AGE_MS = 3 * 24 * 60 * 60 * 1000;

/** Bumped when the shape of a kept query changes: older copies are then dropped. */
const CACHE_BUSTER = 'phone-1';
const STORAGE_KEY = 'ridgeload-query-cache';

export function shouldPersistQuery(query: Query): boolean {
  return query.state.status === 'success' && query.meta?.persist === true;
}

/** IndexedDB through idb-keyval (one small object store); null where the browser has no IndexedDB. */
function idbStorage() {
  if (typeof indexedDB === 'undefined') return null;
  let store: UseStore | null = null;
  const open = () => (store ??= createStore('ridgeload-cache', 'queries'));
  return {
    getItem: (key: string) => get<string>(key, open()).then((v) => v ?? null),
    setItem: (key: string, value: string) => set(key, value, open()),
    removeItem: (key: string) => del(key, open()),
  };
}

export function persistOptions(): Omit<PersistQueryClientOptions, 'queryClient'> | null {
  const storage = idbStorage();
  if (!storage) return null;
  return {
    persister: createAsyncStoragePersister({ storage, key: STORAGE_KEY, throttleTime: 1000 }),
    maxAge: PERSISTED_QUERY_MAX_AGE_MS,
    buster: CACHE_BUSTER,
    dehydrateOptions: { shouldDehydrateQuery: shouldPersistQuery },
  };
}

/** Forgets the kept copy (signing out: the next person on this phone must not see it). */
export async function clearPersistedQueries(): Promise<void> {
  const storage = idbStorage();
  if (storage) await storage.removeItem(STORAGE_KEY);
}
