import * as z from 'zod/mini';
import { quoteRequestListQuerySchema } from '../../../shared/schemas/order.schema';
import type { QUOTE_REQUEST_SORTS, QUOTE_REQUEST_STATUSES } from '../../../shared/schemas/order.schema';

/** The quote-request list query as a page sends it (see quoteRequestListQuerySchema); `waiting` is the merchant's only. */
export interface QuoteRequestListFilters {
  status?: (typeof QUOTE_REQUEST_STATUSES)[number];
  /** Only the requests some branch of ours has still to price. */
  waiting?: boolean;
  q?: string;
  sort: (typeof QUOTE_REQUEST_SORTS)[number];
  dir: 'asc' | 'desc';
  page: number;
  page_size: number;
}

const fields = quoteRequestListQuerySchema.shape;
const defaults = quoteRequestListQuerySchema.parse({});

/**
 * The server's list query, read field by field: one bad value in the address (an old bookmark, a
 * hand-edited link) falls back to its default without losing the others, and unknown keys are dropped.
 */
const addressQuery = z.object({
  status: z.catch(fields.status, undefined),
  waiting: z.catch(fields.waiting, undefined),
  q: z.catch(fields.q, undefined),
  sort: z.catch(fields.sort, defaults.sort),
  dir: z.catch(fields.dir, defaults.dir),
  page: z.catch(fields.page, defaults.page),
  page_size: z.catch(fields.page_size, defaults.page_size),
});

/**
 * A list's filters as the address holds them, as the server will read them. "Waiting for our price"
 * is read only where the side offers it (the merchant's desk); the contractor's list never sends it.
 */
export function quoteRequestFiltersFromSearch(search: URLSearchParams, { waiting }: { waiting: boolean }): QuoteRequestListFilters {
  const { waiting: waitingValue, ...value } = addressQuery.parse(Object.fromEntries(search.entries()));
  return { ...value, ...(waiting ? { waiting: waitingValue || undefined } : {}), q: value.q || undefined };
}

/** The list query as a query string: empty values and the server's default `waiting=false` are left out. */
export function quoteRequestListParams(filters: QuoteRequestListFilters): URLSearchParams {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) {
    if (value === undefined || value === '' || value === false) continue;
    params.set(key, String(value));
  }
  return params;
}
