import { addDays } from '../../../../shared/domain/business-calendar';
import { businessCalendar } from '../../../lib/business-calendar';
import { lazy, Suspense, useId, useState } from 'react';
import { Link } from 'react-router-dom';
import type { Slot } from '../../../../shared/schemas/slot.schema';
import { Alert, ErrorAlert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useToast } from '../../../components/ui/toast';
import { formatDate } from '../../../lib/format';
import { useDrivers } from '../api/get-drivers';
import { useSlotDay } from '../api/get-slot-day';
import { useRemoveSlot } from '../api/remove-slot';
import { useUpdateSlot } from '../api/update-slot';
import { ActionError } from './action-error';
import { focusOnShow } from '../../../lib/focus-on-show';

// The change form (with the form library) loads when it is opened (DEVELOPERS.md, decision 37).
const ChangeSlotForm = lazy(() => import('./slot-forms').then((m) => ({ default: m.ChangeSlotForm })));

/** A slot is a run; the yard builds and sends it out on the run's page. */
const runPath = (slotId: number) => `/yard/runs/${slotId}`;
const kg = (value: number) => `${Math.round(value).toLocaleString('en-GB')} kg`;
const pct = (used: number, of: number) => (of > 0 ? Math.min(100, Math.round((used / of) * 100)) : 0);

function Capacity({ label, used, of, text }: { label: string; used: number; of: number; text: string }) {
  return (
    <div>
      <div className="flex justify-between text-sm">
        <span>{label}</span>
        <span className="tabular-nums">{text}</span>
      </div>
      <div className="h-2 rounded bg-mortar-200" role="meter" aria-label={label} aria-valuemin={0} aria-valuemax={of} aria-valuenow={used}>
        <div className={`h-2 rounded ${pct(used, of) >= 100 ? 'bg-brick-600' : 'bg-moss-600'}`} style={{ width: `${pct(used, of)}%` }} />
      </div>
    </div>
  );
}

/** Removing a slot, asked once more first; a slot with orders on it is refused by the server (409). */
function RemoveSlot({ slot, onDone }: { slot: Slot; onDone: () => void }) {
  const remove = useRemoveSlot();
  const toast = useToast();
  const booked = slot.bookings.length;
  return (
    <div className="space-y-3">
      <Alert tone="caution" title={`Remove the ${slot.time_window} slot of ${slot.lorry.registration} on ${formatDate(slot.date)}?`} live={false}>
        {booked
          ? `${booked === 1 ? 'One order is' : `${booked} orders are`} booked on it. A slot with orders cannot be removed: move them to another slot first.`
          : 'Nothing is booked on it. Removed, it no longer offers this window to the desk.'}
      </Alert>
      {remove.isError ? <ActionError error={remove.error} title="The slot was not removed" /> : null}
      <div className="flex flex-wrap gap-2">
        <Button
          variant="danger"
          busy={remove.isPending}
          onClick={() =>
            // The promise, not mutate's callbacks: the slot is gone from the refetched day (and unmounted) before they would run.
            remove.mutateAsync(slot.id).then(
              () => {
                toast.show(`Slot removed: ${slot.lorry.registration}, ${slot.date} ${slot.time_window}.`, 'success');
                onDone();
              },
              () => undefined, // shown at the slot from the mutation's state
            )
          }
        >
          Remove the slot
        </Button>
        <Button variant="ghost" ref={focusOnShow} onClick={onDone}>
          Keep it
        </Button>
      </div>
    </div>
  );
}

