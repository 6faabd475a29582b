import { describe, expect, it } from 'vitest';
import { orderBookCache } from './order-book-cache';
import type { OrderParty } from './orders.repository';

interface Filter {
  page: number;
  page_size: number;
  sort: string;
  dir: string;
  status?: string;
}

/** A book of `total` orders whose version the test moves by hand, counting what reaches it. */
function fakeBook(total: number) {
  const calls = { version: 0, count: 0, page: 0 };
  const state = { version: 1, total, label: 'a' };
  const source = {
    version: async () => {
      calls.version++;
      return state.version;
    },
    count: async () => {
      calls.count++;
      return { total: state.total, capped: false };
    },
    page: async (_p: OrderParty, f: Filter) => {
      calls.page++;
      return [`${state.label}:${f.status ?? 'all'}:${f.sort}:${f.dir}:${f.page}`];
    },
  };
  return { calls, state, cache: orderBookCache<Filter, string[]>(source) };
}

const desk: OrderParty = { kind: 'merchant', organisationId: 7 };
const first: Filter = { status: 'sent', sort: 'placed_at', dir: 'desc', page: 1, page_size: 25 };

describe('order-book cache', () => {
  it('answers the same view again from memory while the version stands', async () => {
    const { calls, cache } = fakeBook(60);
    const a = await cache.read(desk, first);
    const b = await cache.read(desk, { ...first });
    expect(a).toEqual({ total: 60, capped: false, page: ['a:sent:placed_at:desc:1'] });
    expect(b).toEqual(a);
    expect(calls).toEqual({ version: 2, count: 1, page: 1 });
  });

  it('reads the book again once the version has moved', async () => {
    const { calls, state, cache } = fakeBook(60);
    await cache.read(desk, first);
    state.version = 2;
    state.label = 'b';
    state.total = 61;
    const after = await cache.read(desk, first);
    expect(after).toEqual({ total: 61, capped: false, page: ['b:sent:placed_at:desc:1'] });
    expect(calls.count).toBe(2);
    expect(calls.page).toBe(2);
  });

  it('counts a filter once however its pages are turned or sorted', async () => {
    const { calls, cache } = fakeBook(60);
    await cache.read(desk, first);
    await cache.read(desk, { ...first, page: 2 });
    await cache.read(desk, { ...first, sort: 'requested_date', dir: 'asc' });
    expect(calls.count).toBe(1);
    expect(calls.page).toBe(3);
    await cache.read(desk, { ...first, status: 'confirmed' });
    expect(calls.count).toBe(2);
  });

  it('keeps one organisation’s answers apart from another’s', async () => {
    const { calls, cache } = fakeBook(60);
    await cache.read(desk, first);
    await cache.read({ kind: 'merchant', organisationId: 8 }, first);
    await cache.read({ kind: 'contractor', organisationId: 7 }, first);
    expect(calls.page).toBe(3);
  });

  it('asks for no page beyond the last one, nor for an empty book', async () => {
    const { calls, cache } = fakeBook(30);
    expect(await cache.read(desk, { ...first, page: 3 })).toEqual({ total: 30, capped: false, page: null });
    expect(calls.page).toBe(0);
    const empty = fakeBook(0);
    expect((await empty.cache.read(desk, first)).page).toBeNull();
    expect(empty.calls.page).toBe(0);
  });
});

describe('orderBookCache keys', () => {
  it('keeps the keys of a frozen filter, and works out those of a filter that may change each time', async () => {
    const { calls, cache } = fakeBook(100);
    const party = desk;
    const frozen = Object.freeze({ page: 1, page_size: 25, sort: 'placed_at', dir: 'desc', status: 'sent' });
    await cache.read(party, frozen);
    await cache.read(party, frozen);
    expect(calls.page).toBe(1);
    const open: Filter = { page: 1, page_size: 25, sort: 'placed_at', dir: 'desc', status: 'sent' };
    expect((await cache.read(party, open)).page).toEqual(['a:sent:placed_at:desc:1']);
    open.status = 'confirmed';
    open.page = 2;
    expect((await cache.read(party, open)).page).toEqual(['a:confirmed:placed_at:desc:2']);
    expect(calls.page).toBe(2);
  });
});
