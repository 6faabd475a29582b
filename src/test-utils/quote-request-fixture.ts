import { screen, within } from '@testing-library/react';
import { vi } from 'vitest';
import type { QuoteRequestList } from '../../shared/schemas/order.schema';

type QuoteRequestRow = QuoteRequestList['quote_requests'][number];

/** An invented quote request as a list row shows it, asked of Tollerbeck Yard and not yet priced. */
export function quoteRequestRowFixture(id: number, overrides: Partial<QuoteRequestRow> = {}): QuoteRequestRow {
  return {
    id,
    status: 'open',
    contractor: { id: 5, name: 'Brackenfold Roofworks' },
    project: { id: 9, name: 'Hollin Brow, plots 1–20' },
    requested_date: '2027-03-10',
    created_at: '2027-03-01 09:00:00',
    updated_at: '2027-03-01 09:00:00',
    quotes: [{ id: 100 + id, status: 'asked', total: null, branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck', merchant: { id: 2, name: 'Tollerbeck Roofing Supplies' } } }],
    ...overrides,
  };
}

/**
 * Answers GET /api/quote-requests with `rows` and `total` matches whatever is asked, echoing the page
 * and page size sent, and records every query string; any other request is a 404.
 */
export function stubQuoteRequestListApi(rows: QuoteRequestRow[], total: number): URLSearchParams[] {
  const queries: URLSearchParams[] = [];
  const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL) => {
      const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
      if (url.pathname !== '/api/quote-requests') return json({ error: { code: 'not_found', message: `No mocked answer for ${url.pathname}` } }, 404);
      queries.push(url.searchParams);
      const body: QuoteRequestList = { quote_requests: rows, total, page: Number(url.searchParams.get('page') ?? 1), page_size: Number(url.searchParams.get('page_size') ?? 25) };
      return json(body);
    }),
  );
  return queries;
}

/** What either side's quote-request list shows and asks for, read off the screen the same way on both. */
export const quoteRequestListScreen = {
  /** A query string sent to the server, as an object. */
  sent: (q: URLSearchParams | undefined) => Object.fromEntries(q?.entries() ?? []),
  /** The column header whose name starts with `name`. */
  header: (name: string) => screen.getByRole('columnheader', { name: new RegExp(`^${name}`) }),
  /** The list's address (its filters), as an object. */
  addressOf: (router: { state: { location: { search: string } } }) => Object.fromEntries(new URLSearchParams(router.state.location.search).entries()),
  /** The first cell of each row, in the order shown. */
  requestLinks: () =>
    within(screen.getByRole('table', { name: 'Quote requests' }))
      .getAllByRole('row')
      .slice(1)
      .map((r) => within(r).getAllByRole('cell')[0].textContent),
  /** The table's column headers, in order. */
  headers: () =>
    within(screen.getByRole('table', { name: 'Quote requests' }))
      .getAllByRole('columnheader')
      .map((h) => h.textContent),
  /** The headers that sort (a button each), in order. */
  sortButtons: () =>
    within(screen.getByRole('table', { name: 'Quote requests' }))
      .getAllByRole('button')
      .map((b) => b.textContent),
};
