import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { orderFixture, stockFixture } from '../../../test-utils/order-fixture';
import { ConfirmOrderForm } from './confirm-order-form';

const SLOTS = 'GET /api/branches/3/slots?date=2027-03-01';
const slotDay = {
  branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck' },
  date: '2027-03-01',
  slots: [
    {
      id: 40,
      branch_id: 3,
      date: '2027-03-01',
      time_window: '07:30-12:00',
      lorry: { id: 1, registration: 'RL-TY01', name: 'Three-axle rigid with crane', has_crane: true, crane_max_kg: 1200 },
      driver: null,
      payload_kg: 14000,
      pallet_slots: 12,
      booked_kg: 2000,
      booked_pallets: 2,
      remaining_kg: 12000,
      remaining_pallets: 10,
      bookings: [],
    },
  ],
};

function renderForm(available: [number, number], over: Parameters<typeof orderFixture>[0] = {}) {
  const order = orderFixture(over);
  const stock = new Map([
    [11, stockFixture(11, 'TRS-FL420-SG', available[0])],
    [12, stockFixture(12, 'TRS-RHR-SG', available[1])],
  ]);
  renderWithProviders(<ConfirmOrderForm order={order} stock={stock} />);
  return order;
}

const sendInput = (description: string) => screen.getByLabelText(description) as HTMLInputElement;
const submit = () => fireEvent.click(screen.getByRole('button', { name: 'Confirm and reserve the stock' }));
const sentBody = (fetchMock: ReturnType<typeof stubFetch>) => {
  const call = fetchMock.mock.calls.find(([url, init]) => String(url).endsWith('/confirm') && init?.method === 'POST');
  return call ? (JSON.parse(String(call[1]?.body)) as unknown) : undefined;
};

