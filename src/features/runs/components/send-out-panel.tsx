import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { sendOutBodySchema } from '../../../../shared/schemas/run.schema';
import type { Run } from '../../../../shared/schemas/run.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { useBusinessToday } from '../../../lib/business-calendar';
import { formatDateTime } from '../../../lib/format';
import { useSendOut } from '../api/send-out';
import { sendOutState } from '../lib/send-out-rule';

/** The override needs its reason: the shared body with the reason required. */
const overrideSchema = sendOutBodySchema.required({ override_reason: true });
type OverrideValues = z.input<typeof overrideSchema>;

const reasonMessage = (issue: z.core.$ZodRawIssue): string | undefined => {
  if (issue.code === 'invalid_type') return 'Say why the lorry goes out anyway';
  if (issue.code === 'too_small') return 'Say why in a few words (at least 3 letters)';
  if (issue.code === 'too_big') return 'Keep the reason to 500 characters';
  return undefined;
};

function OverrideForm({ run, blocks, onSent, onCancel }: { run: Run; blocks: string[]; onSent: () => void; onCancel: () => void }) {
  const send = useSendOut(run.id);
  const ids = useId();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<OverrideValues, unknown, z.output<typeof overrideSchema>>({
    resolver: zodResolver(overrideSchema, { error: reasonMessage }),
    defaultValues: { override_reason: '' },
  });
  const onSubmit = handleSubmit(async (values) => {
    try {
      await send.mutateAsync(values);
      onSent();
    } catch (error) {
      setError('root.server', { message: errorMessage(error) });
    }
  });
  const fieldError = errors.override_reason?.message;
  return (
    <form noValidate aria-label="Send out anyway" onSubmit={(e) => void onSubmit(e)} className="space-y-3 rounded-md border border-ochre-500 bg-ochre-50 p-3">
      {errors.root?.server ? (
        <Alert tone="danger" title="The lorry was not sent out">
          {errors.root.server.message}
        </Alert>
      ) : null}
      <p className="text-sm text-ochre-800">Sending out anyway ({blocks.join(' and ')}) is recorded on each drop&apos;s order with your name and the reason.</p>
      <div>
        <label htmlFor={`${ids}-reason`} className="mb-1.5 block font-medium">
          Reason for sending out anyway
        </label>
        <textarea
          id={`${ids}-reason`}
          rows={2}
          className={`block w-full rounded-md border bg-white px-3 py-2 ${fieldError ? 'border-brick-600' : 'border-ink-300'}`}
          aria-invalid={fieldError ? true : undefined}
          aria-describedby={fieldError ? `${ids}-reason-error` : undefined}
          {...register('override_reason')}
        />
        {fieldError ? (
          <p id={`${ids}-reason-error`} className="mt-1.5 text-sm font-medium text-brick-700">
            {fieldError}
          </p>
        ) : null}
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" busy={isSubmitting}>
          Send out with this reason
        </Button>
        <Button variant="ghost" onClick={onCancel}>
          Keep it in the yard
        </Button>
      </div>
    </form>
  );
}

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
          <OverrideForm run={run} blocks={gaps} onSent={sent} onCancel={() => setOverriding(false)} />
        ) : (
          <Button variant="secondary" aria-expanded={false} onClick={() => setOverriding(true)}>
            Send out anyway…
          </Button>
        )
      ) : null}
    </div>
  );
}
