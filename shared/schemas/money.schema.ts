import './zod-messages';
import * as z from 'zod/mini';

/**
 * The money of one priced line, in integer minor units of the configured currency: packs at a pack
 * price, its tax rate in basis points (2000 = 20 %), and net + tax = total with the tax rounded to the
 * minor unit per line. Invoice lines, credit-note lines and credit-note drafts all carry it.
 */
export const pricedLineShape = {
  quantity: z.number().check(z.int()),
  unit_price: z.number().check(z.int()),
  tax_rate_bp: z.number().check(z.int()),
  net: z.number().check(z.int()),
  tax: z.number().check(z.int()),
  total: z.number().check(z.int()),
};

/** A document's sums in minor units: before tax, the tax, and with tax. */
export const documentTotalsShape = {
  subtotal: z.number().check(z.int()),
  tax_total: z.number().check(z.int()),
  total: z.number().check(z.int()),
};
