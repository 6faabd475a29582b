import './zod-messages';
import * as z from 'zod/mini';
import { PAYMENT_STATUSES, paymentSchema } from './invoice.schema';

/**
 * Card payments: the server opens a hosted checkout with the payment provider for the invoice's
 * balance and sends the browser there; the card is typed on the provider's page, never on Ridgeload's.
 * The provider's signed event records the payment against the invoice.
 */

export const PAYMENT_METHODS = ['card'] as const;

export const startPaymentBodySchema = z.strictObject({ method: z.enum(PAYMENT_METHODS, { error: 'must be card' }) });

/** The answer to starting (or pressing again) a card payment: one open checkout per invoice balance. */
export const startPaymentResultSchema = z.object({
  status: z.enum(PAYMENT_STATUSES),
  checkout_url: z.nullable(z.string()),
  payment: paymentSchema,
});
export type StartPaymentResult = z.infer<typeof startPaymentResultSchema>;

export const paymentParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });
