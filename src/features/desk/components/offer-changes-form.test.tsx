import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { orderFixture, stockFixture } from '../../../test-utils/order-fixture';
import { OfferChangesForm } from './offer-changes-form';

const stock = [stockFixture(11, 'TRS-FL420-SG', 6), stockFixture(12, 'TRS-RHR-SG', 50), stockFixture(13, 'TRS-FL420-BR', 40)];

describe('OfferChangesForm', () => {
  it('offers part now, the rest to follow and a substitute, sending only the lines that change', async () => {
    const order = orderFixture();
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/orders/1/proposals': { status: 201, body: { proposal_id: 9, order: orderFixture({ status: 'changes_offered' }) } } });
    renderWithProviders(<OfferChangesForm order={order} stock={stock} />);
    fireEvent.change(screen.getByLabelText('Packs now of TRS-FL420-SG'), { target: { value: '6' } });
    fireEvent.change(screen.getByLabelText('Packs to follow of TRS-FL420-SG'), { target: { value: '2' } });
    fireEvent.change(screen.getByLabelText('Substitute for TRS-FL420-SG'), { target: { value: '13' } });
    fireEvent.change(screen.getByLabelText('Packs of the substitute for TRS-FL420-SG'), { target: { value: '2' } });
    fireEvent.change(screen.getByLabelText('Message to the contractor'), { target: { value: 'Slate grey is short; brindle to make up.' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send the offer' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/orders/1/proposals'));
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({
        revision: 1,
        lines: [{ line_id: 101, confirmed_quantity: 6, back_order_quantity: 2, substitute: { product_id: 13, quantity: 2 } }],
        message: 'Slate grey is short; brindle to make up.',
      });
    });
  });

  it('refuses now and to follow adding up to more than is open, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<OfferChangesForm order={orderFixture()} stock={stock} />);
    fireEvent.change(screen.getByLabelText('Packs to follow of TRS-RHR-SG'), { target: { value: '1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send the offer' }));
    expect(await screen.findByText('now and to follow come to 6, more than the 5 packs open')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });
});
