import { quoteRequestFiltersFromSearch } from '../../../components/quotes/list-filters';
import type { DeskQuoteRequestFilters } from '../api/keys';

/** The desk's list filters as the address holds them, as the server will read them. */
export function deskFiltersFromSearch(search: URLSearchParams): DeskQuoteRequestFilters {
  return quoteRequestFiltersFromSearch(search, { waiting: true });
}
