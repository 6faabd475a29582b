import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useId, useRef, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import type { FieldPath } from 'react-hook-form';
import type { DriverDrop } from '../../../../shared/schemas/run.schema';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { isApiError } from '../../../lib/api-client';
import { useOutbox } from '../lib/phone-outbox';
import type { DeliveryRecordFields, QueuedDelivery } from '../lib/outbox-types';
import { deliveryFields, proofFormSchema } from '../lib/proof-form-schema';
import type { ProofFormInput, ProofFormValues } from '../lib/proof-form-schema';
import { PhotoPicker } from './photo-picker';
import { SignatureBox } from './signature-box';
import type { SignatureBoxHandle } from './signature-box';

export type RecordOutcome = 'sent' | 'already_recorded' | 'queued';

interface ProofFormProps {
  drop: DriverDrop;
  onRecorded: (outcome: RecordOutcome) => void;
  /** The clock, for tests. */
  now?: () => Date;
}

type PositionState = { status: 'asking' } | { status: 'found'; position: NonNullable<DeliveryRecordFields['position']> } | { status: 'none'; reason: string };

/** Asks the phone where it is, once, when the form opens; a refusal or no fix is fine. */
function usePosition(): PositionState {
  const geolocation = typeof navigator !== 'undefined' ? navigator.geolocation : undefined;
  const [state, setState] = useState<PositionState>(() => (geolocation ? { status: 'asking' } : { status: 'none', reason: 'this phone does not give its position' }));
  useEffect(() => {
    if (!geolocation) return;
    let live = true;
    geolocation.getCurrentPosition(
      (p) => {
        if (live) setState({ status: 'found', position: { lat: p.coords.latitude, lng: p.coords.longitude, accuracy_m: Math.round(p.coords.accuracy) } });
      },
      (error) => {
        if (live) setState({ status: 'none', reason: error.code === 1 ? 'the phone was not allowed to give it' : 'the phone could not find it' });
      },
      { enableHighAccuracy: true, timeout: 15_000, maximumAge: 60_000 },
    );
    return () => {
      live = false;
    };
  }, [geolocation]);
  return state;
}

const inputClass = 'block min-h-tap-lg w-full rounded-md border-2 border-ink-300 bg-white px-3 text-xl aria-[invalid=true]:border-brick-600 aria-[invalid=true]:ring-1 aria-[invalid=true]:ring-brick-600';

function FieldError({ id, message }: { id: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="mt-1 text-lg font-semibold text-brick-700">
      {message}
    </p>
  );
}

const time = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit' });

/**
 * Proof of delivery for one drop: who took it and their signature (or their name typed again), up to
 * six photos, per line the packs handed over, short and damaged, the time and, when the phone gives
 * it, where. The record goes into the phone's outbox first and is sent from there, so no signal only
 * means it waits.
 */
