import { quoteRequestFiltersFromSearch } from '../../../components/quotes/list-filters';
import type { QuoteRequestFilters } from '../api/keys';

/** The firm's list filters as the address holds them; "waiting for our price" is the merchant's filter, never read here. */
export function quoteFiltersFromSearch(search: URLSearchParams): QuoteRequestFilters {
  return quoteRequestFiltersFromSearch(search, { waiting: false });
}