function SlotRow({ slot, drivers, canManage }: { slot: Slot; drivers: { id: number; name: string }[]; canManage: boolean }) {
  const assign = useUpdateSlot();
  const toast = useToast();
  const selectId = useId();
  const [panel, setPanel] = useState<'change' | 'remove' | null>(null);
  const named = `${slot.time_window} ${slot.lorry.registration}`;
  return (
    <li className="space-y-3 rounded-md border border-mortar-300 bg-white p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold">
          {slot.time_window} · {slot.lorry.registration}{' '}
          <span className="font-normal text-ink-700">
            {slot.lorry.name}
            {slot.lorry.has_crane ? `, crane ${kg(slot.lorry.crane_max_kg ?? 0)}` : ''}
          </span>
        </h3>
        {canManage ? (
          <div className="flex flex-wrap items-center gap-2">
            <label htmlFor={selectId} className="text-sm font-medium">
              Driver
            </label>
            <select
              id={selectId}
              value={slot.driver?.id ?? ''}
              disabled={assign.isPending}
              onChange={(e) =>
                assign.mutate(
                  { slotId: slot.id, body: { driver_id: e.target.value ? Number(e.target.value) : null } },
                  { onSuccess: () => toast.show('Driver assigned.', 'success'), onError: (error) => toast.show(errorMessage(error), 'danger') },
                )
              }
              className="block min-h-tap rounded-md border border-ink-300 bg-white px-2"
            >
              <option value="">No driver</option>
              {slot.driver && !drivers.some((d) => d.id === slot.driver?.id) ? <option value={slot.driver.id}>{slot.driver.name}</option> : null}
              {drivers.map((d) => (
                <option key={d.id} value={d.id}>
                  {d.name}
                </option>
              ))}
            </select>
            <Button variant="secondary" aria-label={`Change the time window or driver of ${named}`} aria-expanded={panel === 'change'} onClick={() => setPanel((p) => (p === 'change' ? null : 'change'))}>
              Change time or driver
            </Button>
            <Button variant="secondary" aria-label={`Remove the slot ${named}`} aria-expanded={panel === 'remove'} onClick={() => setPanel((p) => (p === 'remove' ? null : 'remove'))}>
              Remove slot
            </Button>
          </div>
        ) : (
          <span className="text-sm">Driver: {slot.driver?.name ?? 'none yet'}</span>
        )}
      </div>
      {canManage && panel === 'change' ? (
        <Suspense fallback={<SkeletonBlock label="Opening the form" lines={2} />}>
          <ChangeSlotForm slot={slot} drivers={drivers} onDone={() => setPanel(null)} />
        </Suspense>
      ) : null}
      {canManage && panel === 'remove' ? <RemoveSlot slot={slot} onDone={() => setPanel(null)} /> : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <Capacity label="Payload" used={slot.booked_kg} of={slot.payload_kg} text={`${kg(slot.booked_kg)} of ${kg(slot.payload_kg)}`} />
        <Capacity label="Pallet slots" used={slot.booked_pallets} of={slot.pallet_slots} text={`${slot.booked_pallets} of ${slot.pallet_slots}`} />
      </div>
      {slot.bookings.length > 0 ? (
        <p>
          <Link to={runPath(slot.id)} className="inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2">
            Open the run: drops, deck, loading and send out
          </Link>
        </p>
      ) : null}
      {slot.bookings.length > 0 ? (
        <ul className="divide-y divide-mortar-200" aria-label={`Orders on ${slot.lorry.registration} ${slot.time_window}`}>
          {slot.bookings.map((b) => (
            <li key={b.order_id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <span>
                <Link to={runPath(slot.id)} className="font-semibold text-clay-700 underline underline-offset-2" aria-label={`${b.reference}: open its run`}>
                  {b.reference}
                </Link>{' '}
                · {b.contractor.name} · {b.site_name} · {kg(b.weight_kg)}, {b.pallets} pallets{b.delivery_method === 'roof' ? ' · crane onto the roof' : ''}
                <span className="ml-2 text-sm text-ink-600">{b.status.replace(/_/g, ' ')}</span>
              </span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-600">Nothing booked.</p>
      )}
    </li>
  );
}

/**
 * A branch's slots on a day: what each lorry carries, who drives it, and sending the loads out.
 * With `canManage` (fleet:manage) each slot can be given a driver, changed or removed.
 */
export function SlotCalendar({ branchId, canManage }: { branchId: number; canManage: boolean }) {
  const dateId = useId();
  const [date, setDate] = useState(() => businessCalendar().today());
  const slots = useSlotDay(branchId, date);
  const drivers = useDrivers();
  const shift = (days: number) => setDate((d) => addDays(d, days));
  return (
    <section aria-label="Slot calendar" className="space-y-4">
      <div className="flex flex-wrap items-end gap-2">
        <Button variant="secondary" onClick={() => shift(-1)}>
          Day before
        </Button>
        <div>
          <label htmlFor={dateId} className="mb-1 block text-sm font-medium">
            Day
          </label>
          <input id={dateId} type="date" value={date} onChange={(e) => setDate(e.target.value)} className="block min-h-tap rounded-md border border-ink-300 bg-white px-3" />
        </div>
        <Button variant="secondary" onClick={() => shift(1)}>
          Day after
        </Button>
      </div>
      {slots.isPending ? (
        <SkeletonBlock label="Loading the slots" lines={4} />
      ) : slots.isError ? (
        <ErrorAlert error={slots.error} title="The slots could not be loaded" onRetry={() => void slots.refetch()} />
      ) : slots.data.slots.length === 0 ? (
        <EmptyState title={`No slots on ${formatDate(date)}`}>Lorries have no slots in the calendar that day.</EmptyState>
      ) : (
        <ul className="space-y-3">
          {slots.data.slots.map((slot) => (
            <SlotRow key={slot.id} slot={slot} drivers={drivers.data?.drivers ?? []} canManage={canManage} />
          ))}
        </ul>
      )}
    </section>
  );
}
