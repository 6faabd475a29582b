import { useEffect, useMemo, useRef, useState } from 'react';
import type { DriverDrop } from '../../../../shared/schemas/run.schema';
import { CheckboxField, FieldMessage, Form, describedBy, fieldIds, useSchemaFormContext } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Button } from '../../../components/ui/button';
import { useOutbox } from '../lib/phone-outbox';
import type { DeliveryRecordFields, QueuedDelivery } from '../lib/outbox-types';
import { PACK_FIELDS, deliveryFields, packsField, proofFormSchema } from '../lib/proof-form-schema';
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

const time = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit' });

/** The phone's inputs: taller, larger type and a heavier border than the desk's, for a driver with gloves on. */
const largeInputClasses = 'block min-h-tap-lg w-full rounded-md border-2 bg-white px-3 text-xl aria-[invalid=true]:border-brick-600 aria-[invalid=true]:ring-1 aria-[invalid=true]:ring-brick-600';

/** A text field of the proof form, on the form's own field paths, ids, error and `aria-describedby`. */
function PhoneTextField({ name, label, multiline = false }: { name: string; label: string; multiline?: boolean }) {
  const form = useSchemaFormContext();
  const ids = fieldIds(form, name);
  const error = form.fieldError(name);
  const common = { id: ids.input, 'aria-invalid': error ? true : undefined, 'aria-describedby': describedBy(ids, null, error) };
  return (
    <div>
      <label htmlFor={ids.input} className="mb-1 block text-xl font-semibold">
        {label}
      </label>
      {multiline ? (
        <textarea rows={3} className={`${largeInputClasses} border-ink-300 py-2`} {...common} {...form.register(name)} />
      ) : (
        <input autoComplete="off" className={`${largeInputClasses} border-ink-300`} {...common} {...form.register(name)} />
      )}
      {error ? <FieldMessage id={ids.error}>{error}</FieldMessage> : null}
    </div>
  );
}

/** Only the photos live outside the inputs (in React state); their error shows under the picker. */
const isPhotosPath = (path: string) => path === 'photos';

/** One line's three counts, laid out side by side; each input is named by its path in the delivery body. */
function LineCounts({ line, index }: { line: DriverDrop['lines'][number]; index: number }) {
  const form = useSchemaFormContext();
  const headingId = `${form.id}-line-${index}`;
  const messages = PACK_FIELDS.map((field) => form.fieldError(packsField(index, field)));
  const message = messages.find(Boolean);
  const errorId = fieldIds(form, packsField(index, 'handed_over')).error;
  return (
    <div className="rounded-md border-2 border-ink-200 p-3" role="group" aria-labelledby={headingId}>
      <p id={headingId} className="font-semibold">
        {line.description}
        <span className="block font-normal text-ink-700">
          {line.quantity} {line.quantity === 1 ? 'pack' : 'packs'} went out · {line.sku}
        </span>
      </p>
      <div className="mt-2 grid grid-cols-3 gap-2">
        {PACK_FIELDS.map((field, f) => {
          const name = packsField(index, field);
          const inputId = fieldIds(form, name).input;
          return (
            <div key={field}>
              <label htmlFor={inputId} className="block text-base font-medium">
                {field === 'handed_over' ? 'Handed over' : field === 'short' ? 'Short' : 'Damaged'}
                <span className="sr-only">: {line.description}</span>
              </label>
              <input
                id={inputId}
                type="number"
                inputMode="numeric"
                min={0}
                step={1}
                defaultValue={field === 'handed_over' ? line.quantity : 0}
                className={`${largeInputClasses} border-ink-300`}
                aria-invalid={messages[f] ? true : undefined}
                aria-describedby={message ? errorId : undefined}
                {...form.register(name)}
              />
            </div>
          );
        })}
      </div>
      {message ? <FieldMessage id={errorId}>{message}</FieldMessage> : null}
    </div>
  );
}

/**
 * Proof of delivery for one drop: who took it and their signature (or their name typed again), up to
 * six photos, per line the packs handed over, short and damaged, the time and, when the phone gives
 * it, where. The record goes into the phone's outbox first and is sent from there, so no signal only
 * means it waits; a refusal the server gives when it is sent at once lands on the fields it names.
 */
