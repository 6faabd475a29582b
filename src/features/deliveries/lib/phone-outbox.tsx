import type { QueryClient } from '@tanstack/react-query';
import { createContext, useContext, useSyncExternalStore } from 'react';
import type { ReactNode } from 'react';
import { deliveryIsRecorded, sendCautionsRead, sendDelivery } from '../api/send-queued';
import { deliveryKeys } from '../api/keys';
import { createOutbox, indexedDbStorage, memoryStorage, startOutboxSync } from './outbox';
import type { Outbox } from './outbox';

const deliveredListeners = new Set<() => void>();

/** The one outbox of this phone. */
export const phoneOutbox: Outbox = createOutbox({
  storage: typeof indexedDB === 'undefined' ? memoryStorage() : indexedDbStorage(),
  send: (entry) => (entry.kind === 'delivery' ? sendDelivery(entry) : sendCautionsRead(entry)),
  isAlreadyRecorded: (entry) => (entry.kind === 'delivery' ? deliveryIsRecorded(entry.order_id) : Promise.resolve(false)),
  onDelivered: () => {
    for (const l of deliveredListeners) l();
  },
});

/**
 * Starts sending what the phone holds (at start, when the signal returns, every minute while
 * something waits) and refreshes the driver's day after each record lands. Once per app.
 */
export function startPhoneOutbox(queryClient: QueryClient): () => void {
  const refresh = () => void queryClient.invalidateQueries({ queryKey: deliveryKeys.all });
  deliveredListeners.add(refresh);
  const stop = startOutboxSync(phoneOutbox);
  return () => {
    deliveredListeners.delete(refresh);
    stop();
  };
}

const OutboxContext = createContext<Outbox>(phoneOutbox);

/** Gives the components under it another outbox (tests). */
export function OutboxProvider({ outbox, children }: { outbox: Outbox; children: ReactNode }) {
  return <OutboxContext.Provider value={outbox}>{children}</OutboxContext.Provider>;
}

export function useOutbox() {
  const outbox = useContext(OutboxContext);
  const snapshot = useSyncExternalStore(outbox.subscribe, outbox.getSnapshot);
  return { outbox, ...snapshot };
}