export function ProofForm({ drop, onRecorded, now = () => new Date() }: ProofFormProps) {
  const uid = useId();
  const { outbox } = useOutbox();
  const signature = useRef<SignatureBoxHandle>(null);
  const position = usePosition();
  const [usePositionToo, setUsePositionToo] = useState(true);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<ProofFormInput, unknown, ProofFormValues>({
    resolver: zodResolver(proofFormSchema(drop.lines)),
    defaultValues: {
      receiver_name: '',
      note: '',
      signature_drawn: false,
      typed_confirmation: '',
      photos: [],
      lines: drop.lines.map((l) => ({ line_id: l.line_id, handed_over: l.quantity, short: 0, damaged: 0 })),
    },
  });
  const { register, handleSubmit, setValue, setError, formState, control } = form;
  const { errors, isSubmitting } = formState;
  const photos = useWatch({ control, name: 'photos' }) as Blob[];
  const signed = useWatch({ control, name: 'signature_drawn' });
  const [openedAt] = useState(now);

  const onSubmit = async (values: ProofFormValues) => {
    setFormError(null);
    const at = now();
    const entry: QueuedDelivery = {
      kind: 'delivery',
      key: crypto.randomUUID(),
      order_id: drop.order_id,
      reference: drop.reference,
      site_name: drop.site.name,
      data: deliveryFields(values, at, usePositionToo && position.status === 'found' ? position.position : null),
      signature: values.signature_drawn ? (signature.current?.toPng() ?? null) : null,
      photos: values.photos.map((blob, i) => ({ blob, name: blob instanceof File && blob.name ? blob.name : `photo-${i + 1}.jpg`, type: blob.type })),
      queued_at: at.toISOString(),
      attempts: 0,
      state: 'waiting',
      last_error: null,
    };
    try {
      onRecorded(await outbox.record(entry));
    } catch (error) {
      // The server refused this record as it stands: show why, keep what was entered.
      if (isApiError(error) && error.details.length > 0) {
        for (const detail of error.details) {
          if (detail.path && /^(receiver_name|note|photos|lines\.\d+\.(handed_over|short|damaged))$/.test(detail.path)) setError(detail.path as FieldPath<ProofFormInput>, { message: detail.message });
        }
      }
      setFormError(isApiError(error) ? error.message : 'The delivery could not be recorded. Try again.');
    }
  };

  const ids = {
    receiver: `${uid}-receiver`,
    typed: `${uid}-typed`,
    note: `${uid}-note`,
    signatureHelp: `${uid}-signature-help`,
    photosError: `${uid}-photos-error`,
  };

  return (
    <form noValidate aria-label={`Proof of delivery for ${drop.reference}`} onSubmit={(e) => void handleSubmit(onSubmit)(e)} className="space-y-6 text-lg">
      {formError ? (
        <Alert tone="danger" title="Not recorded">
          {formError}
        </Alert>
      ) : null}

      <fieldset className="space-y-4">
        <legend className="text-xl font-semibold">What was handed over</legend>
        {drop.lines.map((line, i) => {
          const lineErrors = errors.lines?.[i];
          const message = lineErrors?.handed_over?.message ?? lineErrors?.short?.message ?? lineErrors?.damaged?.message;
          const errorId = `${uid}-line-${i}-error`;
          return (
            <div key={line.line_id} className="rounded-md border-2 border-ink-200 p-3" role="group" aria-labelledby={`${uid}-line-${i}`}>
              <p id={`${uid}-line-${i}`} className="font-semibold">
                {line.description}
                <span className="block font-normal text-ink-700">
                  {line.quantity} {line.quantity === 1 ? 'pack' : 'packs'} went out · {line.sku}
                </span>
              </p>
              <div className="mt-2 grid grid-cols-3 gap-2">
                {(['handed_over', 'short', 'damaged'] as const).map((field) => (
                  <div key={field}>
                    <label htmlFor={`${uid}-line-${i}-${field}`} className="block text-base font-medium">
                      {field === 'handed_over' ? 'Handed over' : field === 'short' ? 'Short' : 'Damaged'}
                      <span className="sr-only">: {line.description}</span>
                    </label>
                    <input
                      id={`${uid}-line-${i}-${field}`}
                      type="number"
                      inputMode="numeric"
                      min={0}
                      step={1}
                      className={inputClass}
                      aria-invalid={lineErrors?.[field] ? true : undefined}
                      aria-describedby={message ? errorId : undefined}
                      {...register(`lines.${i}.${field}`, { valueAsNumber: true })}
                    />
                  </div>
                ))}
              </div>
              <FieldError id={errorId} message={message} />
            </div>
          );
        })}
      </fieldset>

      <div>
        <label htmlFor={ids.receiver} className="mb-1 block text-xl font-semibold">
          Taken by (name)
        </label>
        <input
          id={ids.receiver}
          autoComplete="off"
          className={inputClass}
          aria-invalid={errors.receiver_name ? true : undefined}
          aria-describedby={errors.receiver_name ? `${ids.receiver}-error` : undefined}
          {...register('receiver_name')}
        />
        <FieldError id={`${ids.receiver}-error`} message={errors.receiver_name?.message} />
      </div>

      <fieldset className="space-y-3">
        <legend className="text-xl font-semibold">Signature</legend>
        <p id={ids.signatureHelp} className="text-ink-700">
          {signed ? 'Signed. Clear it to sign again.' : 'The receiver signs in the box.'}
        </p>
        <SignatureBox ref={signature} describedBy={ids.signatureHelp} onChange={(drawn) => setValue('signature_drawn', drawn, { shouldValidate: formState.isSubmitted })} />
        <div>
          <label htmlFor={ids.typed} className="mb-1 block font-semibold">
            Or, instead of signing: type the receiver&rsquo;s name again to confirm
          </label>
          <input
            id={ids.typed}
            autoComplete="off"
            className={inputClass}
            aria-invalid={errors.typed_confirmation ? true : undefined}
            aria-describedby={errors.typed_confirmation ? `${ids.typed}-error` : undefined}
            {...register('typed_confirmation')}
          />
          <FieldError id={`${ids.typed}-error`} message={errors.typed_confirmation?.message} />
        </div>
      </fieldset>

      <PhotoPicker photos={photos} errorId={ids.photosError} error={errors.photos?.message ?? errors.photos?.root?.message} onChange={(next) => setValue('photos', next, { shouldValidate: true })} />

      <div>
        <label htmlFor={ids.note} className="mb-1 block text-xl font-semibold">
          Note (where it was left, anything wrong)
        </label>
        <textarea id={ids.note} rows={3} className={`${inputClass} py-2`} {...register('note')} />
        <FieldError id={`${ids.note}-error`} message={errors.note?.message} />
      </div>

      <div className="rounded-md bg-mortar-100 p-3">
        <p>
          Time: <span className="font-semibold">{time.format(openedAt)}</span>, taken again when you press Delivered.
        </p>
        {position.status === 'found' ? (
          <label className="mt-2 flex min-h-tap-lg items-center gap-3">
            <input type="checkbox" checked={usePositionToo} onChange={(e) => setUsePositionToo(e.target.checked)} className="h-7 w-7 accent-clay-600" />
            <span>
              Add where I am ({position.position.lat.toFixed(5)}, {position.position.lng.toFixed(5)}, within {position.position.accuracy_m} m)
            </span>
          </label>
        ) : (
          <p className="mt-1 text-ink-700">{position.status === 'asking' ? 'Finding where you are…' : `No position: ${position.reason}. It is not needed.`}</p>
        )}
      </div>

      <Button type="submit" size="lg" busy={isSubmitting} className="w-full text-xl">
        Delivered
      </Button>
    </form>
  );
}
