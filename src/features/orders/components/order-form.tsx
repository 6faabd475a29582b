import { lazy, Suspense, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { DELIVERY_METHODS, DELIVERY_METHOD_LABELS } from '../../../../shared/schemas/order.schema';
import type { Order } from '../../../../shared/schemas/order.schema';
import { Form, RadioGroupField, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Alert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useAmendOrder } from '../api/amend-order';
import type { AmendOrderValues } from '../api/amend-order';
import { usePlaceOrder } from '../api/place-order';
import type { PlaceOrderValues } from '../api/place-order';
import { formatMoney } from '../../../lib/format';
import { lineField, orderFormSchema, todayIso } from '../lib/order-form';
import type { OrderFormTarget, OrderLineOption } from '../lib/order-form';

// The lines table (and the table library under it) is asked for as this module loads, so it arrives while
// the page's data does; the delivery card above it shows without it (DEVELOPERS.md, decision 37).
const linesTable = import('./order-lines-table');
const OrderLinesTable = lazy(() => linesTable.then((m) => ({ default: m.OrderLinesTable })));

export interface OrderSiteAccess {
  name: string;
  crane_lift: 'allowed' | 'not_allowed' | 'unknown';
  overhead_lines: 'none' | 'present' | 'unknown';
  set_down_place: string;
  access_notes: string;
  vehicle_access: string;
}

interface OrderFormProps {
  target: OrderFormTarget;
  branchName: string;
  lines: readonly OrderLineOption[];
  site: OrderSiteAccess;
  /** Starting values when amending. */
  current?: Pick<Order, 'requested_date' | 'time_window' | 'delivery_method' | 'notes' | 'po_reference'>;
  onDone: (order: Order) => void;
}

function splitWindow(window: string | null | undefined): [string, string] {
  if (!window) return ['', ''];
  const [from, to] = window.split('-');
  return [from ?? '', to ?? ''];
}

/**
 * Placing an order with one merchant branch, or amending one until the merchant confirms: the day
 * and window, how it is unloaded, notes and PO reference, and the lines with their packs.
 */
export function OrderForm({ target, branchName, lines, site, current, onDone }: OrderFormProps) {
  const place = usePlaceOrder();
  // Hooks run whatever the mode; only the one that matches the target is used.
  const amend = useAmendOrder(target.mode === 'amend' ? target.order_id : 0);
  const schema = useMemo(() => orderFormSchema(target, lines, site), [target, lines, site]);
  // The server names a line by its place among the lines sent; the form by its place on the form.
  const sent = useRef<readonly { product_id: number }[]>([]);
  const form = useSchemaForm({
    schema,
    serverPath: (path) => {
      const match = /^lines\.(\d+)\.(\w+)$/.exec(path);
      if (!match) return path;
      const at = lines.findIndex((option) => option.product_id === sent.current[Number(match[1])]?.product_id);
      return at < 0 ? path : lineField(at, match[2] === 'product_id' ? 'include' : 'quantity');
    },
    onSubmit: async (body) => {
      sent.current = body.lines ?? [];
      const order = target.mode === 'place' ? await place.mutateAsync(body as PlaceOrderValues) : await amend.mutateAsync(body as AmendOrderValues);
      onDone(order);
    },
  });
  const wrapper = useRef<HTMLDivElement>(null);
  const [packs, setPacks] = useState<Record<number, number | null>>({});
  const [method, setMethod] = useState(current?.delivery_method ?? 'ground');
  const readLines = useCallback(() => {
    const formElement = wrapper.current?.closest('form');
    if (!formElement) return;
    const data = new FormData(formElement);
    const next: Record<number, number | null> = {};
    lines.forEach((_, i) => {
      const raw = String(data.get(lineField(i, 'quantity')) ?? '');
      next[i] = data.get(lineField(i, 'include')) === 'on' && /^\d+$/.test(raw) ? Number(raw) : null;
    });
    setPacks(next);
    setMethod(String(data.get('delivery_method') ?? 'ground') as typeof method);
  }, [lines]);
  useEffect(readLines, [readLines]);

  const subtotal = lines.reduce((sum, option, i) => sum + (packs[i] && option.unit_price !== null ? packs[i]! * option.unit_price : 0), 0);
  // A new order starts with no window: a window nobody chose would go out as if the contractor asked for it.
  const [from, to] = splitWindow(current?.time_window);

  return (
    <Form form={form} label={target.mode === 'place' ? `Order from ${branchName}` : 'Amend the order'} className="space-y-6">
      <div ref={wrapper} onChange={readLines} onInput={readLines} className="space-y-6">
        <Card title="Delivery">
          <div className="space-y-4">
            <div className="grid gap-4 sm:grid-cols-3">
              <TextField name="requested_date" label="Day wanted" type="date" min={todayIso()} defaultValue={current?.requested_date} />
              <TextField name="time_window" label="Window from" type="time" defaultValue={from} />
              <TextField name="time_window_to" label="Window to" type="time" defaultValue={to} />
            </div>
            <p className="-mt-2 text-sm text-ink-600">Leave both window times blank for any time in the working day.</p>
            <RadioGroupField
              name="delivery_method"
              legend="How it comes off the lorry"
              defaultValue={current?.delivery_method ?? 'ground'}
              options={DELIVERY_METHODS.map((value) => ({
                value,
                label: DELIVERY_METHOD_LABELS[value],
                description: value === 'roof' ? 'Pallets lifted onto the scaffold or roof by the lorry crane' : 'Pallets left at the set-down place',
              }))}
            />
            {method === 'roof' ? (
              site.crane_lift === 'not_allowed' ? (
                <Alert tone="danger" title="This site says no crane lift" live={false}>
                  Choose ground set-down, or change the site&rsquo;s access details if that has changed.
                </Alert>
              ) : (
                <Alert tone="caution" title="A crane lift needs a lift plan" live={false}>
                  A competent person plans the lift: where the lorry stands, the exclusion zone below the load, and where the pallets land. Land them only where the scaffold or roof structure is made to take them, spread
                  over both slopes.
                  {site.overhead_lines !== 'none' ? ` Overhead lines are ${site.overhead_lines === 'present' ? 'recorded near the site' : 'not yet checked'}: the crane keeps its clearance.` : ''}
                </Alert>
              )
            ) : null}
            <div className="grid gap-4 sm:grid-cols-2">
              <TextField name="po_reference" label="Your PO reference" autoComplete="off" defaultValue={current?.po_reference} />
              <TextField name="notes" label="Notes for this delivery" autoComplete="off" defaultValue={current?.notes} hint="The site’s access notes go with the order already." />
            </div>
            <div className="rounded-md bg-mortar-50 px-3 py-2 text-sm">
              <p className="font-semibold">Site access, as the merchant will see it</p>
              <p>
                {site.set_down_place ? `Set down: ${site.set_down_place}. ` : ''}
                {site.access_notes || 'No access notes on the site.'}
              </p>
            </div>
          </div>
        </Card>

        <Card title="Lines">
          <p className="mb-3 text-sm text-ink-700">Whole packs, as {branchName} sells them. Untick a line to leave it off, or change the packs.</p>
          <Suspense fallback={<SkeletonBlock label="Loading the lines" lines={Math.min(lines.length, 6)} />}>
            <OrderLinesTable form={form} lines={lines} packs={packs} onShown={readLines} />
          </Suspense>
          <p className="mt-3 text-right text-lg">
            Subtotal at today&rsquo;s prices:{' '}
            <span className="font-bold tabular-nums" data-testid="order-subtotal">
              {formatMoney(subtotal)}
            </span>
          </p>
        </Card>
      </div>
      <SubmitButton size="lg">{target.mode === 'place' ? `Send the order to ${branchName}` : 'Send the changes'}</SubmitButton>
    </Form>
  );
}
