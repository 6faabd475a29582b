import { describe, expect, it } from 'vitest';
import { filtersFromSearch } from './order-book';

describe('filtersFromSearch', () => {
  it('reads the order book filters from the address, as the server will read them', () => {
    const filters = filtersFromSearch(new URLSearchParams('statuses=sent,agreed&branch_id=3&sort=requested_date&dir=asc&page=2&page_size=50&date_from=2027-03-01&date_to=2027-03-31'));
    expect(filters).toEqual({
      statuses: 'sent,agreed',
      branch_id: 3,
      q: undefined,
      sort: 'requested_date',
      dir: 'asc',
      page: 2,
      page_size: 50,
      date_from: '2027-03-01',
      date_to: '2027-03-31',
      date_field: 'requested_date',
    });
  });

  it('falls back to the first page of newest orders when the address holds something the server would refuse', () => {
    const filters = filtersFromSearch(new URLSearchParams('statuses=lost&page=0'));
    expect(filters).toMatchObject({ statuses: undefined, sort: 'placed_at', dir: 'desc', page: 1, page_size: 25 });
  });
});
