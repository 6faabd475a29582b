import { LRUCache } from 'lru-cache';
import type { OrderParty } from './orders.repository';

/**
 * Pages (and counts) kept for all organisations together, least recently read out first; a page is
 * 25–100 summaries as JSON, some 15–60 kB, so the pages take at most about 30 MB.
 */
const MAX_ENTRIES = 500;
/** Only bounds memory: freshness comes from the version, which moves on every write. */
const TTL_MS = 5 * 60_000;

export interface OrderBookSource<Filter, Page> {
  version(organisationId: number): Promise<number>;
  count(party: OrderParty, filter: Filter): Promise<{ total: number; capped: boolean }>;
  /** The page to keep, given the filter's count (so the kept page can carry it). */
  page(party: OrderParty, filter: Filter, count: { total: number; capped: boolean }): Promise<Page>;
}

/**
 * The order book is read far more often than it changes: every desk screen reloads it, on every
 * page turn and every return to the list. Answers are kept under the organisation's order-book
 * version, which database triggers move on every write to an order, a line added or removed, or a
 * renamed organisation or branch; a reader always reads the version first, so an answer is never
 * older than the version it is filed under. The count is kept without the page and sort, so turning
 * pages or re-sorting a filter already counted costs only the page.
 */
export function orderBookCache<Filter extends { page: number; page_size: number; sort: string; dir: string }, Page extends NonNullable<unknown>>(source: OrderBookSource<Filter, Page>) {
  const counts = new LRUCache<string, { total: number; capped: boolean }>({ max: MAX_ENTRIES, ttl: TTL_MS });
  const pages = new LRUCache<string, Page>({ max: MAX_ENTRIES, ttl: TTL_MS });
  let hits = 0;
  let misses = 0;
  /**
   * A filter's parts of the keys, worked out once per filter object when it cannot change (a frozen
   * parsed query, shared by every request with the same query text: see http/query-cache.ts).
   */
  const filterKeys = new WeakMap<Filter, { filter: string; page: string }>();
  const keysOf = (filter: Filter) => {
    const { page, page_size, sort, dir, ...rest } = filter;
    // zod gives the parsed query its keys in schema order, so equal filters stringify equally.
    const keys = { filter: JSON.stringify(rest), page: `${sort}:${dir}:${page}:${page_size}` };
    if (Object.isFrozen(filter)) filterKeys.set(filter, keys);
    return keys;
  };

  return {
    /** `knownVersion`: the organisation's version when the caller has already read it (with the session) for this request. */
    async read(party: OrderParty, filter: Filter, knownVersion?: number): Promise<{ total: number; capped: boolean; page: Page | null }> {
      const version = knownVersion ?? (await source.version(party.organisationId));
      const { page, page_size } = filter;
      const keys = filterKeys.get(filter) ?? keysOf(filter);
      const countKey = `${party.kind}:${party.organisationId}:${version}:${keys.filter}`;
      let count = counts.get(countKey);
      if (!count) {
        count = await source.count(party, filter);
        counts.set(countKey, count);
      }
      if (count.total === 0 || (!count.capped && (page - 1) * page_size >= count.total)) return { ...count, page: null };
      const pageKey = `${countKey}:${keys.page}`;
      let rows = pages.get(pageKey);
      if (rows) hits++;
      else {
        misses++;
        rows = await source.page(party, filter, count);
        pages.set(pageKey, rows);
      }
      return { ...count, page: rows };
    },

    /** Pages answered from memory and from the database since start-up, for the benchmark and logs. */
    stats: () => ({ hits, misses, entries: pages.size }),
  };
}
