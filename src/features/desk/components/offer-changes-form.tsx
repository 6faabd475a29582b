import { useMemo, useState } from 'react';
import type { ChangeEvent } from 'react';
import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import type { SchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { formatCount, formatMoney } from '../../../lib/format';
import { useOfferChanges } from '../api/offer-changes';
import { confirmableLines, openPacks } from '../lib/confirm-form';
import { offerField, offerFormSchema } from '../lib/offer-form';
import { SubstituteFigures } from '../../../components/orders/substitute-figures';
import { useSubstitutes } from '../api/get-substitutes';
import { LinesTable } from './lines-table';

const cell = 'block min-h-tap w-20 rounded-md border border-ink-300 bg-white px-2 text-right tabular-nums aria-[invalid=true]:border-brick-600';

/** Offering changes the contractor must accept: part now, the rest later, or another product instead. */
export function OfferChangesForm({ order, stock, onDone }: { order: OrderDetail; stock: readonly StockItem[]; onDone?: () => void }) {
  const lines = useMemo(() => confirmableLines(order), [order]);
  const offer = useOfferChanges(order.id);
  const toast = useToast();
  const form = useSchemaForm({
    schema: offerFormSchema(lines, order.revision),
    onSubmit: async (body) => {
      await offer.mutateAsync(body);
      toast.show('Changes offered; the contractor is asked to accept them.', 'success');
      onDone?.();
    },
  });
  return (
    <Form form={form} label="Offer changes">
      <LinesTable
        caption="Changes per line"
        minWidthClass="min-w-[56rem]"
        columns={[{ heading: 'Item' }, { heading: 'Open', numeric: true }, { heading: 'Now' }, { heading: 'To follow' }, { heading: 'Offer instead' }, { heading: 'Packs' }]}
      >
        {lines.map((line, i) => (
          <OfferLineRow key={line.id} order={order} line={line} index={i} stock={stock} form={form} />
        ))}
      </LinesTable>
      <TextField name="proposed_date" type="date" label="Another delivery day (optional)" />
      <TextField name="message" label="Message to the contractor" maxLength={2000} />
      <SubmitButton>Send the offer</SubmitButton>
    </Form>
  );
}

type DeskLine = ReturnType<typeof confirmableLines>[number];

/**
 * One line of the offer. Substitutes come from the server with their quantity: for a tile, the
 * engine's count for the order's own roof and the bill before and after, shown under the line; a tile
 * that does not suit every face is listed but cannot be chosen. Other products keep pack arithmetic.
 */
function OfferLineRow({ order, line, index, stock, form }: { order: OrderDetail; line: DeskLine; index: number; stock: readonly StockItem[]; form: SchemaForm }) {
  const [choosing, setChoosing] = useState(false);
  const [chosen, setChosen] = useState('');
  const options = useSubstitutes(order.id, line.id, order.revision, choosing);
  const fields = (['send', 'back', 'sub_product', 'sub_qty'] as const).map((n) => offerField(index, n));
  const problems = fields.map((f) => form.fieldError(f)).filter(Boolean);
  const option = options.data?.options.find((o) => String(o.product_id) === chosen);
  // A different tile cannot be laid beside the ordered one: it replaces the whole line.
  const replacesWhole = Boolean(option?.figures);
  // A newly chosen substitute starts its packs from the server's quantity, and one that replaces the
  // whole line sends none of the ordered product now.
  const choose = (value: string) => {
    const next = options.data?.options.find((o) => String(o.product_id) === value);
    if (Boolean(next?.figures) !== replacesWhole) form.methods.setValue(fields[0], next?.figures ? '0' : String(openPacks(line)));
    form.methods.setValue(fields[3], next ? String(next.quantity) : '');
    setChosen(value);
  };
  const free = new Map(stock.map((s) => [s.product_id, s.available]));
  return (
    <>
      <tr className="border-t border-mortar-200 align-top">
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
          <input {...form.register(fields[0])} aria-label={`Packs now of ${line.sku}`} inputMode="numeric" defaultValue={openPacks(line)} aria-invalid={form.fieldError(fields[0]) ? true : undefined} className={cell} />
        </td>
        <td className="px-3 py-2">
          <input {...form.register(fields[1])} aria-label={`Packs to follow of ${line.sku}`} inputMode="numeric" defaultValue={0} aria-invalid={form.fieldError(fields[1]) ? true : undefined} className={cell} />
        </td>
        <td className="px-3 py-2">
          {!choosing ? (
            <button type="button" className="min-h-tap text-left text-clay-700 underline underline-offset-2" onClick={() => setChoosing(true)}>
              Find a substitute for {line.sku}
            </button>
          ) : options.isPending ? (
            <span className="text-sm text-ink-600" role="status">
              Working out substitutes…
            </span>
          ) : options.isError ? (
            <span className="text-sm text-brick-700">The substitutes could not be worked out; try again.</span>
          ) : (
            <select
              {...form.register(fields[2], { onChange: (event: ChangeEvent<HTMLSelectElement>) => choose(event.target.value) })}
              aria-label={`Substitute for ${line.sku}`}
              value={chosen}
              className="block min-h-tap max-w-72 rounded-md border border-ink-300 bg-white px-2"
            >
              <option value="">No substitute</option>
              {options.data.options.map((o) => (
                <option key={o.product_id} value={o.product_id} disabled={!o.suitable}>
                  {o.sku} · {o.name} ({formatCount(free.get(o.product_id) ?? o.available)} free, {formatMoney(o.pack_price)}){o.suitable ? '' : ` — ${o.reason ?? 'not for this roof'}`}
                </option>
              ))}
            </select>
          )}
        </td>
        <td className="px-3 py-2">
          <input
            {...form.register(fields[3])}
            aria-label={`Packs of the substitute for ${line.sku}`}
            inputMode="numeric"
            defaultValue=""
            readOnly={replacesWhole}
            aria-invalid={form.fieldError(fields[3]) ? true : undefined}
            className={cell}
          />
        </td>
      </tr>
      {option?.figures ? (
        <tr>
          <td colSpan={6} className="px-3 pb-3">
            <p className="mb-2 text-sm">
              {option.sku} replaces the whole line: the engine counts {formatCount(option.quantity)} packs for this roof, and the items below change with it.
            </p>
            <SubstituteFigures figures={option.figures} caption={`${line.sku} and ${option.sku} side by side`} />
          </td>
        </tr>
      ) : null}
    </>
  );
}
