import './zod-messages';
import * as z from 'zod/mini';
import { PRODUCT_CATEGORIES } from './catalogue.schema';
import { INVOICE_STATUSES } from './invoice.schema';
import { ORDER_DATE_FIELDS, ORDER_STATUSES, QUOTE_REQUEST_STATUSES, isoDateSchema } from './order.schema';

/**
 * The search bars of the lists, as their forms post them (every value is the text of an input): what
 * the person typed or chose, read into the values the list's address and query take. An empty choice
 * ("Every stage") and an empty box mean no filter.
 */

/** The words typed into a list's search box: trimmed, at most 100 characters as the list queries allow. */
export const searchWordsSchema = z.pipe(
  z.optional(z.string().check(z.trim(), z.maxLength(100, { error: 'must be at most 100 characters' }))),
  z.transform((words) => words || undefined),
);

/** One of `values`, or the empty "every …" choice (no filter). */
function choiceOrEvery<const T extends readonly [string, ...string[]]>(values: T) {
  return z.pipe(
    z.optional(z.union([z.literal(''), z.enum(values)])),
    z.transform((value) => (value ? value : undefined)),
  );
}

/** A day typed in a date box, or nothing. */
const optionalDay = z.pipe(
  z.optional(z.union([z.literal(''), isoDateSchema])),
  z.transform((day) => day || undefined),
);

/** The contractor's orders: a stage and the search words. */
export const orderSearchSchema = z.object({
  status: choiceOrEvery(ORDER_STATUSES),
  q: searchWordsSchema,
});
export type OrderSearch = z.output<typeof orderSearchSchema>;

/** The order book's stage choices besides each stage alone: the desk's to-do, and what is out for delivery. */
export const ORDER_BOOK_STAGE_GROUPS = ['sent,agreed', 'confirmed,on_the_road'] as const;
export const ORDER_BOOK_PAGE_SIZES = ['25', '50', '100'] as const;

/** The merchant's order book: stage (or group), branch, page size, search words and a date range. */
export const orderBookSearchSchema = z
  .object({
    statuses: choiceOrEvery([...ORDER_BOOK_STAGE_GROUPS, ...ORDER_STATUSES]),
    branch_id: z.pipe(
      z.optional(z.string().check(z.regex(/^\d*$/, { error: 'Choose one of the options' }))),
      z.transform((id) => id || undefined),
    ),
    page_size: z.optional(z.enum(ORDER_BOOK_PAGE_SIZES)),
    q: searchWordsSchema,
    date_field: z.optional(z.enum(ORDER_DATE_FIELDS)),
    date_from: optionalDay,
    date_to: optionalDay,
  })
  .check(z.refine((s) => !s.date_from || !s.date_to || s.date_from <= s.date_to, { path: ['date_to'], error: 'must be on or after the From day' }));
export type OrderBookSearch = z.output<typeof orderBookSearchSchema>;

/** Either side's quote requests: a stage, the desk's "only those waiting for our price" (a tick box), the search words. */
export const quoteRequestSearchSchema = z.object({
  status: choiceOrEvery(QUOTE_REQUEST_STATUSES),
  waiting: z.pipe(
    z.optional(z.literal('on')),
    z.transform((ticked) => (ticked ? ('true' as const) : undefined)),
  ),
  q: searchWordsSchema,
});
export type QuoteRequestSearch = z.output<typeof quoteRequestSearchSchema>;

/** The firm's sites: the search words (the list follows them as they are typed) and whether archived sites are included. */
export const projectSearchSchema = z.object({
  q: searchWordsSchema,
  archived: z.pipe(
    z.optional(z.literal('on')),
    z.transform((ticked) => (ticked ? ('all' as const) : ('false' as const))),
  ),
});
export type ProjectSearch = z.output<typeof projectSearchSchema>;

/** Invoices: one state, or every invoice. */
export const invoiceFilterSchema = z.object({ status: choiceOrEvery(INVOICE_STATUSES) });

/** The merchant's products: in use, archived or both, and one category or every one. */
export const productFilterSchema = z.object({
  archived: z._default(z.enum(['false', 'true', 'all']), 'false'),
  category: choiceOrEvery(PRODUCT_CATEGORIES),
});

/** A branch's stock: only what is at or below its reorder level (a tick box), or everything. */
export const stockFilterSchema = z.object({
  low_only: z.pipe(
    z.optional(z.literal('on')),
    z.transform((ticked) => ticked === 'on'),
  ),
});
