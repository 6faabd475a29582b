import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import type { OrderLineOption } from '../lib/order-form';
import { OrderForm } from './order-form';
import type { OrderSiteAccess } from './order-form';

const lines: OrderLineOption[] = [
  { product_id: 11, sku: 'TRS-FL420-SG', description: 'Interlocking tile, slate grey', unit: 'tile', pack_size: 1, packs: 22176, unit_price: 128, needed: 22176 },
  { product_id: 12, sku: 'TRS-RHR-SG', description: 'Half-round ridge', unit: 'piece', pack_size: 1, packs: 248, unit_price: 650, needed: 248 },
  { product_id: 13, sku: 'TRS-NB65-1K', description: 'Batten nails, box of 1000', unit: 'nail', pack_size: 1000, packs: 13, unit_price: 1850, needed: 12136 },
];

const site = (crane: OrderSiteAccess['crane_lift'] = 'allowed'): OrderSiteAccess => ({
  name: 'Hollin Brow',
  crane_lift: crane,
  overhead_lines: 'none',
  set_down_place: 'Hardstanding by the cabin',
  access_notes: 'Gate opens 07:30',
  vehicle_access: 'rigid_only',
});

/** Renders the form and waits for its lines table, which loads after the form shows (the first time, on a busy machine, in more than a second). */
async function renderForm(crane: OrderSiteAccess['crane_lift'] = 'allowed', onDone = vi.fn()) {
  renderWithProviders(<OrderForm target={{ mode: 'place', estimate_id: 7, branch_id: 1 }} branchName="Tollerbeck Yard" lines={lines} site={site(crane)} onDone={onDone} />);
  await screen.findByRole('region', { name: 'Lines of the order' }, { timeout: 5000 });
  return onDone;
}

const submit = () => fireEvent.click(screen.getByRole('button', { name: 'Send the order to Tollerbeck Yard' }));
const fieldError = (label: string) => {
  const input = screen.getByLabelText(label);
  return input.getAttribute('aria-invalid') === 'true' ? document.getElementById(input.getAttribute('aria-describedby')!.split(' ').pop()!)?.textContent : null;
};

describe('OrderForm', () => {
  it('starts with the delivery window blank (any time in the working day), so no window goes out that nobody chose', async () => {
    stubFetch({});
    await renderForm();
    expect((screen.getByLabelText('Window from') as HTMLInputElement).value).toBe('');
    expect((screen.getByLabelText('Window to') as HTMLInputElement).value).toBe('');
    expect(screen.getByText('Leave both window times blank for any time in the working day.')).toBeTruthy();
  });

  it('shows the subtotal of the estimate’s packs once the lines table has loaded, before anything is typed', async () => {
    stubFetch({});
    await renderForm();
    // 22,176 × £1.28 + 248 × £6.50 + 13 × £18.50.
    await waitFor(() => expect(screen.getByTestId('order-subtotal').textContent).toBe('£30,237.78'));
  });

  it('asks for the day before sending anything', async () => {
    const fetchMock = stubFetch({});
    await renderForm();
    submit();
    await waitFor(() => expect(fieldError('Day wanted')).toBe('must be a date YYYY-MM-DD'));
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('refuses a window that ends before it starts, and a line of no packs, naming the line', async () => {
    stubFetch({});
    await renderForm();
    fireEvent.change(screen.getByLabelText('Day wanted'), { target: { value: '2027-03-01' } });
    fireEvent.change(screen.getByLabelText('Window from'), { target: { value: '12:00' } });
    fireEvent.change(screen.getByLabelText('Window to'), { target: { value: '07:30' } });
    fireEvent.change(screen.getByLabelText('Packs of Half-round ridge'), { target: { value: '0' } });
    submit();
    await waitFor(() => expect(fieldError('Window from')).toBe('must end after it starts'));
    expect(fieldError('Packs of Half-round ridge')).toBe('must be at least 1');
    expect(fieldError('Packs of Interlocking tile, slate grey')).toBeNull();
  });

  it('will not ask for a crane lift on a site that allows none', async () => {
    stubFetch({});
    await renderForm('not_allowed');
    fireEvent.click(screen.getByLabelText(/Lifted onto the roof by the lorry crane/));
    expect(await screen.findByText('This site says no crane lift')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Day wanted'), { target: { value: '2027-03-01' } });
    submit();
    expect(await screen.findByText('the site says no crane lift: choose ground set-down, or change the site’s access first')).toBeTruthy();
  });

  it('sends the lines as adjusted: an unticked line left out, changed packs as typed', async () => {
    const order = {
      id: 41,
      reference: 'RL-000041',
    };
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      // The answer is not what this test is about; a refusal keeps the form on screen without a full order body.
      'POST /api/orders': { status: 409, body: { error: { code: 'project_archived', message: `This site is archived; restore it first (${order.reference})` } } },
    });
    await renderForm();
    fireEvent.change(screen.getByLabelText('Day wanted'), { target: { value: '2027-03-01' } });
    fireEvent.change(screen.getByLabelText('Window from'), { target: { value: '07:30' } });
    fireEvent.change(screen.getByLabelText('Window to'), { target: { value: '12:00' } });
    fireEvent.change(screen.getByLabelText('Packs of Interlocking tile, slate grey'), { target: { value: '23000' } });
    fireEvent.click(screen.getByLabelText('Order Batten nails, box of 1000'));
    fireEvent.change(screen.getByLabelText('Your PO reference'), { target: { value: 'HB-114' } });
    // The subtotal follows the lines: 23,000 × £1.28 + 248 × £6.50.
    await waitFor(() => expect(screen.getByTestId('order-subtotal').textContent).toBe('£31,052.00'));
    submit();

    expect(await screen.findByText(/This site is archived; restore it first/)).toBeTruthy();
    const post = fetchMock.mock.calls.find((call) => (call[1] as RequestInit).method === 'POST' && String(call[0]).endsWith('/api/orders'))!;
    expect(JSON.parse((post[1] as RequestInit).body as string)).toEqual({
      estimate_id: 7,
      branch_id: 1,
      requested_date: '2027-03-01',
      time_window: '07:30-12:00',
      delivery_method: 'ground',
      notes: '',
      po_reference: 'HB-114',
      lines: [
        { product_id: 11, quantity: 23000 },
        { product_id: 12, quantity: 248 },
      ],
    });
  });

  it('says an order needs a line when every line is unticked', async () => {
    stubFetch({});
    await renderForm();
    fireEvent.change(screen.getByLabelText('Day wanted'), { target: { value: '2027-03-01' } });
    for (const l of lines) fireEvent.click(screen.getByLabelText(`Order ${l.description}`));
    submit();
    expect(await screen.findByText(/an order needs at least one line/)).toBeTruthy();
  });
});
