import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { updateStockBodySchema } from '../../../../shared/schemas/stock.schema';
import { numberOrText } from './form-values';

/**
 * The stock edit form read into the stock body: only the figures that changed are sent, so a count
 * made at the same time by someone else is not overwritten by an untouched field.
 */
export function stockFormSchema(item: StockItem) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): unknown => {
        const onHand = numberOrText(values.on_hand);
        const reorder = numberOrText(values.reorder_level);
        const body: Record<string, unknown> = {};
        if (onHand !== item.on_hand) body.on_hand = onHand;
        if (reorder !== item.reorder_level) body.reorder_level = reorder;
        if (typeof onHand === 'number' && onHand < item.reserved) {
          ctx.addIssue({ code: 'custom', path: ['on_hand'], message: `must be at least the ${item.reserved.toLocaleString('en-GB')} packs reserved for confirmed orders` });
          return z.NEVER;
        }
        if (Object.keys(body).length === 0) {
          ctx.addIssue({ code: 'custom', path: [], message: 'Nothing has changed: type a new count or reorder level, or cancel.' });
          return z.NEVER;
        }
        return body;
      }),
    ),
    updateStockBodySchema,
  );
}
