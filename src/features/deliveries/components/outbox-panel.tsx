import { useEffect, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { formatDateTime } from '../../../lib/format';
import { useOnline } from '../../../lib/use-online';
import { useOutbox } from '../lib/phone-outbox';
import type { QueuedEntry } from '../lib/outbox-types';

function describe(entry: QueuedEntry): string {
  if (entry.kind === 'cautions_read') return `Cautions read for the ${entry.run_label} run`;
  const pictures = [entry.signature ? 'signature' : null, entry.photos.length ? `${entry.photos.length} ${entry.photos.length === 1 ? 'photo' : 'photos'}` : null].filter(Boolean);
  return `Delivery of ${entry.reference} at ${entry.site_name}, taken by ${entry.data.receiver_name}${pictures.length ? ` (${pictures.join(', ')})` : ''}`;
}

function EntryRow({ entry, onDiscard }: { entry: QueuedEntry; onDiscard: () => void }) {
  const [confirming, setConfirming] = useState(false);
  return (
    <li className="rounded-md border-2 border-ink-200 bg-white p-3" data-testid="waiting-entry">
      <p className="font-semibold">{describe(entry)}</p>
      <p className="text-base text-ink-700">
        Recorded {formatDateTime(entry.queued_at)}
        {entry.attempts > 0 ? ` · tried ${entry.attempts} ${entry.attempts === 1 ? 'time' : 'times'}` : ''}
      </p>
      {entry.state === 'refused' ? (
        <div className="mt-2 space-y-2">
          <p className="font-semibold text-brick-700">The server refused it: {entry.last_error}</p>
          {confirming ? (
            <div className="grid grid-cols-2 gap-2">
              <Button variant="danger" size="lg" onClick={onDiscard}>
                Remove for good
              </Button>
              <Button variant="secondary" size="lg" onClick={() => setConfirming(false)}>
                Keep it
              </Button>
            </div>
          ) : (
            <Button variant="secondary" size="lg" className="w-full" onClick={() => setConfirming(true)}>
              Remove from this phone
            </Button>
          )}
        </div>
      ) : entry.last_error ? (
        <p className="text-base text-ink-700">Last try: {entry.last_error}</p>
      ) : null}
    </li>
  );
}

/**
 * What this phone holds that the server does not have yet, with a "Send now" button. It is sent by
 * itself when the signal returns; nothing here is lost by closing the app.
 */
export function OutboxPanel() {
  const { outbox, entries, sending, loaded, lastFlush } = useOutbox();
  const online = useOnline();
  useEffect(() => {
    void outbox.load().catch(() => undefined);
  }, [outbox]);

  if (!loaded || entries.length === 0) {
    return lastFlush && lastFlush.sent + lastFlush.already_recorded > 0 ? (
      <p role="status" className="rounded-md bg-moss-50 p-3 text-lg font-semibold text-moss-800">
        Everything recorded on this phone has been sent.
      </p>
    ) : null;
  }
  return (
    <section aria-labelledby="waiting-to-send" className="space-y-3 rounded-lg border-2 border-ochre-500 bg-ochre-50 p-4">
      <h2 id="waiting-to-send" className="text-2xl font-bold">
        Waiting to send: {entries.length}
      </h2>
      <p role="status" className="text-lg">
        {sending ? 'Sending…' : online ? 'Kept on this phone until the server has it.' : 'No signal: kept on this phone and sent when the signal returns.'}
      </p>
      <ul className="space-y-2">
        {entries.map((entry) => (
          <EntryRow key={entry.key} entry={entry} onDiscard={() => void outbox.discard(entry.key)} />
        ))}
      </ul>
      <Button size="lg" className="w-full" busy={sending} onClick={() => void outbox.flush({ includeRefused: true }).catch(() => undefined)}>
        Send now
      </Button>
    </section>
  );
}
