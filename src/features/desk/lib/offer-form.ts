import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { proposalBodySchema } from '../../../../shared/schemas/order.schema';
import type { OrderDetail, ProposalBody } from '../../../../shared/schemas/order.schema';
import { openPacks } from './confirm-form';

type DeskLine = OrderDetail['lines'][number];

export const offerField = (i: number, name: 'send' | 'back' | 'sub_product' | 'sub_qty' | 'note') => `offer.${i}.${name}`;

function wholeOr(text: string | undefined, fallback: number): number | null {
  const t = (text ?? '').trim();
  if (t === '') return fallback;
  return /^\d+$/.test(t) ? Number(t) : null;
}

/**
 * The desk's offer read into the proposal body: per line the packs it can send now, the packs to
 * follow and a product offered instead; only lines that change are sent. The contractor must accept
 * the offer before the order can be confirmed.
 */
export function offerFormSchema(lines: readonly Pick<DeskLine, 'id' | 'quantity' | 'confirmed_quantity'>[], revision: number) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): ProposalBody => {
        const changes: NonNullable<ProposalBody['lines']> = [];
        lines.forEach((line, i) => {
          const open = openPacks(line);
          const send = wholeOr(values[offerField(i, 'send')], open);
          const back = wholeOr(values[offerField(i, 'back')], 0);
          if (send === null) ctx.addIssue({ code: 'custom', path: [offerField(i, 'send')], message: 'give a whole number of packs' });
          if (back === null) ctx.addIssue({ code: 'custom', path: [offerField(i, 'back')], message: 'give a whole number of packs' });
          if (send === null || back === null) return;
          if (send + back > open) ctx.addIssue({ code: 'custom', path: [offerField(i, 'back')], message: `now and to follow come to ${send + back}, more than the ${open} packs open` });
          const subProduct = (values[offerField(i, 'sub_product')] ?? '').trim();
          let substitute: { product_id: number; quantity: number } | undefined;
          if (subProduct) {
            const qty = wholeOr(values[offerField(i, 'sub_qty')], 0);
            if (!qty) ctx.addIssue({ code: 'custom', path: [offerField(i, 'sub_qty')], message: 'give the packs of the substitute (at least 1)' });
            else substitute = { product_id: Number(subProduct), quantity: qty };
          }
          const note = (values[offerField(i, 'note')] ?? '').trim();
          if (send === open && back === 0 && !substitute && !note) return;
          changes.push({ line_id: line.id, confirmed_quantity: send, back_order_quantity: back, ...(substitute ? { substitute } : {}), ...(note ? { note } : {}) });
        });
        const message = (values.message ?? '').trim();
        const date = (values.proposed_date ?? '').trim();
        return {
          revision,
          ...(changes.length ? { lines: changes } : {}),
          ...(message ? { message } : {}),
          ...(date ? { proposed_date: date } : {}),
        };
      }),
    ),
    proposalBodySchema,
  );
}
