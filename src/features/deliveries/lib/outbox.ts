import { createStore, del, entries, set } from 'idb-keyval';
import type { UseStore } from 'idb-keyval';
import { isApiError } from '../../../lib/api-client';
import type { QueuedEntry, SendOutcome } from './outbox-types';

/**
 * The phone's outbox: deliveries and cautions acknowledgements recorded on the phone, kept in
 * IndexedDB (photos and signature as Blobs) until the server has them. Every write is stored first
 * and sent after, so closing the app, losing the signal or a flat battery loses nothing; each carries
 * the Idempotency-Key made when it was recorded, and every try sends that same key.
 */

/** Error codes with which the server says the write is already recorded (409/422): nothing left to send. */
export const ALREADY_RECORDED_CODES: ReadonlySet<string> = new Set(['already_recorded', 'already_delivered', 'delivery_already_recorded', 'cautions_already_read', 'idempotency_key_replayed']);

/** Codes with which the server says the same key is still being worked on: try again later. */
const IN_PROGRESS_CODES: ReadonlySet<string> = new Set(['idempotency_in_progress', 'request_in_progress']);

/** Where the outbox keeps its entries. */
export interface OutboxStorage {
  all(): Promise<QueuedEntry[]>;
  put(entry: QueuedEntry): Promise<void>;
  remove(key: string): Promise<void>;
}

/** The outbox in IndexedDB (database "ridgeload-phone", object store "outbox"), opened on first use. */
export function indexedDbStorage(dbName = 'ridgeload-phone', storeName = 'outbox'): OutboxStorage {
  let store: UseStore | null = null;
  const open = () => (store ??= createStore(dbName, storeName));
  return {
    async all() {
      const rows = await entries<string, QueuedEntry>(open());
      return rows.map(([, entry]) => entry);
    },
    put: (entry) => set(entry.key, entry, open()),
    remove: (key) => del(key, open()),
  };
}

/** An outbox held in memory only: where the browser has no IndexedDB (it is then lost with the tab). */
export function memoryStorage(): OutboxStorage {
  const rows = new Map<string, QueuedEntry>();
  return {
    all: async () => [...rows.values()],
    put: async (entry) => {
      rows.set(entry.key, entry);
    },
    remove: async (key) => {
      rows.delete(key);
    },
  };
}

export interface OutboxDeps {
  storage: OutboxStorage;
  /** Sends one entry; throws the ApiError the server or the network gave. */
  send: (entry: QueuedEntry) => Promise<void>;
  /**
   * Asked after a 409/422 whose code is not one of ALREADY_RECORDED_CODES: does the server already
   * hold this record (e.g. the order already has its proof)? Optional.
   */
  isAlreadyRecorded?: (entry: QueuedEntry) => Promise<boolean>;
  /** The browser's word on the connection; a send is still tried when it is wrong. */
  isOnline?: () => boolean;
  /** Called after each entry the server has (sent now or already there). */
  onDelivered?: (entry: QueuedEntry, outcome: 'sent' | 'already_recorded') => void;
  now?: () => Date;
}

export interface OutboxSnapshot {
  entries: readonly QueuedEntry[];
  /** True while a send is under way. */
  sending: boolean;
  /** True once the stored entries have been read. */
  loaded: boolean;
  /** What the last "send what is waiting" came to, for the page to say. */
  lastFlush: FlushResult | null;
}

export interface FlushResult {
  sent: number;
  already_recorded: number;
  still_waiting: number;
  refused: number;
  /** True when the flush stopped because the network could not be reached. */
  offline: boolean;
  at: string;
}

/** How a failed send is to be treated. */
export function classifySendError(error: unknown): Exclude<SendOutcome, 'sent'> {
  if (!isApiError(error)) return 'retry_later';
  if (error.status === 0) return 'offline';
  if (error.status === 401) return 'signed_out';
  if ((error.status === 409 || error.status === 422) && ALREADY_RECORDED_CODES.has(error.code)) return 'already_recorded';
  if (error.status === 409 && IN_PROGRESS_CODES.has(error.code)) return 'retry_later';
  if (error.status === 408 || error.status === 425 || error.status === 429 || error.status >= 500) return 'retry_later';
  return 'refused';
}

function errorText(error: unknown): string {
  if (isApiError(error) || error instanceof Error) return error.message;
  return 'The server could not be reached.';
}

