import * as z from 'zod/mini';
import { readMoneyEntry } from '../../../../shared/domain/money-entry';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { branchPriceBodySchema } from '../../../../shared/schemas/price-list.schema';

/** The price form read into the branch price body: one pack, typed in the configured currency, sent in its minor units. */
export function priceFormSchema(currency: string) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): unknown => {
        const price = readMoneyEntry(values.pack_price ?? '', currency, 'the pack price');
        if (!price.ok) {
          ctx.addIssue({ code: 'custom', path: ['pack_price'], message: price.message });
          return z.NEVER;
        }
        return { pack_price: price.minor };
      }),
    ),
    branchPriceBodySchema,
  );
}
