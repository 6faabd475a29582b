import { createHash } from 'node:crypto';
import type { z } from 'zod';
import type { OrderSummary, orderBookQuerySchema } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { orderBookCache } from '../order-book-cache';
import type { OrderParty } from '../orders.repository';
import { partyOf, type OrderContext } from './order-context';
import { orderSummary } from './read-order';

type ListQuery = z.output<typeof orderBookQuerySchema>;

/** A weak ETag in the form Express gives a body (length and SHA-1), so conditional reads behave the same. */
const weakEtag = (body: Buffer) => `W/"${body.length.toString(16)}-${createHash('sha1').update(body).digest('base64').slice(0, 27)}"`;

/** The page as UTF-8 bytes: a kept page goes out as it is, with no text to encode again on each read. */
const bookBody = (f: ListQuery, count: { total: number; capped: boolean }, summaries: OrderSummary[]) =>
  Buffer.from(JSON.stringify({ orders: summaries, total: count.total, total_capped: count.capped, page: f.page, page_size: f.page_size }));

/**
 * The order book's pages as JSON bytes ({orders, total, total_capped, page, page_size}) with their
 * ETags and lengths (as the Content-Length header's text): the book is read far more than it changes, so each page is read, serialised and tagged
 * once per change (see order-book-cache) rather than once per reader.
 */
export function orderBook(ctx: OrderContext) {
  const { orders } = ctx;
  const book = orderBookCache({
    version: orders.bookVersion,
    count: orders.count,
    page: async (party: OrderParty, f: ListQuery, count: { total: number; capped: boolean }) => {
      const body = bookBody(f, count, (await orders.page(party, f)).map(orderSummary));
      return { body, etag: weakEtag(body), length: String(body.length) };
    },
  });

  /** `bookVersion`: the organisation's order-book version when it was read with the request's session. */
  return async function listPage(user: AuthUser, query: ListQuery, bookVersion?: number): Promise<{ body: Buffer; etag?: string; length?: string }> {
    const { page, total, capped } = await book.read(partyOf(user), query, bookVersion);
    return page ?? { body: bookBody(query, { total, capped }, []) };
  };
}
