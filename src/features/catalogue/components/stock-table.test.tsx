import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { setAppCurrency } from '../../../lib/format';
import { productFixture } from '../../../test-utils/product-fixture';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { StockTable } from './stock-table';

const item = {
  product_id: 11,
  sku: 'TRS-FL420-SG',
  name: 'Stanmoor flat interlocking tile, slate grey',
  category: 'tile',
  unit: 'tile',
  pack_size: 1,
  pack_price: 128,
  on_hand: 2_400,
  reserved: 400,
  available: 2_000,
  reorder_level: 600,
  state: 'in_stock',
  updated_at: '2026-11-30T08:00:00.000Z',
};
const list = (over: Partial<typeof item> = {}) => ({ status: 200, body: { branch: { id: 3, name: 'Quillsby yard', town: 'Quillsby' }, items: [{ ...item, ...over }] } });
const patchBody = (fetchMock: ReturnType<typeof stubFetch>) => {
  const call = fetchMock.mock.calls.find(([url, init]) => String(url).endsWith('/api/branches/3/stock/11') && init?.method === 'PATCH');
  return call ? (JSON.parse(String(call[1]?.body)) as unknown) : undefined;
};

describe('StockTable editing', () => {
  it('saves a new count, sending only the changed figure, says so and shows the refetched row', async () => {
    const fetchMock = stubFetch({
      'GET /api/branches/3/stock': [list(), list({ on_hand: 2_650, available: 2_250 })],
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'PATCH /api/branches/3/stock/11': { status: 200, body: { ...item, on_hand: 2_650, available: 2_250 } },
    });
    renderWithProviders(<StockTable branchId={3} canEdit />);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit stock of TRS-FL420-SG' }));
    const form = await screen.findByRole('form', { name: 'Change the stock of TRS-FL420-SG' });
    fireEvent.change(within(form).getByLabelText('On hand (packs of 1 tile)'), { target: { value: '2,650' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('TRS-FL420-SG: 2,650 on hand, reorder at 600.')).toBeTruthy();
    expect(patchBody(fetchMock)).toEqual({ on_hand: 2_650 });
    await waitFor(() => expect(screen.queryByRole('form', { name: 'Change the stock of TRS-FL420-SG' })).toBeNull());
    const table = screen.getByRole('table', { name: 'Stock at Quillsby yard' });
    await waitFor(() => expect(within(table).getByText('2,650')).toBeTruthy());
  });

  it('shows the server’s 422 detail at the reorder level field and keeps the form open', async () => {
    const fetchMock = stubFetch({
      'GET /api/branches/3/stock': list(),
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'PATCH /api/branches/3/stock/11': {
        status: 422,
        body: { error: { code: 'validation_failed', message: 'The request has 1 problem', details: [{ path: 'reorder_level', message: 'must be at most 100,000,000' }] } },
      },
    });
    renderWithProviders(<StockTable branchId={3} canEdit />);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit stock of TRS-FL420-SG' }));
    const reorder = await screen.findByLabelText('Reorder level (packs)');
    fireEvent.change(reorder, { target: { value: '100000000' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('must be at most 100,000,000')).toBeTruthy();
    expect(reorder.getAttribute('aria-invalid')).toBe('true');
    expect(patchBody(fetchMock)).toEqual({ reorder_level: 100_000_000 });
    expect(screen.getByRole('form', { name: 'Change the stock of TRS-FL420-SG' })).toBeTruthy();
  });

  it('puts the server’s refusal of a count below what is reserved (409 below_reserved) at the on hand field', async () => {
    stubFetch({
      'GET /api/branches/3/stock': list({ reserved: 300, available: 2_100 }),
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'PATCH /api/branches/3/stock/11': {
        status: 409,
        body: {
          error: {
            code: 'below_reserved',
            message: '400 packs of TRS-FL420-SG are reserved for confirmed orders: on hand cannot be less',
            details: [{ path: 'on_hand', message: 'must be at least the 400 packs reserved' }],
          },
        },
      },
    });
    renderWithProviders(<StockTable branchId={3} canEdit />);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit stock of TRS-FL420-SG' }));
    // The page still says 300 reserved, but a confirmation elsewhere raised it to 400 meanwhile.
    const onHand = await screen.findByLabelText('On hand (packs of 1 tile)');
    fireEvent.change(onHand, { target: { value: '350' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('must be at least the 400 packs reserved')).toBeTruthy();
    expect(onHand.getAttribute('aria-invalid')).toBe('true');
  });

  it('refuses on hand below the reserved packs before sending anything', async () => {
    const fetchMock = stubFetch({ 'GET /api/branches/3/stock': list() });
    renderWithProviders(<StockTable branchId={3} canEdit />);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit stock of TRS-FL420-SG' }));
    fireEvent.change(await screen.findByLabelText('On hand (packs of 1 tile)'), { target: { value: '399' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('must be at least the 400 packs reserved for confirmed orders')).toBeTruthy();
    expect(fetchMock.mock.calls.filter(([, init]) => init?.method === 'PATCH')).toHaveLength(0);
  });

  it('offers no edit button to a role without stock:manage, and Cancel closes the form unchanged', async () => {
    stubFetch({ 'GET /api/branches/3/stock': list() });
    const { unmount } = renderWithProviders(<StockTable branchId={3} />);
    await screen.findByRole('table', { name: 'Stock at Quillsby yard' });
    expect(screen.queryByRole('button', { name: /^Edit stock/ })).toBeNull();
    unmount();
    renderWithProviders(<StockTable branchId={3} canEdit />);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit stock of TRS-FL420-SG' }));
    fireEvent.click(await screen.findByRole('button', { name: 'Cancel' }));
    expect(screen.queryByRole('form', { name: 'Change the stock of TRS-FL420-SG' })).toBeNull();
  });
});

/** Opens the price form of the one row as a role with catalogue:manage; the field's label names the configured currency's sign. */
async function openPriceForm(sign: string) {
  renderWithProviders(<StockTable branchId={3} canEditPrice />);
  fireEvent.click(await screen.findByRole('button', { name: 'Change the price of TRS-FL420-SG' }));
  const price = (await screen.findByLabelText(`Pack price in ${sign} (1 tile)`)) as HTMLInputElement;
  const save = (typed: string) => {
    fireEvent.change(price, { target: { value: typed } });
    fireEvent.click(screen.getByRole('button', { name: 'Save the price' }));
  };
  const sentPrice = (fetchMock: ReturnType<typeof stubFetch>) => {
    const call = fetchMock.mock.calls.find(([, init]) => init?.method === 'PUT');
    return call ? (JSON.parse(String(call[1]?.body)) as unknown) : undefined;
  };
  return { price, save, sentPrice };
}

describe('StockTable price', () => {
  it('sets the pack price at the branch in pence from pounds typed, to a role with catalogue:manage', async () => {
    const fetchMock = stubFetch({
      'GET /api/branches/3/stock': list(),
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'PUT /api/branches/3/products/11': { status: 200, body: productFixture({ id: 11, sku: item.sku, name: item.name }) },
    });
    const { price, save, sentPrice } = await openPriceForm('£');
    expect(screen.queryByRole('button', { name: 'Edit stock of TRS-FL420-SG' })).toBeNull();
    expect(price.value).toBe('1.28');
    save('1.3');
    expect(await screen.findByText('TRS-FL420-SG now costs £1.30 a pack here.')).toBeTruthy();
    expect(sentPrice(fetchMock)).toEqual({ pack_price: 130 });
  });

  it('refuses a price with more decimals than pence, naming the field, and sends nothing', async () => {
    const fetchMock = stubFetch({ 'GET /api/branches/3/stock': list() });
    const { save, sentPrice } = await openPriceForm('£');
    save('1.305');
    expect(await screen.findByText('the pack price must be an amount in £ with at most 2 decimals, e.g. 12.80')).toBeTruthy();
    expect(sentPrice(fetchMock)).toBeUndefined();
  });
});

// Minor units per ISO 4217: the yen has none, the Bahraini dinar three (1,000 fils).
describe('StockTable price in another configured currency', () => {
  afterEach(() => setAppCurrency('GBP'));
  const answerNothing = () =>
    stubFetch({
      'GET /api/branches/3/stock': list(),
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'PUT /api/branches/3/products/11': { status: 422, body: { error: { code: 'x', message: 'not looked at' } } },
    });

  it('takes whole yen, with or without the sign, and refuses decimals', async () => {
    setAppCurrency('JPY');
    const fetchMock = answerNothing();
    const { price, save, sentPrice } = await openPriceForm('JP¥');
    expect(price.value).toBe('128');
    save('1.5');
    expect(await screen.findByText('the pack price must be an amount in JP¥ with no decimals, e.g. 1280')).toBeTruthy();
    save('¥1,500');
    await waitFor(() => expect(sentPrice(fetchMock)).toEqual({ pack_price: 1_500 }));
  });

  it('takes three decimals of the dinar and sends fils', async () => {
    setAppCurrency('BHD');
    const fetchMock = answerNothing();
    const { price, save, sentPrice } = await openPriceForm('BHD');
    expect(price.value).toBe('0.128');
    save('12.345');
    await waitFor(() => expect(sentPrice(fetchMock)).toEqual({ pack_price: 12_345 }));
  });
});

describe('StockTable filter', () => {
  it('shows only what is at or below its reorder level while the box is ticked', async () => {
    const low = { ...item, product_id: 12, sku: 'TRS-BAT-3825', name: 'Batten 38 × 25', state: 'low', on_hand: 40, available: 40, reorder_level: 60 };
    stubFetch({ 'GET /api/branches/3/stock': { status: 200, body: { branch: { id: 3, name: 'Quillsby yard', town: 'Quillsby' }, items: [item, low] } } });
    renderWithProviders(<StockTable branchId={3} />);
    const table = await screen.findByRole('table', { name: 'Stock at Quillsby yard' });
    expect(within(table).getAllByRole('row')).toHaveLength(3);
    fireEvent.click(await screen.findByRole('checkbox', { name: 'Only what is at or below its reorder level (1)' }));
    await waitFor(() => expect(within(table).getAllByRole('row')).toHaveLength(2));
    expect(within(table).getByText('TRS-BAT-3825')).toBeTruthy();
    fireEvent.click(screen.getByRole('checkbox', { name: 'Only what is at or below its reorder level (1)' }));
    await waitFor(() => expect(within(table).getAllByRole('row')).toHaveLength(3));
  });
});
