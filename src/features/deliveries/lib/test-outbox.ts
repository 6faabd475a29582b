import { deliveryIsRecorded, sendCautionsRead, sendDelivery } from '../api/send-queued';
import { createOutbox, memoryStorage } from './outbox';
import type { OutboxStorage } from './outbox';

/** An outbox for tests: the real senders (so a stubbed fetch sees every request), kept where the test says. */
export function createTestOutbox({ storage = memoryStorage(), online = () => true }: { storage?: OutboxStorage; online?: () => boolean } = {}) {
  return createOutbox({
    storage,
    send: (entry) => (entry.kind === 'delivery' ? sendDelivery(entry) : sendCautionsRead(entry)),
    isAlreadyRecorded: (entry) => (entry.kind === 'delivery' ? deliveryIsRecorded(entry.order_id) : Promise.resolve(false)),
    isOnline: online,
  });
}
