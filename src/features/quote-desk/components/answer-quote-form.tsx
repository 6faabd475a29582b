import { useMemo } from 'react';
import type { Quote, QuoteRequest } from '../../../../shared/schemas/order.schema';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { currentCurrency, formatMoney, moneySign } from '../../../lib/format';
import { useAnswerQuote } from '../api/answer-quote';
import { answerField, answerFormSchema, onAnswerForm } from '../lib/answer-form';

const cell = 'block min-h-tap w-24 rounded-md border border-ink-300 bg-white px-2 text-right tabular-nums aria-[invalid=true]:border-brick-600';

function formatQuantity(quantity: number, unit: string) {
  return `${new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2 }).format(quantity)} ${unit}`;
}

/** Pricing a quote request line by line from the branch's own products; a line left without a product is not offered. */
export function AnswerQuoteForm({ request, quote, stock, onDone }: { request: QuoteRequest; quote: Quote; stock: readonly StockItem[]; onDone?: () => void }) {
  const lines = request.lines;
  const schema = useMemo(() => answerFormSchema(lines, currentCurrency()), [lines]);
  const answer = useAnswerQuote(quote.id);
  const toast = useToast();
  const previous = new Map(quote.lines.map((l) => [l.request_line_id, l]));
  const form = useSchemaForm({
    schema,
    onSubmit: async (body) => {
      try {
        await answer.mutateAsync(body);
      } catch (error) {
        throw onAnswerForm(error, body, lines);
      }
      toast.show(`Quote sent to ${request.contractor.name}.`, 'success');
      onDone?.();
    },
  });
  const err = (name: string) => form.fieldError(name);
  return (
    <Form form={form} label="Price the quote">
      <p className="text-sm text-ink-600">Leave packs empty for enough packs to cover the quantity asked, and the price empty for the branch&rsquo;s pack price. Prices are per pack, in {moneySign()}.</p>
      <div className="overflow-x-auto rounded-md border border-mortar-300 bg-white" role="region" aria-label="Prices per line" tabIndex={0}>
        <table className="w-full min-w-[60rem] border-collapse text-left text-sm">
          <caption className="sr-only">Prices per line</caption>
          <thead className="bg-mortar-100">
            <tr>
              <th scope="col" className="px-3 py-2">
                Asked for
              </th>
              <th scope="col" className="px-3 py-2 text-right">
                Quantity
              </th>
              <th scope="col" className="px-3 py-2">
                Product offered
              </th>
              <th scope="col" className="px-3 py-2">
                Packs
              </th>
              <th scope="col" className="px-3 py-2">
                Pack price ({moneySign()})
              </th>
              <th scope="col" className="px-3 py-2">
                Note
              </th>
            </tr>
          </thead>
          <tbody>
            {lines.map((line, i) => {
              const fields = (['product', 'packs', 'price', 'note'] as const).map((n) => answerField(i, n));
              const problems = fields.map(err).filter(Boolean);
              const before = previous.get(line.id);
              const choices = stock.filter((s) => s.category === line.category);
              return (
                <tr key={line.id} className="border-t border-mortar-200 align-top">
                  <td className="px-3 py-2">
                    <span className="font-medium">{line.description}</span>
                    {problems.map((p) => (
                      <span key={p} className="block text-sm font-medium text-brick-700">
                        {p}
                      </span>
                    ))}
                  </td>
                  <td className="px-3 py-2 text-right whitespace-nowrap tabular-nums">{formatQuantity(line.quantity, line.unit)}</td>
                  <td className="px-3 py-2">
                    <select
                      {...form.register(fields[0])}
                      aria-label={`Product for ${line.description}`}
                      defaultValue={before?.product_id ? String(before.product_id) : ''}
                      aria-invalid={err(fields[0]) ? true : undefined}
                      className="block min-h-tap max-w-72 rounded-md border border-ink-300 bg-white px-2 aria-[invalid=true]:border-brick-600"
                    >
                      <option value="">Not offered</option>
                      {choices.map((s) => (
                        <option key={s.product_id} value={s.product_id}>
                          {s.sku} · {s.name} ({s.pack_size} a pack, {formatMoney(s.pack_price)})
                        </option>
                      ))}
                    </select>
                  </td>
                  <td className="px-3 py-2">
                    <input
                      {...form.register(fields[1])}
                      aria-label={`Packs of ${line.description}`}
                      inputMode="numeric"
                      defaultValue={before ? before.packs : ''}
                      aria-invalid={err(fields[1]) ? true : undefined}
                      className={cell}
                    />
                  </td>
                  <td className="px-3 py-2">
                    <input
                      {...form.register(fields[2])}
                      aria-label={`Pack price of ${line.description}`}
                      inputMode="decimal"
                      defaultValue={before ? (before.unit_price / 100).toFixed(2) : ''}
                      aria-invalid={err(fields[2]) ? true : undefined}
                      className={cell}
                    />
                  </td>
                  <td className="px-3 py-2">
                    <input
                      {...form.register(fields[3])}
                      aria-label={`Note on ${line.description}`}
                      maxLength={500}
                      defaultValue={before?.note ?? ''}
                      className="block min-h-tap w-48 rounded-md border border-ink-300 bg-white px-2"
                    />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <TextField name="valid_until" type="date" label="Prices hold until (optional)" defaultValue={quote.valid_until ?? ''} />
      <TextField name="message" label="Message to the contractor" maxLength={2000} defaultValue={quote.message} />
      <SubmitButton>{quote.status === 'answered' ? 'Send the new prices' : 'Send the quote'}</SubmitButton>
    </Form>
  );
}