export function createOutbox(deps: OutboxDeps) {
  const now = deps.now ?? (() => new Date());
  const isOnline = deps.isOnline ?? (() => (typeof navigator === 'undefined' ? true : navigator.onLine));
  let snapshot: OutboxSnapshot = { entries: [], sending: false, loaded: false, lastFlush: null };
  const listeners = new Set<() => void>();
  let loading: Promise<void> | null = null;
  let flushing: Promise<FlushResult> | null = null;
  // Sends run one after another, so the same entry is never on the wire twice at once.
  let queue: Promise<unknown> = Promise.resolve();
  function exclusive<T>(work: () => Promise<T>): Promise<T> {
    const run = queue.then(work, work);
    queue = run.catch(() => undefined);
    return run;
  }

  function update(patch: Partial<OutboxSnapshot>) {
    snapshot = { ...snapshot, ...patch };
    for (const l of listeners) l();
  }

  function sorted(list: QueuedEntry[]) {
    return [...list].sort((a, b) => a.queued_at.localeCompare(b.queued_at) || a.key.localeCompare(b.key));
  }

  async function reload() {
    update({ entries: sorted(await deps.storage.all()), loaded: true });
  }

  function load(): Promise<void> {
    loading ??= reload().catch((error: unknown) => {
      loading = null;
      throw error;
    });
    return loading;
  }

  async function store(entry: QueuedEntry) {
    await deps.storage.put(entry);
    update({ entries: sorted([...snapshot.entries.filter((e) => e.key !== entry.key), entry]) });
  }

  async function forget(key: string) {
    await deps.storage.remove(key);
    update({ entries: snapshot.entries.filter((e) => e.key !== key) });
  }

  /** Tries one entry once and settles it: removed when the server has it, marked otherwise. */
  async function attempt(entry: QueuedEntry): Promise<{ outcome: SendOutcome; error?: unknown }> {
    const tried = { ...entry, attempts: entry.attempts + 1 };
    try {
      await deps.send(tried);
      await forget(entry.key);
      deps.onDelivered?.(tried, 'sent');
      return { outcome: 'sent' };
    } catch (error) {
      let outcome = classifySendError(error);
      if (outcome === 'refused' && isApiError(error) && (error.status === 409 || error.status === 422) && deps.isAlreadyRecorded) {
        try {
          if (await deps.isAlreadyRecorded(tried)) outcome = 'already_recorded';
        } catch {
          // The question could not be answered: keep it refused and let the driver decide.
        }
      }
      if (outcome === 'already_recorded') {
        await forget(entry.key);
        deps.onDelivered?.(tried, 'already_recorded');
        return { outcome };
      }
      await store({ ...tried, state: outcome === 'refused' ? 'refused' : 'waiting', last_error: errorText(error) });
      return { outcome, error };
    }
  }

  async function runFlush(includeRefused: boolean): Promise<FlushResult> {
    await load();
    const result: FlushResult = { sent: 0, already_recorded: 0, still_waiting: 0, refused: 0, offline: false, at: now().toISOString() };
    update({ sending: true });
    try {
      for (const entry of [...snapshot.entries]) {
        if (entry.state === 'refused' && !includeRefused) {
          result.refused += 1;
          continue;
        }
        if (result.offline) {
          result.still_waiting += 1;
          continue;
        }
        const { outcome } = await attempt(entry);
        if (outcome === 'sent') result.sent += 1;
        else if (outcome === 'already_recorded') result.already_recorded += 1;
        else if (outcome === 'refused') result.refused += 1;
        else {
          result.still_waiting += 1;
          // No network (or signed out): the rest would fail the same way.
          if (outcome === 'offline' || outcome === 'signed_out') result.offline = true;
        }
      }
    } finally {
      update({ sending: false });
    }
    update({ lastFlush: result });
    return result;
  }

  return {
    getSnapshot: () => snapshot,
    subscribe(listener: () => void) {
      listeners.add(listener);
      return () => {
        listeners.delete(listener);
      };
    },
    load,

    /**
     * Stores a new record, then sends it at once when the phone thinks it has signal. A refusal of
     * a record just made (bad input) is handed back to the form and nothing is kept, so the driver
     * corrects it and records again; no signal leaves it waiting.
     */
    async record(entry: QueuedEntry): Promise<'sent' | 'already_recorded' | 'queued'> {
      await load();
      await store(entry);
      if (!isOnline()) return 'queued';
      return exclusive(async () => {
        // A send that ran meanwhile may have taken it already.
        const current = snapshot.entries.find((e) => e.key === entry.key);
        if (!current) return 'sent';
        update({ sending: true });
        try {
          const { outcome, error } = await attempt(current);
          if (outcome === 'sent' || outcome === 'already_recorded') return outcome;
          if (outcome === 'refused') {
            await forget(entry.key);
            throw error;
          }
          return 'queued';
        } finally {
          update({ sending: false });
        }
      });
    },

    /** Sends everything waiting, oldest first; `includeRefused` also tries again what the server refused. */
    flush(options: { includeRefused?: boolean } = {}): Promise<FlushResult> {
      flushing ??= exclusive(() => runFlush(options.includeRefused ?? false)).finally(() => {
        flushing = null;
      });
      return flushing;
    },

    /** Drops an entry the driver chose to discard. */
    discard: (key: string) => forget(key),
  };
}

export type Outbox = ReturnType<typeof createOutbox>;

/**
 * Sends what is waiting when the app starts, when the browser says the signal is back, and every
 * minute while something waits. Returns the function that stops it.
 */
export function startOutboxSync(outbox: Outbox, target: Pick<Window, 'addEventListener' | 'removeEventListener'> = window, everyMs = 60_000): () => void {
  const flush = () => {
    void outbox.flush().catch(() => undefined);
  };
  void outbox
    .load()
    .then(flush)
    .catch(() => undefined);
  target.addEventListener('online', flush);
  const timer = setInterval(() => {
    const waiting = outbox.getSnapshot().entries.some((e) => e.state === 'waiting');
    if (waiting && (typeof navigator === 'undefined' || navigator.onLine)) flush();
  }, everyMs);
  return () => {
    target.removeEventListener('online', flush);
    clearInterval(timer);
  };
}
