import { useEffect, useRef } from 'react';
import { answerProposalBodySchema, cancelOrderBodySchema } from '../../../../shared/schemas/order.schema';
import type { Order, Proposal } from '../../../../shared/schemas/order.schema';
import { Form, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { useAnswerProposal } from '../api/answer-proposal';
import type { ProposalAnswer } from '../api/answer-proposal';
import { useCancelOrder } from '../api/cancel-order';

// The order page's two forms, loaded with the form library when they show rather than with the page.

/** The contractor's answer to offered changes: a note (optional), then accept or decline, each its own submit button. */
export function ProposalAnswerForm({ order, proposal }: { order: Order; proposal: Proposal }) {
  const answer = useAnswerProposal(order.id);
  const toast = useToast();
  const choice = useRef<ProposalAnswer>('accept');
  const form = useSchemaForm({
    schema: answerProposalBodySchema,
    onSubmit: async (values) => {
      const kind = choice.current;
      await answer.mutateAsync({ proposalId: proposal.id, answer: kind, note: values.note || undefined });
      toast.show(kind === 'accept' ? 'Changes accepted; the merchant can now confirm the order.' : 'Changes declined; the order stands as you sent it.', 'success');
    },
  });
  const pending = form.submitting;
  return (
    <Form form={form} label="Answer the changes" className="space-y-3">
      <TextField name="note" label="A note with your answer (optional)" maxLength={500} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={answer.isPending && answer.variables?.answer === 'accept'} disabled={pending} onClick={() => (choice.current = 'accept')}>
          Accept the changes
        </Button>
        <Button type="submit" variant="secondary" busy={answer.isPending && answer.variables?.answer === 'decline'} disabled={pending} onClick={() => (choice.current = 'decline')}>
          Decline
        </Button>
      </div>
    </Form>
  );
}

/** The "are you sure?" of cancelling, with the reason the merchant sees (optional). */
export function CancelOrderForm({ order, onDone }: { order: Order; onDone: () => void }) {
  const cancel = useCancelOrder(order.id);
  const toast = useToast();
  const form = useSchemaForm({
    schema: cancelOrderBodySchema,
    onSubmit: async (values) => {
      await cancel.mutateAsync(values.reason || undefined);
      onDone();
      toast.show(`${order.reference} is cancelled.`, 'success');
    },
  });
  // The reason box takes focus as the question appears.
  const { setFocus } = form.methods;
  useEffect(() => setFocus('reason'), [setFocus]);
  return (
    <Form form={form} label="Cancel the order?" className="w-full space-y-2 rounded-md border border-brick-600 bg-brick-50 p-3">
      <TextField name="reason" label="Why (the merchant sees this; optional)" maxLength={500} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" busy={form.submitting}>
          Yes, cancel {order.reference}
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Keep the order
        </Button>
      </div>
    </Form>
  );
}