describe('ConfirmOrderForm', () => {
  it('marks which lorries can lift and disables those that cannot for an order lifted onto the roof', async () => {
    const withFlatbed = {
      ...slotDay,
      slots: [...slotDay.slots, { ...slotDay.slots[0], id: 41, lorry: { id: 2, registration: 'RL-TY02', name: 'Two-axle flatbed', has_crane: false, crane_max_kg: null } }],
    };
    stubFetch({ [SLOTS]: { status: 200, body: withFlatbed } });
    renderForm([50, 50], { delivery_method: 'roof' });
    const crane = await screen.findByRole('radio', { name: /RL-TY01/ }, { timeout: 5000 });
    const flatbed = screen.getByRole('radio', { name: /RL-TY02/ });
    expect(crane.hasAttribute('disabled')).toBe(false);
    expect(flatbed.hasAttribute('disabled')).toBe(true);
    expect(screen.getByText(/crane: lifts up to 1,200 kg/)).toBeTruthy();
    expect(screen.getByText(/no crane: cannot lift/)).toBeTruthy();
    expect(screen.getByText(/not for this order: it needs a crane/)).toBeTruthy();
  });

  it('writes the packs free at the branch with thousands separators, as the contractor side does', async () => {
    stubFetch({ [SLOTS]: { status: 200, body: slotDay } });
    renderForm([56673, 1593]);
    expect(await screen.findByText('56,673', {}, { timeout: 5000 })).toBeTruthy();
    expect(screen.getByText('1,593')).toBeTruthy();
    expect(screen.queryByText('56673')).toBeNull();
  });

  it('leaves a lorry without a crane open to a ground delivery', async () => {
    const flatbedOnly = { ...slotDay, slots: [{ ...slotDay.slots[0], id: 41, lorry: { id: 2, registration: 'RL-TY02', name: 'Two-axle flatbed', has_crane: false, crane_max_kg: null } }] };
    stubFetch({ [SLOTS]: { status: 200, body: flatbedOnly } });
    renderForm([50, 50]);
    expect((await screen.findByRole('radio', { name: /RL-TY02/ }, { timeout: 5000 })).hasAttribute('disabled')).toBe(false);
  });

  it('starts a short line at the packs free and back-orders the rest, sending part quantities per line', async () => {
    const confirmed = orderFixture({ status: 'confirmed', allowed_actions: [] });
    const fetchMock = stubFetch({ [SLOTS]: { status: 200, body: slotDay }, 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/orders/1/confirm': { status: 200, body: confirmed } });
    renderForm([6, 50]);
    expect(sendInput('Interlocking tile, slate grey').value).toBe('6');
    expect(screen.getByTestId('back-order-101').textContent).toBe('4');
    expect(sendInput('Half-round ridge').value).toBe('5');
    expect(screen.getByTestId('back-order-102').textContent).toBe('0');

    // The desk sends fewer ridges now: the other 2 follow.
    fireEvent.change(sendInput('Half-round ridge'), { target: { value: '3' } });
    expect(screen.getByTestId('back-order-102').textContent).toBe('2');
    await screen.findByText(/RL-TY01/);
    submit();
    await waitFor(() =>
      expect(sentBody(fetchMock)).toEqual({
        lines: [
          { line_id: 101, quantity: 6 },
          { line_id: 102, quantity: 3 },
        ],
      }),
    );
  });

  it('books the chosen slot in the same confirmation', async () => {
    const fetchMock = stubFetch({
      [SLOTS]: { status: 200, body: slotDay },
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/orders/1/confirm': { status: 200, body: orderFixture({ status: 'confirmed' }) },
    });
    renderForm([50, 50]);
    fireEvent.click(await screen.findByRole('radio', { name: /07:30-12:00 · RL-TY01/ }));
    expect(screen.getByText(/12,000 kg of 14,000 kg left · 10 of 12 pallet slots left/)).toBeTruthy();
    submit();
    await waitFor(() =>
      expect(sentBody(fetchMock)).toEqual({
        lines: [
          { line_id: 101, quantity: 10 },
          { line_id: 102, quantity: 5 },
        ],
        slot_id: 40,
      }),
    );
  });

  it('refuses more packs than are open on a line, naming it, and sends nothing', async () => {
    const fetchMock = stubFetch({ [SLOTS]: { status: 200, body: slotDay } });
    renderForm([50, 50]);
    fireEvent.change(sendInput('Interlocking tile, slate grey'), { target: { value: '11' } });
    fireEvent.change(sendInput('Half-round ridge'), { target: { value: 'two' } });
    submit();
    expect(await screen.findByText('at most the 10 packs open on this line')).toBeTruthy();
    expect(screen.getByText('give a whole number of packs (0 to back-order it all)')).toBeTruthy();
    expect(sendInput('Interlocking tile, slate grey').getAttribute('aria-invalid')).toBe('true');
    expect(sentBody(fetchMock)).toBeUndefined();
  });

  it('shows a 409 insufficient_stock as the SKUs short, with packs free, asked and short', async () => {
    stubFetch({
      [SLOTS]: { status: 200, body: slotDay },
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/orders/1/confirm': {
        status: 409,
        body: {
          error: {
            code: 'insufficient_stock',
            message: 'Not enough stock at Tollerbeck Yard to confirm RL-000001: confirm part and back-order the rest, or offer a substitute',
            details: [{ sku: 'TRS-FL420-SG', line_id: 101, available: 2, requested: 10, message: 'TRS-FL420-SG: 2 packs free at Tollerbeck Yard, 10 asked' }],
          },
        },
      },
    });
    renderForm([50, 50]);
    submit();
    const table = await screen.findByRole('table', { name: 'Lines short of stock' });
    const row = within(table).getAllByRole('row')[1];
    expect(
      within(row)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['TRS-FL420-SG', 'Interlocking tile, slate grey', '2', '10', '8']);
    expect(screen.getByText('Not enough stock to confirm: nothing was reserved')).toBeTruthy();
  });
});
