import { z } from 'zod';
import { quoteRequestListQuerySchema } from '../../../../shared/schemas/order.schema';
import type { DeskQuoteRequestFilters } from '../api/keys';

const fields = quoteRequestListQuerySchema.shape;
const defaults = quoteRequestListQuerySchema.parse({});

/**
 * The server's list query, read field by field: one bad value in the address (an old bookmark, a
 * hand-edited link) falls back to its default without losing the others, and unknown keys are dropped.
 */
const addressQuery = z.object({
  status: fields.status.catch(undefined),
  waiting: fields.waiting.catch(undefined),
  q: fields.q.catch(undefined),
  sort: fields.sort.catch(defaults.sort),
  dir: fields.dir.catch(defaults.dir),
  page: fields.page.catch(defaults.page),
  page_size: fields.page_size.catch(defaults.page_size),
});

/** The desk's list filters as the address holds them, as the server will read them. */
export function deskFiltersFromSearch(search: URLSearchParams): DeskQuoteRequestFilters {
  const value = addressQuery.parse(Object.fromEntries(search.entries()));
  return { ...value, waiting: value.waiting || undefined, q: value.q || undefined };
}
