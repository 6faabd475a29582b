import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { branchPriceBodySchema } from '../../../../shared/schemas/price-list.schema';

/** Pounds and pence as typed ("12.8", "12.80", "£1,250") into whole pence; null when it is not money. */
export function poundsToPence(text: string): number | null {
  const t = text.trim().replace(/^£/, '').replace(/,/g, '');
  if (!/^\d+(\.\d{1,2})?$/.test(t)) return null;
  const [whole, fraction = ''] = t.split('.');
  return Number(whole) * 100 + Number(fraction.padEnd(2, '0'));
}

/** The price form read into the branch price body: one pack, typed in pounds, sent in pence. */
export const priceFormSchema = z.pipe(
  z.pipe(
    z.record(z.string(), z.string()),
    transformWithIssues((values, ctx): unknown => {
      const pence = poundsToPence(values.pack_price ?? '');
      if (pence === null) {
        ctx.addIssue({ code: 'custom', path: ['pack_price'], message: 'give the pack price in pounds and pence, e.g. 12.80' });
        return z.NEVER;
      }
      return { pack_price: pence };
    }),
  ),
  branchPriceBodySchema,
);

/** Pence as the text the price field starts with: 1280 → "12.80". */
export const penceText = (pence: number) => (pence / 100).toFixed(2);
