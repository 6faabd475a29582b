import './zod-messages';
import * as z from 'zod/mini';
import { branchRefSchema } from './catalogue.schema';
import { documentTotalsShape, pricedLineShape } from './money.schema';
import { orgRefSchema } from './order.schema';

/**
 * Invoices and credit notes. Numbers run per merchant without gaps (INV-000001, CN-000001); money is
 * integer minor units of the configured currency; each line carries its tax rate in basis points
 * (2000 = 20 %) and its tax is rounded to the minor unit per line.
 */

export const INVOICE_BASES = ['delivered', 'confirmed'] as const;
export const PAY_BY = ['account', 'card'] as const;
export const PAY_BY_LABELS: Record<(typeof PAY_BY)[number], string> = { account: 'On account, by the due date', card: 'By card' };
export const INVOICE_STATUSES = ['unpaid', 'part_paid', 'paid', 'credited'] as const;
export type InvoiceStatus = (typeof INVOICE_STATUSES)[number];
export const INVOICE_STATUS_LABELS: Record<InvoiceStatus, string> = {
  unpaid: 'Not paid yet',
  part_paid: 'Partly paid',
  paid: 'Paid',
  credited: 'Cleared by credit notes',
};
export const CREDIT_REASONS = ['shortage', 'damage', 'return'] as const;
export const CREDIT_REASON_LABELS: Record<(typeof CREDIT_REASONS)[number], string> = {
  shortage: 'Short on delivery',
  damage: 'Damaged on delivery',
  return: 'Returned to the branch',
};

export const PAYMENT_STATUSES = ['open', 'succeeded', 'failed'] as const;
export const REFUND_STATUSES = ['pending', 'succeeded', 'failed'] as const;

export const invoiceNumber = (n: number) => `INV-${String(n).padStart(6, '0')}`;
export const creditNoteNumber = (n: number) => `CN-${String(n).padStart(6, '0')}`;

export const invoiceLineSchema = z.object({
  id: z.number().check(z.int()),
  position: z.number().check(z.int()),
  order_line_id: z.nullable(z.number().check(z.int())),
  sku: z.string(),
  description: z.string(),
  unit: z.string(),
  pack_size: z.number().check(z.int()),
  ...pricedLineShape,
  /** Packs already credited on this line. */
  credited_quantity: z.number().check(z.int()),
});

export const paymentSchema = z.object({
  id: z.number().check(z.int()),
  method: z.literal('card'),
  status: z.enum(PAYMENT_STATUSES),
  amount: z.number().check(z.int()),
  currency: z.string(),
  checkout_url: z.nullable(z.string()),
  last_error: z.nullable(z.string()),
  paid_at: z.nullable(z.string()),
  created_at: z.string(),
});
export type Payment = z.infer<typeof paymentSchema>;

export const creditNoteSchema = z.object({
  id: z.number().check(z.int()),
  number: z.string(),
  invoice_id: z.number().check(z.int()),
  reason: z.enum(CREDIT_REASONS),
  notes: z.string(),
  ...documentTotalsShape,
  lines: z.array(z.object({ invoice_line_id: z.number().check(z.int()), sku: z.string(), description: z.string(), ...pricedLineShape })),
  refund: z.nullable(z.object({ status: z.enum(REFUND_STATUSES), amount: z.number().check(z.int()), last_error: z.nullable(z.string()) })),
  created_at: z.string(),
});
export type CreditNote = z.infer<typeof creditNoteSchema>;

export const invoiceSummarySchema = z.object({
  id: z.number().check(z.int()),
  number: z.string(),
  status: z.enum(INVOICE_STATUSES),
  status_label: z.string(),
  order: z.object({ id: z.number().check(z.int()), reference: z.string() }),
  contractor: orgRefSchema,
  branch: branchRefSchema,
  currency: z.string(),
  issue_date: z.string(),
  due_date: z.nullable(z.string()),
  pay_by: z.enum(PAY_BY),
  ...documentTotalsShape,
  credited: z.number().check(z.int()),
  paid: z.number().check(z.int()),
  /** total − credited − paid, never below 0. */
  balance: z.number().check(z.int()),
  overdue: z.boolean(),
});
export type InvoiceSummary = z.infer<typeof invoiceSummarySchema>;

export const invoiceSchema = z.extend(invoiceSummarySchema, {
  basis: z.enum(INVOICE_BASES),
  site_name: z.string(),
  po_reference: z.string(),
  lines: z.array(invoiceLineSchema),
  credit_notes: z.array(creditNoteSchema),
  payments: z.array(paymentSchema),
  /** Whether the contractor may pay this invoice by card now: always for a card customer, for an account customer unless the merchant turned it off. */
  card_payment: z.boolean(),
  created_at: z.string(),
});
export type Invoice = z.infer<typeof invoiceSchema>;

export const invoiceListQuerySchema = z.object({
  status: z.optional(z.enum(INVOICE_STATUSES)),
  contractor_id: z.optional(z.coerce.number().check(z.int(), z.positive())),
  page: z._default(z.coerce.number().check(z.int(), z.gte(1)), 1),
  page_size: z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(100)), 25),
});
export const invoiceListSchema = z.object({ invoices: z.array(invoiceSummarySchema), total: z.number().check(z.int()), page: z.number().check(z.int()), page_size: z.number().check(z.int()) });
export const invoiceParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });

export const creditNoteBodySchema = z.strictObject({
  reason: z.enum(CREDIT_REASONS, { error: `must be one of ${CREDIT_REASONS.join(', ')}` }),
  notes: z.optional(z.string().check(z.trim(), z.maxLength(2000))),
  lines: z.array(z.object({ invoice_line_id: z.number().check(z.int(), z.positive()), quantity: z.number().check(z.int(), z.gte(1, { error: 'must be at least 1' })) })).check(
    z.minLength(1, { error: 'credit at least one line' }),
    z.maxLength(200),
    z.superRefine((lines, ctx) => {
      const seen = new Set<number>();
      lines.forEach((l, i) => {
        if (seen.has(l.invoice_line_id)) ctx.addIssue({ code: 'custom', path: [i, 'invoice_line_id'], message: 'this line is listed twice' });
        seen.add(l.invoice_line_id);
      });
    }),
  ),
});
export type CreditNoteBody = z.input<typeof creditNoteBodySchema>;

// Account customers: a contractor the merchant lets pay by a due date.

export const accountSchema = z.object({
  contractor: orgRefSchema,
  /** Days from the invoice date to the due date; null = no account (pays by card). */
  terms_days: z.nullable(z.number().check(z.int())),
  /** Whether the contractor may pay its account invoices by card too (always, without an account). */
  card_payments: z.boolean(),
  orders: z.number().check(z.int()),
});
export const accountListSchema = z.object({ accounts: z.array(accountSchema) });
export const accountParamsSchema = z.object({ contractorId: z.coerce.number().check(z.int(), z.positive()) });
export const putAccountBodySchema = z.strictObject({
  terms_days: z.number({ error: 'must be a number' }).check(z.int({ error: 'must be whole days' }), z.gte(0, { error: 'must not be negative' }), z.lte(120, { error: 'must be at most 120 days' })),
  /** Let the contractor pay account invoices by card as well; left out keeps the account's setting (on for a new account). */
  card_payments: z.optional(z.boolean({ error: 'must be true or false' })),
});
