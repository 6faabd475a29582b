import { useMemo } from 'react';
import type { Lorry } from '../../../../shared/schemas/fleet.schema';
import type { Slot } from '../../../../shared/schemas/slot.schema';
import { Form, SelectField, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { useCreateSlot, useGenerateSlots } from '../api/create-slots';
import { useDrivers } from '../api/get-drivers';
import { useUpdateSlot } from '../api/update-slot';
import { slotChangeFormSchema } from '../lib/slot-change';
import { generateFormSchema, lorryChoiceField, slotFormSchema, WEEKDAYS, weekdayField } from '../lib/slot-forms';

const lorryLabel = (l: Lorry) => `${l.registration}${l.name ? ` · ${l.name}` : ''}`;

/** One extra slot for one lorry on one day (a Saturday run, a second afternoon). */
export function CreateSlotForm({ branchId, lorries }: { branchId: number; lorries: readonly Lorry[] }) {
  const create = useCreateSlot(branchId);
  const drivers = useDrivers();
  const toast = useToast();
  const form = useSchemaForm({
    schema: slotFormSchema,
    onSubmit: async (body) => {
      const slot = await create.mutateAsync(body);
      toast.show(`Slot added: ${slot.lorry.registration}, ${slot.date} ${slot.time_window}.`, 'success');
    },
  });
  return (
    <Form form={form} label="Add one slot">
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField name="lorry_id" label="Lorry" options={lorries.map((l) => ({ value: String(l.id), label: lorryLabel(l) }))} />
        <TextField name="date" type="date" label="Day" />
        <TextField name="time_window" label="Time window" hint="HH:MM-HH:MM, e.g. 07:30-12:00" autoComplete="off" />
        <SelectField name="driver_id" label="Driver (optional)" options={[{ value: '', label: 'Not yet' }, ...(drivers.data?.drivers ?? []).map((d) => ({ value: String(d.id), label: d.name }))]} />
      </div>
      <SubmitButton>Add the slot</SubmitButton>
    </Form>
  );
}

/** A calendar of slots for a run of days: every window for each chosen lorry on each chosen weekday. */
export function GenerateSlotsForm({ branchId, lorries }: { branchId: number; lorries: readonly Lorry[] }) {
  const generate = useGenerateSlots(branchId);
  const toast = useToast();
  const schema = useMemo(() => generateFormSchema(lorries.map((l) => l.id)), [lorries]);
  const form = useSchemaForm({
    schema,
    onSubmit: async (body) => {
      const result = await generate.mutateAsync(body);
      toast.show(`${result.created} slots made${result.skipped ? `, ${result.skipped} already there` : ''}.`, 'success');
    },
  });
  return (
    <Form form={form} label="Make slots for a run of days">
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField name="from" type="date" label="First day" />
        <TextField name="to" type="date" label="Last day" hint="At most 62 days after the first." />
      </div>
      <TextField name="windows" label="Time windows" hint="Comma between windows, e.g. 07:30-12:00, 12:30-16:30" autoComplete="off" />
      <fieldset>
        <legend className="mb-1.5 font-medium text-ink-900">Weekdays</legend>
        <div className="flex flex-wrap gap-3">
          {WEEKDAYS.map((w) => (
            <label key={w.day} className="flex min-h-tap cursor-pointer items-center gap-2">
              <input type="checkbox" {...form.register(weekdayField(w.day))} defaultChecked={w.day <= 5} className="h-5 w-5 accent-clay-600" />
              {w.label}
            </label>
          ))}
        </div>
      </fieldset>
      <fieldset>
        <legend className="mb-1.5 font-medium text-ink-900">Lorries (none ticked: every lorry of the branch)</legend>
        <div className="flex flex-wrap gap-3">
          {lorries.map((l) => (
            <label key={l.id} className="flex min-h-tap cursor-pointer items-center gap-2">
              <input type="checkbox" {...form.register(lorryChoiceField(l.id))} className="h-5 w-5 accent-clay-600" />
              {lorryLabel(l)}
            </label>
          ))}
        </div>
      </fieldset>
      <SubmitButton>Make the slots</SubmitButton>
    </Form>
  );
}

/**
 * Changing one slot: its time window and its driver, the two things a slot's own record holds (the
 * lorry and the day are the slot itself; to move those, add a slot and move the orders). Only what
 * differs is sent; a refusal (the lorry has that window already, the driver is not one of yours)
 * shows in the form, beside the slot.
 */
export function ChangeSlotForm({ slot, drivers, onDone }: { slot: Slot; drivers: readonly { id: number; name: string }[]; onDone: () => void }) {
  const update = useUpdateSlot();
  const toast = useToast();
  const driverId = slot.driver?.id ?? null;
  const schema = useMemo(() => slotChangeFormSchema({ time_window: slot.time_window, driver_id: driverId }), [slot.time_window, driverId]);
  // The slot's own driver is always a choice, so a driver list still loading never reads as "take the driver off".
  const choices = [...(slot.driver && !drivers.some((d) => d.id === driverId) ? [slot.driver] : []), ...drivers];
  const driverOptions = [{ value: '', label: 'No driver' }, ...choices.map((d) => ({ value: String(d.id), label: d.name }))];
  const form = useSchemaForm({
    schema,
    onSubmit: async (body) => {
      const saved = await update.mutateAsync({ slotId: slot.id, body });
      toast.show(`Slot changed: ${saved.lorry.registration}, ${saved.time_window}${saved.driver ? `, ${saved.driver.name} driving` : ', no driver yet'}.`, 'success');
      onDone();
    },
  });
  const booked = slot.bookings.length;
  return (
    <Form form={form} label={`Change the slot ${slot.time_window} of ${slot.lorry.registration}`}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField name="time_window" label="Time window" hint="HH:MM-HH:MM, e.g. 12:30-16:30" autoComplete="off" defaultValue={slot.time_window} />
        <SelectField name="driver_id" label="Driver" options={driverOptions} defaultValue={driverId === null ? '' : String(driverId)} />
      </div>
      {booked ? (
        <Alert tone="info" live={false}>
          {booked === 1 ? 'One order is' : `${booked} orders are`} booked on this slot and move with it to the new window; tell the site if its delivery time changes.
        </Alert>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <SubmitButton>Save the slot</SubmitButton>
        <Button variant="ghost" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </Form>
  );
}
