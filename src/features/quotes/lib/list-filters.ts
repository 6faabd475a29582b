import { z } from 'zod';
import { quoteRequestListQuerySchema } from '../../../../shared/schemas/order.schema';
import type { QuoteRequestFilters } from '../api/keys';

const fields = quoteRequestListQuerySchema.shape;
const defaults = quoteRequestListQuerySchema.parse({});

/**
 * The server's list query, read field by field: one bad value in the address (an old bookmark, a
 * hand-edited link) falls back to its default without losing the others, and unknown keys are dropped.
 * "Waiting for our price" is the merchant's filter only, so the firm's list never reads it.
 */
const addressQuery = z.object({
  status: fields.status.catch(undefined),
  q: fields.q.catch(undefined),
  sort: fields.sort.catch(defaults.sort),
  dir: fields.dir.catch(defaults.dir),
  page: fields.page.catch(defaults.page),
  page_size: fields.page_size.catch(defaults.page_size),
});

/** The firm's list filters as the address holds them, as the server will read them. */
export function quoteFiltersFromSearch(search: URLSearchParams): QuoteRequestFilters {
  const value = addressQuery.parse(Object.fromEntries(search.entries()));
  return { ...value, q: value.q || undefined };
}
