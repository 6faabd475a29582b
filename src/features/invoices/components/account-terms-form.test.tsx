import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { AccountTermsForm } from './account-terms-form';

const account = { contractor: { id: 5, name: 'Brackenfold Roofworks' }, terms_days: 30, card_payments: true, orders: 4 };

describe('AccountTermsForm', () => {
  it('sets terms as whole days with PUT', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'PUT /api/accounts/5': { status: 200, body: { ...account, terms_days: 60 } } });
    renderWithProviders(<AccountTermsForm account={account} />);
    fireEvent.change(screen.getByLabelText('Days to pay, Brackenfold Roofworks'), { target: { value: '60' } });
    fireEvent.click(screen.getByRole('button', { name: 'Set terms' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url, init]) => String(url).endsWith('/api/accounts/5') && init?.method === 'PUT');
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({ terms_days: 60, card_payments: true });
    });
  });

  it('turns card payment off for the account when the box is cleared', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'PUT /api/accounts/5': { status: 200, body: { ...account, card_payments: false } } });
    renderWithProviders(<AccountTermsForm account={account} />);
    fireEvent.click(screen.getByRole('checkbox', { name: 'May also pay by card' }));
    fireEvent.click(screen.getByRole('button', { name: 'Set terms' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url, init]) => String(url).endsWith('/api/accounts/5') && init?.method === 'PUT');
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({ terms_days: 30, card_payments: false });
    });
  });

  it('refuses terms longer than 120 days on the field, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<AccountTermsForm account={account} />);
    fireEvent.change(screen.getByLabelText('Days to pay, Brackenfold Roofworks'), { target: { value: '150' } });
    fireEvent.click(screen.getByRole('button', { name: 'Set terms' }));
    expect(await screen.findByText('must be at most 120 days')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('removes the account with DELETE', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'DELETE /api/accounts/5': { status: 200, body: { ...account, terms_days: null } } });
    renderWithProviders(<AccountTermsForm account={account} />);
    fireEvent.click(screen.getByRole('button', { name: 'Remove account' }));
    await waitFor(() => expect(fetchMock.mock.calls.some(([url, init]) => String(url).endsWith('/api/accounts/5') && init?.method === 'DELETE')).toBe(true));
  });
});
