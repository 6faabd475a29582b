import { declineQuoteBodySchema } from '../../../../shared/schemas/order.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { useDeclineQuote } from '../api/decline-quote';

/** Saying the branch cannot quote, so the contractor is not left waiting. */
export function DeclineQuoteForm({ quoteId, onDone }: { quoteId: number; onDone?: () => void }) {
  const decline = useDeclineQuote(quoteId);
  const toast = useToast();
  const form = useSchemaForm({
    schema: declineQuoteBodySchema,
    onSubmit: async ({ message }) => {
      await decline.mutateAsync(message || undefined);
      toast.show('The contractor is told the branch cannot quote.', 'success');
      onDone?.();
    },
  });
  return (
    <Form form={form} label="Decline the quote request">
      <TextField name="message" label="Why (optional, the contractor sees this)" maxLength={2000} />
      <SubmitButton>Decline the request</SubmitButton>
    </Form>
  );
}
