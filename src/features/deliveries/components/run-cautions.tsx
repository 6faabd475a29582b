import { useState } from 'react';
import type { DriverDay } from '../../../../shared/schemas/run.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { formatDateTime } from '../../../lib/format';
import { useOutbox } from '../lib/phone-outbox';

type Run = DriverDay['runs'][number];

/** Said under every run's own cautions: the site's lift plan and the codes come first. */
const DEFER = "The site's lift plan, local codes and the tile maker's fixing specification take precedence over this sheet.";

/**
 * The run's cautions, once for the whole run, until the driver records having read them; after that
 * they fold to one line that opens again. The acknowledgement goes through the phone's outbox, so it
 * is recorded even when given without signal.
 */
export function RunCautions({ run, pending }: { run: Run; pending: boolean }) {
  const { outbox } = useOutbox();
  const [readHere, setReadHere] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<unknown>(null);
  const readAt = run.cautions_read_at ?? readHere;
  const label = `${run.time_window} on ${run.lorry.registration}`;

  const list = (
    <ul className="list-disc space-y-1 pl-5">
      {run.cautions.map((c) => (
        <li key={c}>{c}</li>
      ))}
    </ul>
  );

  if (readAt || pending) {
    return (
      <details className="rounded-md border-l-4 border-ochre-500 bg-ochre-50 px-4 py-2 text-ochre-800">
        <summary className="min-h-tap-lg cursor-pointer content-center font-semibold">
          {readAt ? `Cautions read ${formatDateTime(readAt)}` : 'Cautions read'}
          {pending ? ' (waiting to send)' : ''}: show them again
        </summary>
        <div className="mt-2 space-y-2 pb-2">
          {list}
          <p>{DEFER}</p>
        </div>
      </details>
    );
  }

  const acknowledge = async () => {
    setBusy(true);
    setError(null);
    const at = new Date().toISOString();
    try {
      await outbox.record({ kind: 'cautions_read', key: crypto.randomUUID(), run_id: run.id, run_label: label, read_at: at, queued_at: at, attempts: 0, state: 'waiting', last_error: null });
      setReadHere(at);
    } catch (e) {
      setError(e);
    } finally {
      setBusy(false);
    }
  };

  return (
    <Alert tone="caution" title={`Before this run: ${run.cautions.length} ${run.cautions.length === 1 ? 'caution' : 'cautions'}`} live={false}>
      <div className="space-y-3 text-lg" data-testid="run-cautions">
        {list}
        <p>{DEFER}</p>
        {error ? <p className="font-semibold text-brick-700">Not recorded: {errorMessage(error)}</p> : null}
        <Button size="lg" className="w-full" busy={busy} onClick={() => void acknowledge()}>
          I have read these
        </Button>
      </div>
    </Alert>
  );
}
