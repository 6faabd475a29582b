import { z } from 'zod';
import { recordDeliveryBodySchema } from '../../../../shared/schemas/order.schema';
import type { RecordDeliveryBody } from '../../../../shared/schemas/order.schema';
import type { LoadingSheet } from '../../../../shared/schemas/slot.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/form';
import { useZodForm } from '../../../components/form/use-zod-form';
import { useToast } from '../../../components/ui/toast';
import { useRecordDelivery } from '../api/record-delivery';

type Stop = LoadingSheet['runs'][number]['stops'][number];
const deliveredField = (i: number) => `lines.${i}.delivered_quantity`;

/** Packs handed over per line (as sent unless changed), who took them, and notes. */
function deliveryFormSchema(lines: Stop['lines']) {
  return z
    .record(z.string(), z.string())
    .transform((values, ctx): RecordDeliveryBody => {
      const changed: { line_id: number; delivered_quantity: number }[] = [];
      lines.forEach((line, i) => {
        const text = (values[deliveredField(i)] ?? '').trim();
        if (!/^\d+$/.test(text)) {
          ctx.addIssue({ code: 'custom', path: [deliveredField(i)], message: 'give a whole number of packs' });
          return;
        }
        if (Number(text) > line.quantity) ctx.addIssue({ code: 'custom', path: [deliveredField(i)], message: `at most the ${line.quantity} packs on the lorry` });
        changed.push({ line_id: line.line_id, delivered_quantity: Number(text) });
      });
      const notes = (values.notes ?? '').trim();
      return { received_by: (values.received_by ?? '').trim(), lines: changed, ...(notes ? { notes } : {}) };
    })
    .pipe(recordDeliveryBodySchema);
}

export function RecordDeliveryForm({ stop }: { stop: Stop }) {
  const record = useRecordDelivery(stop.order_id);
  const toast = useToast();
  const form = useZodForm({
    schema: deliveryFormSchema(stop.lines),
    onSubmit: async (body) => {
      await record.mutateAsync(body);
      toast.show(`${stop.reference} is recorded as delivered.`, 'success');
    },
  });
  return (
    <Form form={form} label={`Record the delivery of ${stop.reference}`} className="space-y-4 text-lg">
      {stop.lines.map((line, i) => (
        <TextField key={line.line_id} name={deliveredField(i)} inputMode="numeric" defaultValue={String(line.quantity)} label={`${line.description}: packs handed over`} hint={`${line.quantity} on the lorry · ${line.sku}`} className="[&_input]:min-h-tap-lg [&_input]:text-xl" />
      ))}
      <TextField name="received_by" label="Taken by (name)" autoComplete="name" className="[&_input]:min-h-tap-lg [&_input]:text-xl" />
      <TextField name="notes" label="Notes (damage, shortage, where it was left)" className="[&_input]:min-h-tap-lg [&_input]:text-xl" />
      <SubmitButton size="lg" className="w-full">
        Delivered
      </SubmitButton>
    </Form>
  );
}
