import { turnDownBodySchema } from '../../../../shared/schemas/order.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { useTurnDownOrder } from '../api/turn-down-order';

/** Turning an order down needs a reason, so the contractor can order elsewhere. */
export function TurnDownForm({ orderId, reference }: { orderId: number; reference: string }) {
  const turnDown = useTurnDownOrder(orderId);
  const toast = useToast();
  const form = useSchemaForm({
    schema: turnDownBodySchema,
    onSubmit: async ({ reason }) => {
      await turnDown.mutateAsync(reason);
      toast.show(`${reference} is turned down.`, 'success');
    },
  });
  return (
    <Form form={form} label="Turn the order down">
      <TextField name="reason" label="Why (the contractor sees this)" maxLength={500} />
      <SubmitButton>Turn down {reference}</SubmitButton>
    </Form>
  );
}
