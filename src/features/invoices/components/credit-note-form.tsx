import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { CREDIT_REASONS, CREDIT_REASON_LABELS, creditNoteBodySchema } from '../../../../shared/schemas/invoice.schema';
import type { CreditNoteBody, Invoice } from '../../../../shared/schemas/invoice.schema';
import { Form, SelectField, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { useCreateCreditNote } from '../api/create-credit-note';

const creditField = (i: number) => `lines.${i}.quantity`;

/** Packs to credit per line as typed; blank lines are left out, and the server's `lines.<i>` errors land on the row. */
function creditFormSchema(lines: Invoice['lines']) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): CreditNoteBody => {
        const picked: { invoice_line_id: number; quantity: number }[] = [];
        lines.forEach((line, i) => {
          const text = (values[creditField(i)] ?? '').trim();
          if (!text) return;
          if (!/^\d+$/.test(text)) {
            ctx.addIssue({ code: 'custom', path: [creditField(i)], message: 'give a whole number of packs' });
            return;
          }
          const left = line.quantity - line.credited_quantity;
          if (Number(text) > left) ctx.addIssue({ code: 'custom', path: [creditField(i)], message: `at most the ${left} packs not yet credited` });
          picked.push({ invoice_line_id: line.id, quantity: Number(text) });
        });
        if (picked.length === 0) ctx.addIssue({ code: 'custom', path: [creditField(0)], message: 'credit at least one line' });
        const notes = (values.notes ?? '').trim();
        return { reason: (values.reason ?? '') as CreditNoteBody['reason'], ...(notes ? { notes } : {}), lines: picked };
      }),
    ),
    creditNoteBodySchema,
  );
}

/** A credit note for packs short, damaged or returned; a card payment over what is then owed is refunded. */
export function CreditNoteForm({ invoice }: { invoice: Invoice }) {
  const create = useCreateCreditNote(invoice.id);
  const toast = useToast();
  const form = useSchemaForm({
    schema: creditFormSchema(invoice.lines),
    onSubmit: async (body, { reset }) => {
      await create.mutateAsync(body);
      reset();
      toast.show('Credit note issued.', 'success');
    },
  });
  return (
    <Form form={form} label="Issue a credit note">
      <SelectField name="reason" label="Reason" options={CREDIT_REASONS.map((r) => ({ value: r, label: CREDIT_REASON_LABELS[r] }))} />
      <div className="grid gap-3 sm:grid-cols-2">
        {invoice.lines.map((line, i) => (
          <TextField
            key={line.id}
            name={creditField(i)}
            inputMode="numeric"
            label={`Packs of ${line.sku} to credit`}
            hint={`${line.description}: ${line.quantity - line.credited_quantity} of ${line.quantity} not yet credited`}
          />
        ))}
      </div>
      <TextField name="notes" label="Notes (optional)" maxLength={2000} />
      <SubmitButton>Issue the credit note</SubmitButton>
    </Form>
  );
}
