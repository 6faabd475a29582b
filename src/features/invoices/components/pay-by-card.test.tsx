import { fireEvent, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { invoiceFixture } from '../../../test-utils/invoice-fixture';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { PayByCard } from './pay-by-card';

const payment = (status: 'open' | 'succeeded', last_error: string | null = null) => ({
  id: 7,
  method: 'card' as const,
  status,
  amount: 73_728,
  currency: 'GBP',
  checkout_url: 'http://127.0.0.1:4999/checkout/cs_test_1',
  last_error,
  paid_at: status === 'succeeded' ? '2027-03-02 10:00:00' : null,
  created_at: '2027-03-02 09:58:00',
});

/** An invented card-paying invoice; only the fields the payment panel reads matter here. */
const invoice = invoiceFixture;

afterEach(() => vi.unstubAllGlobals());

describe('PayByCard', () => {
  it("sends the browser to the provider's hosted page for the balance", async () => {
    const assign = vi.fn();
    vi.stubGlobal('location', { ...window.location, assign });
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/invoices/3/payments': { status: 201, body: { status: 'open', checkout_url: 'http://127.0.0.1:4999/checkout/cs_test_1', payment: payment('open') } },
    });
    renderWithProviders(<PayByCard invoice={invoice()} returned={null} />);
    fireEvent.click(screen.getByRole('button', { name: 'Pay £737.28 by card' }));
    await waitFor(() => expect(assign).toHaveBeenCalledWith('http://127.0.0.1:4999/checkout/cs_test_1'));
    const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/invoices/3/payments'));
    expect(JSON.parse(String(call?.[1]?.body))).toEqual({ method: 'card' });
  });

  it('on return shows the payment received once the invoice is paid, with no button left to press', () => {
    stubFetch({});
    renderWithProviders(<PayByCard invoice={invoice({ status: 'paid', paid: 73_728, balance: 0, payments: [payment('succeeded')] })} returned="done" />);
    expect(screen.getByText('Payment received')).toBeTruthy();
    expect(screen.queryByRole('button', { name: /by card/ })).toBeNull();
  });

  it('on return before the event arrives asks the provider how the payment stands', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/payments/7/refresh': { status: 200, body: payment('open') } });
    renderWithProviders(<PayByCard invoice={invoice({ payments: [payment('open')] })} returned="done" />);
    expect(screen.getByText('Checking the payment')).toBeTruthy();
    await waitFor(() => expect(fetchMock.mock.calls.some(([url]) => String(url).endsWith('/api/payments/7/refresh'))).toBe(true));
  });

  it('shows a declined card with the reason, and lets the contractor try again', () => {
    stubFetch({});
    renderWithProviders(<PayByCard invoice={invoice({ payments: [payment('open', 'Your card was declined.')] })} returned={null} />);
    expect(screen.getByText(/Your card was declined\./)).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Pay £737.28 by card' })).toBeTruthy();
  });
});
