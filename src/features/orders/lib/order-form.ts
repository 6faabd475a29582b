import { businessCalendar } from '../../../lib/business-calendar';
import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { amendOrderBodySchema, placeOrderBodySchema } from '../../../../shared/schemas/order.schema';
import type { AmendOrderBody, PlaceOrderBody } from '../../../../shared/schemas/order.schema';

/** A line the form offers: a product of the branch, with the packs to start from. */
export interface OrderLineOption {
  product_id: number;
  sku: string | null;
  description: string;
  unit: string;
  pack_size: number;
  /** Packs to start from: the estimate's, or what the order asks for now. */
  packs: number;
  /** One pack, minor units. */
  unit_price: number | null;
  /** What the estimate says is needed, in `unit`, when the line comes from an estimate. */
  needed?: number;
  /** Starts unticked (a line the merchant replaced). */
  excluded?: boolean;
}

export type OrderFormTarget = { mode: 'place'; estimate_id: number; branch_id: number } | { mode: 'amend'; order_id: number; revision: number };

export const lineField = (i: number, name: 'quantity' | 'include') => `lines.${i}.${name}`;

type Ctx = z.core.$RefinementCtx<unknown>;

function readWindow(values: Record<string, string>, ctx: Ctx): string | null {
  const from = (values.time_window ?? '').trim();
  const to = (values.time_window_to ?? '').trim();
  if (!from && !to) return null;
  if (!from || !to) {
    ctx.addIssue({ code: 'custom', path: ['time_window'], message: 'give the start and the end of the window, or neither' });
    return null;
  }
  return `${from}-${to}`;
}

/** Whole packs as typed: a number the schema can judge, or the text for it to refuse. */
function packsOf(text: string | undefined): number | string {
  const t = (text ?? '').trim();
  return /^\d+$/.test(t) ? Number(t) : t === '' ? Number.NaN : t;
}

/**
 * The order form read into the API body and checked with the shared order schema. Lines are named
 * by their place on the form, so an unticked line never shifts another line's error onto it.
 */
export function orderFormSchema(target: OrderFormTarget, options: readonly OrderLineOption[], site: { crane_lift: string }) {
  return z.pipe(
    z.record(z.string(), z.string()),
    transformWithIssues((values, ctx): PlaceOrderBody | AmendOrderBody => {
      const included = options.map((option, i) => ({ option, i })).filter(({ i }) => values[lineField(i, 'include')] === 'on');
      const lines = included.map(({ option, i }) => ({ product_id: option.product_id, quantity: packsOf(values[lineField(i, 'quantity')]) }));
      const time_window = readWindow(values, ctx);
      const delivery_method = values.delivery_method;
      if (delivery_method === 'roof' && site.crane_lift === 'not_allowed') {
        ctx.addIssue({ code: 'custom', path: ['delivery_method'], message: 'the site says no crane lift: choose ground set-down, or change the site’s access first' });
      }
      const common = {
        requested_date: values.requested_date ?? '',
        time_window,
        delivery_method,
        notes: values.notes ?? '',
        po_reference: values.po_reference ?? '',
        lines,
      };
      const body = target.mode === 'place' ? { estimate_id: target.estimate_id, branch_id: target.branch_id, ...common } : { revision: target.revision, ...common };
      const checked = (target.mode === 'place' ? placeOrderBodySchema : amendOrderBodySchema).safeParse(body);
      if (!checked.success) {
        for (const issue of checked.error.issues) {
          const [head, index, field] = issue.path;
          if (head === 'lines' && typeof index === 'number') {
            const at = included[index]?.i ?? index;
            ctx.addIssue({ code: 'custom', path: [lineField(at, field === 'product_id' ? 'include' : 'quantity')], message: issue.message });
          } else {
            ctx.addIssue({ code: 'custom', path: [issue.path.map(String).join('.') || 'lines'], message: issue.message });
          }
        }
        return z.NEVER;
      }
      return checked.data as PlaceOrderBody | AmendOrderBody;
    }),
  );
}

/** Today as YYYY-MM-DD in the firm's calendar: the earliest day a delivery can be asked for. */
export function todayIso(): string {
  return businessCalendar().today();
}
