import { useMemo } from 'react';
import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/form';
import { useZodForm } from '../../../components/form/use-zod-form';
import { useToast } from '../../../components/ui/toast';
import { formatCount, formatMoney } from '../../../lib/format';
import { useOfferChanges } from '../api/offer-changes';
import { confirmableLines, openPacks } from '../lib/confirm-form';
import { offerField, offerFormSchema } from '../lib/offer-form';

const cell = 'block min-h-tap w-20 rounded-md border border-ink-300 bg-white px-2 text-right tabular-nums aria-[invalid=true]:border-brick-600';

/** Offering changes the contractor must accept: part now, the rest later, or another product instead. */
export function OfferChangesForm({ order, stock, onDone }: { order: OrderDetail; stock: readonly StockItem[]; onDone?: () => void }) {
  const lines = useMemo(() => confirmableLines(order), [order]);
  const offer = useOfferChanges(order.id);
  const toast = useToast();
  const form = useZodForm({
    schema: offerFormSchema(lines, order.revision),
    onSubmit: async (body) => {
      await offer.mutateAsync(body);
      toast.show('Changes offered; the contractor is asked to accept them.', 'success');
      onDone?.();
    },
  });
  const err = (name: string) => form.fieldErrors[name];
  return (
    <Form form={form} label="Offer changes">
      <div className="overflow-x-auto rounded-md border border-mortar-300 bg-white" role="region" aria-label="Changes per line" tabIndex={0}>
        <table className="w-full min-w-[56rem] border-collapse text-left text-sm">
          <caption className="sr-only">Changes per line</caption>
          <thead className="bg-mortar-100">
            <tr>
              <th scope="col" className="px-3 py-2">Item</th>
              <th scope="col" className="px-3 py-2 text-right">Open</th>
              <th scope="col" className="px-3 py-2">Now</th>
              <th scope="col" className="px-3 py-2">To follow</th>
              <th scope="col" className="px-3 py-2">Offer instead</th>
              <th scope="col" className="px-3 py-2">Packs</th>
            </tr>
          </thead>
          <tbody>
            {lines.map((line, i) => {
              const fields = (['send', 'back', 'sub_product', 'sub_qty'] as const).map((n) => offerField(i, n));
              const problems = fields.map(err).filter(Boolean);
              return (
                <tr key={line.id} className="border-t border-mortar-200 align-top">
                  <td className="px-3 py-2">
                    <span className="font-medium">{line.description}</span>
                    <span className="block font-mono text-xs text-ink-600">{line.sku}</span>
                    {problems.map((p) => (
                      <span key={p} className="block text-sm font-medium text-brick-700">
                        {p}
                      </span>
                    ))}
                  </td>
                  <td className="px-3 py-2 text-right tabular-nums">{formatCount(openPacks(line))}</td>
                  <td className="px-3 py-2">
                    <input name={fields[0]} aria-label={`Packs now of ${line.sku}`} inputMode="numeric" defaultValue={openPacks(line)} aria-invalid={err(fields[0]) ? true : undefined} className={cell} />
                  </td>
                  <td className="px-3 py-2">
                    <input name={fields[1]} aria-label={`Packs to follow of ${line.sku}`} inputMode="numeric" defaultValue={0} aria-invalid={err(fields[1]) ? true : undefined} className={cell} />
                  </td>
                  <td className="px-3 py-2">
                    <select name={fields[2]} aria-label={`Substitute for ${line.sku}`} defaultValue="" className="block min-h-tap max-w-64 rounded-md border border-ink-300 bg-white px-2">
                      <option value="">No substitute</option>
                      {stock
                        .filter((s) => s.category === line.category && s.product_id !== line.product_id)
                        .map((s) => (
                          <option key={s.product_id} value={s.product_id}>
                            {s.sku} · {s.name} ({formatCount(s.available)} free, {formatMoney(s.pack_price)})
                          </option>
                        ))}
                    </select>
                  </td>
                  <td className="px-3 py-2">
                    <input name={fields[3]} aria-label={`Packs of the substitute for ${line.sku}`} inputMode="numeric" aria-invalid={err(fields[3]) ? true : undefined} className={cell} />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <TextField name="proposed_date" type="date" label="Another delivery day (optional)" />
      <TextField name="message" label="Message to the contractor" maxLength={2000} />
      <SubmitButton>Send the offer</SubmitButton>
    </Form>
  );
}