export function ProofForm({ drop, onRecorded, now = () => new Date() }: ProofFormProps) {
  const { outbox } = useOutbox();
  const signature = useRef<SignatureBoxHandle>(null);
  const position = usePosition();
  const [photos, setPhotos] = useState<Blob[]>([]);
  const [signed, setSigned] = useState(false);
  const [openedAt] = useState(now);
  const schema = useMemo(() => proofFormSchema(drop.lines), [drop.lines]);
  const extraValues = useMemo(() => ({ photos, signature_drawn: signed }), [photos, signed]);

  const form = useSchemaForm({
    schema,
    extraValues,
    statePaths: isPhotosPath,
    onSubmit: async (values) => {
      const at = now();
      const entry: QueuedDelivery = {
        kind: 'delivery',
        key: crypto.randomUUID(),
        order_id: drop.order_id,
        reference: drop.reference,
        site_name: drop.site.name,
        data: deliveryFields(values, at, values.use_position && position.status === 'found' ? position.position : null),
        signature: values.signature_drawn ? (signature.current?.toPng() ?? null) : null,
        photos: values.photos.map((blob, i) => ({ blob, name: blob instanceof File && blob.name ? blob.name : `photo-${i + 1}.jpg`, type: blob.type })),
        queued_at: at.toISOString(),
        attempts: 0,
        state: 'waiting',
        last_error: null,
      };
      // A refusal as it stands is thrown back here: the form shows why and keeps what was entered.
      onRecorded(await outbox.record(entry));
    },
  });

  // The photos are checked as they are taken; the typed name again once a signature comes or goes after a try.
  const { trigger, formState } = form.methods;
  const tried = formState.isSubmitted;
  useEffect(() => {
    if (photos.length > 0 || tried) void trigger('photos');
  }, [photos, tried, trigger]);
  useEffect(() => {
    if (tried) void trigger('typed_confirmation');
  }, [signed, tried, trigger]);

  const photosError = form.fieldError('photos');
  const signatureHelpId = `${form.id}-signature-help`;

  return (
    <Form form={form} label={`Proof of delivery for ${drop.reference}`} className="space-y-6 text-lg">
      <fieldset className="space-y-4">
        <legend className="text-xl font-semibold">What was handed over</legend>
        {drop.lines.map((line, i) => (
          <LineCounts key={line.line_id} line={line} index={i} />
        ))}
      </fieldset>

      <PhoneTextField name="receiver_name" label="Taken by (name)" />

      <fieldset className="space-y-3">
        <legend className="text-xl font-semibold">Signature</legend>
        <p id={signatureHelpId} className="text-ink-700">
          {signed ? 'Signed. Clear it to sign again.' : 'The receiver signs in the box.'}
        </p>
        <SignatureBox ref={signature} describedBy={signatureHelpId} onChange={setSigned} />
        <PhoneTextField name="typed_confirmation" label="Or, instead of signing: type the receiver’s name again to confirm" />
      </fieldset>

      <PhotoPicker photos={photos} errorId={fieldIds(form, 'photos').error} error={photosError} onChange={setPhotos} />

      <PhoneTextField name="note" label="Note (where it was left, anything wrong)" multiline />

      <div className="rounded-md bg-mortar-100 p-3">
        <p>
          Time: <span className="font-semibold">{time.format(openedAt)}</span>, taken again when you press Delivered.
        </p>
        {position.status === 'found' ? (
          <CheckboxField
            name="use_position"
            defaultChecked
            className="mt-2"
            label={
              <span>
                Add where I am ({position.position.lat.toFixed(5)}, {position.position.lng.toFixed(5)}, within {position.position.accuracy_m} m)
              </span>
            }
          />
        ) : (
          <p className="mt-1 text-ink-700">{position.status === 'asking' ? 'Finding where you are…' : `No position: ${position.reason}. It is not needed.`}</p>
        )}
      </div>

      <Button type="submit" size="lg" busy={form.submitting} className="w-full text-xl">
        Delivered
      </Button>
    </Form>
  );
}
