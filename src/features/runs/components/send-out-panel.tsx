import { lazy, Suspense, useState } from 'react';
import type { Run } from '../../../../shared/schemas/run.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { useBusinessToday } from '../../../lib/business-calendar';
import { formatDateTime } from '../../../lib/format';
import { useSendOut } from '../api/send-out';
import { sendOutState } from '../lib/send-out-rule';

const OverrideForm = lazy(() => import('./send-out-override-form'));

interface SendOutPanelProps {
  run: Run;
  /** The yard sends its lorries out. */
  canSendOut: boolean;
  /** A dispatcher or the merchant owner may send one out before its day or not fully ticked, giving a reason. */
  canOverride: boolean;
}

/**
 * "Send out", offered only when every pallet is ticked loaded and the run's day is today in the firm's
 * calendar; otherwise a line per reason says why, and those who may can override with a reason.
 */
export function SendOutPanel({ run, canSendOut, canOverride }: SendOutPanelProps) {
  const today = useBusinessToday();
  const state = sendOutState(run, today);
  const send = useSendOut(run.id);
  const toast = useToast();
  const [overriding, setOverriding] = useState(false);
  const sent = () => {
    setOverriding(false);
    toast.show(`${run.lorry.registration} is on the road.`, 'success');
  };

  if (state.blocks.includes('sent')) {
    return (
      <p className="font-semibold text-moss-800" data-testid="send-out">
        On the road{run.dispatched_at ? ` since ${formatDateTime(run.dispatched_at)}` : ''}.
      </p>
    );
  }
  const gaps = state.blocks.map((b) => (b === 'not_today' ? 'not its day' : 'not every pallet ticked'));
  return (
    <div className="space-y-3" data-testid="send-out">
      {state.ready ? (
        canSendOut ? (
          <>
            {send.isError ? (
              <Alert tone="danger" title="The lorry was not sent out">
                {errorMessage(send.error)}
              </Alert>
            ) : null}
            <Button size="lg" busy={send.isPending} onClick={() => send.mutate({}, { onSuccess: sent })}>
              Send out {run.lorry.registration}
            </Button>
          </>
        ) : (
          <p>Loaded and ready to go; the yard sends it out.</p>
        )
      ) : (
        <div>
          <p className="font-semibold">Not ready to send out</p>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-ink-800" aria-label="Why it cannot go yet">
            {state.reasons.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        </div>
      )}
      {!state.ready && state.overridable && canOverride ? (
        overriding ? (
          <Suspense fallback={<p role="status">Opening the form…</p>}>
            <OverrideForm run={run} blocks={gaps} onSent={sent} onCancel={() => setOverriding(false)} />
          </Suspense>
        ) : (
          <Button variant="secondary" aria-expanded={false} onClick={() => setOverriding(true)}>
            Send out anyway…
          </Button>
        )
      ) : null}
    </div>
  );
}
