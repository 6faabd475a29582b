import { useMemo, useState } from 'react';
import type { ChangeEvent } from 'react';
import { formatCount } from '../../../lib/format';
import type { OrderDetail } from '../../../../shared/schemas/order.schema';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { FieldMessage, Form, SubmitButton } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { useConfirmOrder } from '../api/confirm-order';
import { confirmFormSchema, confirmableLines, openPacks, sendField, suggestedSend } from '../lib/confirm-form';
import { ConflictDetails, isDeskConflict } from './conflict-details';
import { SlotChoices } from './slot-choices';
import { LinesTable } from './lines-table';

interface ConfirmOrderFormProps {
  order: OrderDetail;
  /** The branch's stock by product id; lines start from what is free when that is less than asked. */
  stock: ReadonlyMap<number, StockItem>;
}

/**
 * Confirming all or part of an order: packs to send now per line (the rest is back-ordered), held
 * from the branch's stock in one step, and optionally a slot booked at the same time.
 */
export function ConfirmOrderForm({ order, stock }: ConfirmOrderFormProps) {
  const lines = useMemo(() => confirmableLines(order), [order]);
  const confirm = useConfirmOrder(order.id);
  const toast = useToast();
  const [conflict, setConflict] = useState<unknown>(null);
  const [sends, setSends] = useState<Record<number, string>>(() => Object.fromEntries(lines.map((l) => [l.id, String(suggestedSend(l, stock.get(l.product_id)?.available))])));
  const form = useSchemaForm({
    schema: confirmFormSchema(lines),
    onSubmit: async (body) => {
      setConflict(null);
      try {
        const confirmed = await confirm.mutateAsync(body);
        toast.show(`${confirmed.reference} is confirmed${confirmed.slot ? ` for ${confirmed.slot.date}, ${confirmed.slot.time_window}` : ''}.`, 'success');
      } catch (error) {
        if (isDeskConflict(error)) {
          setConflict(error);
          return;
        }
        throw error;
      }
    },
  });
  const descriptions = useMemo(() => new Map(order.lines.map((l) => [l.sku, l.description])), [order.lines]);
  return (
    <Form form={form} label="Confirm the order">
      {conflict ? <ConflictDetails error={conflict} descriptions={descriptions} /> : null}
      <LinesTable
        caption="Packs to send now per line"
        minWidthClass="min-w-[44rem]"
        columns={[{ heading: 'Item' }, { heading: 'Open', numeric: true }, { heading: 'Free at branch', numeric: true }, { heading: 'Send now' }, { heading: 'Back-order', numeric: true }]}
      >
        {lines.map((line, i) => {
          const item = stock.get(line.product_id);
          const open = openPacks(line);
          const typed = sends[line.id] ?? '';
          const send = /^\d+$/.test(typed.trim()) ? Number(typed) : null;
          const error = form.fieldError(sendField(i));
          const inputId = `${form.id}-send-${line.id}`;
          const short = item !== undefined && item.available < open;
          return (
            <tr key={line.id} className="border-t border-mortar-200 align-top">
              <td className="px-3 py-2">
                <label htmlFor={inputId} className="font-medium">
                  {line.description}
                </label>
                <span className="block font-mono text-xs text-ink-600">{line.sku}</span>
              </td>
              <td className="px-3 py-2 text-right tabular-nums">{formatCount(open)}</td>
              <td className={`px-3 py-2 text-right tabular-nums ${short ? 'font-semibold text-brick-700' : ''}`}>{item ? formatCount(item.available) : '—'}</td>
              <td className="px-3 py-2">
                <input
                  id={inputId}
                  inputMode="numeric"
                  {...form.register(sendField(i), {
                    onChange: (event: ChangeEvent<HTMLInputElement>) => {
                      const value = event.target.value;
                      setSends((s) => ({ ...s, [line.id]: value }));
                    },
                  })}
                  value={typed}
                  aria-invalid={error ? true : undefined}
                  aria-describedby={error ? `${inputId}-error` : undefined}
                  className={`block min-h-tap w-24 rounded-md border bg-white px-2 text-right tabular-nums ${error ? 'border-brick-600' : 'border-ink-300'}`}
                />
                {error ? <FieldMessage id={`${inputId}-error`}>{error}</FieldMessage> : null}
              </td>
              <td className="px-3 py-2 text-right tabular-nums" data-testid={`back-order-${line.id}`}>
                {send === null || send > open ? '—' : open - send}
              </td>
            </tr>
          );
        })}
      </LinesTable>
      <SlotChoices needsCrane={order.delivery_method === 'roof'} branchId={order.branch.id} initialDate={order.requested_date} allowNone />
      <SubmitButton>Confirm and reserve the stock</SubmitButton>
    </Form>
  );
}
