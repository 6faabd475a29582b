import { useState } from 'react';
import * as z from 'zod/mini';
import { bookSlotBodySchema } from '../../../../shared/schemas/order.schema';
import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import { Form, SubmitButton } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { errorMessage } from '../../../components/ui/alert';
import { useBookSlot } from '../api/book-slot';
import { ConflictDetails, isDeskConflict } from './conflict-details';
import { SlotChoices } from './slot-choices';

/** The slot chosen, read into the booking body; "book later" is no choice here. */
const slotFormSchema = z.pipe(
  z.pipe(
    z.record(z.string(), z.string()),
    z.transform((values) => ({ slot_id: values.slot_id ? Number(values.slot_id) : undefined })),
  ),
  z.extend(bookSlotBodySchema, { slot_id: z.number({ error: 'Choose a slot first.' }).check(z.int(), z.positive()) }),
);

/** Booking (or moving) a confirmed order into a lorry's slot; an overbooking is refused with the lorry's figures. */
export function SlotBooking({ order }: { order: OrderDetail }) {
  const book = useBookSlot(order.id);
  const toast = useToast();
  const [problem, setProblem] = useState<unknown>(null);
  const form = useSchemaForm({
    schema: slotFormSchema,
    onSubmit: async ({ slot_id }) => {
      setProblem(null);
      try {
        const booked = await book.mutateAsync(slot_id);
        toast.show(`${booked.reference} is booked for ${booked.slot?.date ?? ''} ${booked.slot?.time_window ?? ''} on ${booked.slot?.lorry.registration ?? ''}.`, 'success');
      } catch (error) {
        if (isDeskConflict(error)) setProblem(error);
        else toast.show(errorMessage(error), 'danger');
      }
    },
  });
  return (
    <Form form={form} label="Book a delivery slot" className="space-y-4">
      {problem ? <ConflictDetails error={problem} /> : null}
      <SlotChoices needsCrane={order.delivery_method === 'roof'} branchId={order.branch.id} initialDate={order.slot?.date ?? order.requested_date} currentSlotId={order.slot?.slot_id ?? null} />
      <SubmitButton>{order.slot ? 'Move to this slot' : 'Book this slot'}</SubmitButton>
    </Form>
  );
}
