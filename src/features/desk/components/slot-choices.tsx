import { useId, useState } from 'react';
import { FieldMessage, useFieldGroup, useSchemaFormContext } from '../../../components/form/fields';
import { ErrorAlert } from '../../../components/ui/alert';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate } from '../../../lib/format';
import { useBranchSlots } from '../api/get-branch-slots';

const kg = (value: number) => `${Math.round(value).toLocaleString('en-GB')} kg`;

interface SlotChoicesProps {
  branchId: number;
  /** The day to show first: the day the contractor asked for. */
  initialDate: string;
  /** Offer "book later" as the first choice (confirming without a slot). */
  allowNone?: boolean;
  currentSlotId?: number | null;
  /** The order is lifted onto the roof: only lorries with a crane can take it. */
  needsCrane?: boolean;
}

/**
 * The branch's slots on a day, with what each lorry can still carry, as radio choices named
 * slot_id on the form around them. The server checks this order's own weight and pallets when it books.
 */
export function SlotChoices({ branchId, initialDate, allowNone = false, currentSlotId = null, needsCrane = false }: SlotChoicesProps) {
  const dateId = useId();
  const [date, setDate] = useState(initialDate);
  const slots = useBranchSlots(branchId, date);
  const form = useSchemaFormContext();
  const { error, errorId } = useFieldGroup('slot_id');
  const slotInput = form.register('slot_id');
  return (
    <fieldset className="space-y-3" aria-describedby={error ? errorId : undefined}>
      <legend className="font-semibold">Delivery slot</legend>
      {needsCrane ? <p className="text-sm text-ink-700">This order is lifted onto the roof by the lorry crane: only lorries with a crane can take it.</p> : null}
      <div>
        <label htmlFor={dateId} className="mb-1.5 block font-medium">
          Day
        </label>
        <input
          id={dateId}
          type="date"
          value={date}
          onChange={(event) => {
            // A slot of the day left behind is no longer on the screen, so it is no longer the choice.
            form.methods.setValue('slot_id', '');
            setDate(event.target.value);
          }}
          className="block min-h-tap rounded-md border border-ink-300 bg-white px-3"
        />
      </div>
      {allowNone ? (
        <label className="flex min-h-tap items-center gap-3">
          <input type="radio" {...slotInput} value="" defaultChecked className="h-5 w-5" />
          <span>Book a slot later</span>
        </label>
      ) : null}
      {slots.isPending && slots.fetchStatus !== 'idle' ? (
        <SkeletonBlock label="Loading the slots" lines={2} />
      ) : slots.isError ? (
        <ErrorAlert error={slots.error} title="The slots could not be loaded" onRetry={() => void slots.refetch()} />
      ) : slots.data && slots.data.slots.length === 0 ? (
        <p className="text-ink-600">No slots at this branch on {formatDate(date)}. Try another day.</p>
      ) : slots.data ? (
        <ul className="space-y-2" aria-label={`Slots on ${formatDate(date)}`}>
          {slots.data.slots.map((slot) => {
            const full = slot.remaining_pallets <= 0 || slot.remaining_kg <= 0;
            const cannotLift = needsCrane && !slot.lorry.has_crane;
            const unavailable = (full || cannotLift) && slot.id !== currentSlotId;
            return (
              <li key={slot.id}>
                <label className={`flex min-h-tap items-start gap-3 rounded-md border px-3 py-2 ${full || cannotLift ? 'border-mortar-200 bg-mortar-50 text-ink-600' : 'border-mortar-300 bg-white'}`}>
                  <input type="radio" {...slotInput} value={slot.id} defaultChecked={slot.id === currentSlotId} disabled={unavailable} className="mt-1 h-5 w-5" />
                  <span>
                    <span className="font-semibold">
                      {slot.time_window} · {slot.lorry.registration}
                    </span>{' '}
                    <span className={`text-sm ${slot.lorry.has_crane ? 'font-medium' : ''}`}>
                      {slot.lorry.name}
                      {slot.lorry.has_crane ? `, crane: lifts up to ${kg(slot.lorry.crane_max_kg ?? 0)}` : ', no crane: cannot lift'}
                    </span>
                    <span className="block text-sm tabular-nums">
                      {kg(slot.remaining_kg)} of {kg(slot.payload_kg)} left · {slot.remaining_pallets} of {slot.pallet_slots} pallet slots left
                      {slot.driver ? ` · driver ${slot.driver.name}` : ' · no driver yet'}
                      {full ? ' · full' : ''}
                      {cannotLift ? ' · not for this order: it needs a crane' : ''}
                    </span>
                  </span>
                </label>
              </li>
            );
          })}
        </ul>
      ) : null}
      {error ? <FieldMessage id={errorId}>{error}</FieldMessage> : null}
    </fieldset>
  );
}
