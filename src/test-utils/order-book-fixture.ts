import { vi } from 'vitest';
import type { OrderSummary } from '../../shared/schemas/order.schema';

/** An invented order as a list row shows it; only the fields a list shows matter. */
export function orderSummaryFixture(id: number, overrides: Partial<OrderSummary> = {}): OrderSummary {
  return {
    id,
    reference: `RL-${String(id).padStart(6, '0')}`,
    status: 'sent',
    status_label: 'Sent',
    revision: 1,
    contractor: { id: 5, name: 'Brackenfold Roofworks' },
    branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck', merchant: { id: 2, name: 'Tollerbeck Roofing Supplies' } },
    project: { id: 8, name: 'Hollin Brow' },
    requested_date: '2027-03-10',
    time_window: null,
    delivery_method: 'ground',
    po_reference: '',
    subtotal: 61_440,
    line_count: 3,
    placed_at: '2027-03-01 09:00:00',
    updated_at: '2027-03-01 09:00:00',
    ...overrides,
  };
}

/**
 * Answers GET /api/orders with `page` (and a total of 120 matches) whatever is asked, and records
 * every query string sent; `extra` answers other paths by pathname. Anything else is a 404.
 */
export function stubOrderListApi(page: OrderSummary[], pageSize: number, extra: Record<string, unknown> = {}): URLSearchParams[] {
  const queries: URLSearchParams[] = [];
  const json = (body: unknown) => new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } });
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL) => {
      const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
      if (url.pathname === '/api/orders') {
        queries.push(url.searchParams);
        return json({ orders: page, total: 120, total_capped: false, page: Number(url.searchParams.get('page')), page_size: pageSize });
      }
      if (url.pathname in extra) return json(extra[url.pathname]);
      return new Response(JSON.stringify({ error: { code: 'not_found', message: `No mocked answer for ${url.pathname}` } }), { status: 404 });
    }),
  );
  return queries;
}
