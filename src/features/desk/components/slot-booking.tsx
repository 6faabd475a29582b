import { useState } from 'react';
import type { FormEvent } from 'react';
import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { errorMessage } from '../../../components/ui/alert';
import { useBookSlot } from '../api/book-slot';
import { ConflictDetails, isDeskConflict } from './conflict-details';
import { SlotChoices } from './slot-choices';

/** Booking (or moving) a confirmed order into a lorry's slot; an overbooking is refused with the lorry's figures. */
export function SlotBooking({ order }: { order: OrderDetail }) {
  const book = useBookSlot(order.id);
  const toast = useToast();
  const [problem, setProblem] = useState<unknown>(null);
  const [missing, setMissing] = useState(false);
  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const slotId = Number(new FormData(event.currentTarget).get('slot_id') ?? '');
    if (!slotId) {
      setMissing(true);
      return;
    }
    setMissing(false);
    setProblem(null);
    book.mutate(slotId, {
      onSuccess: (booked) => toast.show(`${booked.reference} is booked for ${booked.slot?.date ?? ''} ${booked.slot?.time_window ?? ''} on ${booked.slot?.lorry.registration ?? ''}.`, 'success'),
      onError: (error) => (isDeskConflict(error) ? setProblem(error) : toast.show(errorMessage(error), 'danger')),
    });
  };
  return (
    <form onSubmit={onSubmit} aria-label="Book a delivery slot" className="space-y-4" noValidate>
      {problem ? <ConflictDetails error={problem} /> : null}
      <SlotChoices needsCrane={order.delivery_method === 'roof'} branchId={order.branch.id} initialDate={order.slot?.date ?? order.requested_date} currentSlotId={order.slot?.slot_id ?? null} />
      {missing ? (
        <p role="alert" className="text-sm font-medium text-brick-700">
          Choose a slot first.
        </p>
      ) : null}
      <Button type="submit" busy={book.isPending}>
        {order.slot ? 'Move to this slot' : 'Book this slot'}
      </Button>
    </form>
  );
}
