import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { confirmOrderBodySchema } from '../../../../shared/schemas/order.schema';
import type { ConfirmOrderBody, OrderDetail } from '../../../../shared/schemas/order.schema';

type DeskLine = OrderDetail['lines'][number];

export const sendField = (i: number) => `lines.${i}.quantity`;

/** Packs still open on a line: the agreed packs after accepted changes, else the packs asked for. */
export function openPacks(line: Pick<DeskLine, 'confirmed_quantity' | 'quantity'>): number {
  return line.confirmed_quantity ?? line.quantity;
}

/** Packs to send now, to start from: all that is open, or what the branch has free when that is less. */
export function suggestedSend(line: Pick<DeskLine, 'confirmed_quantity' | 'quantity'>, available: number | undefined): number {
  const open = openPacks(line);
  return available === undefined ? open : Math.max(0, Math.min(open, available));
}

/** Lines the desk answers: a replaced line has nothing left to send. */
export function confirmableLines(order: Pick<OrderDetail, 'lines'>): DeskLine[] {
  return order.lines.filter((line) => line.status !== 'replaced' && line.status !== 'not_available');
}

/**
 * The confirm form read into the API body: each line's packs to send now (whole packs, at most what
 * is open; the rest is back-ordered) and the slot chosen, if any. Fields are named by the line's
 * place in the body, so the server's `lines.<i>.quantity` errors land on the same input.
 */
export function confirmFormSchema(lines: readonly Pick<DeskLine, 'id' | 'quantity' | 'confirmed_quantity'>[]) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): ConfirmOrderBody => {
        const body = lines.map((line, i) => {
          const text = (values[sendField(i)] ?? '').trim();
          const open = openPacks(line);
          if (!/^\d+$/.test(text)) {
            ctx.addIssue({ code: 'custom', path: [sendField(i)], message: 'give a whole number of packs (0 to back-order it all)' });
            return { line_id: line.id, quantity: 0 };
          }
          const quantity = Number(text);
          if (quantity > open) ctx.addIssue({ code: 'custom', path: [sendField(i)], message: `at most the ${open} packs open on this line` });
          return { line_id: line.id, quantity };
        });
        const slot = (values.slot_id ?? '').trim();
        return slot ? { lines: body, slot_id: Number(slot) } : { lines: body };
      }),
    ),
    confirmOrderBodySchema,
  );
}
