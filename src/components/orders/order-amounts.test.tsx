import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { OrderDetail as OrderDetailData } from '../../../shared/schemas/order.schema';
import { DeskOrderDetail } from '../../features/desk/components/desk-order-detail';
import { OrderDetail } from '../../features/orders/components/order-detail';
import { fixtureLine, orderFixture, stockFixture } from '../../test-utils/order-fixture';
import { renderWithProviders, stubFetch } from '../../test-utils/render-with-providers';

/**
 * An invented part-confirmation: 1,593 tiles asked at £1.28, 1,500 sent now and 93 to follow; and
 * 20 ridge pieces asked at £6.50 of which the desk could send 15 and dropped 5.
 */
function partConfirmed(overrides: Partial<OrderDetailData> = {}): OrderDetailData {
  const tile = {
    ...fixtureLine(101, 11, 'TRS-FL420-SG', 'Interlocking tile, slate grey', 1593),
    pack_size: 1,
    unit_price: 128,
    confirmed_quantity: 1500,
    back_order_quantity: 93,
    reserved_quantity: 1500,
    status: 'part_agreed' as const,
  };
  const ridge = { ...fixtureLine(102, 12, 'TRS-RHR-SG', 'Half-round ridge', 20), pack_size: 1, unit_price: 650, confirmed_quantity: 15, back_order_quantity: 0, reserved_quantity: 15, status: 'part_agreed' as const };
  return orderFixture({ status: 'confirmed', status_label: 'Confirmed', lines: [tile, ridge], allowed_actions: [], back_ordered_packs: 93, ...overrides });
}

const stock = { 'GET /api/branches/3/stock': { status: 200, body: { branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck' }, items: [stockFixture(11, 'TRS-FL420-SG', 56673)] } } };

const sides = [
  ['contractor', (order: OrderDetailData) => <OrderDetail order={order} />, '/orders/7'],
  ['merchant desk', (order: OrderDetailData) => <DeskOrderDetail order={order} />, '/desk/orders/7'],
] as const;

describe.each(sides)('the order’s amounts on the %s side', (_side, render, followPath) => {
  it('prices what comes now, what follows and what was dropped; the delivery amount is what the invoice charges', async () => {
    stubFetch(stock);
    renderWithProviders(render(partConfirmed()));
    // 1,500 × £1.28 + 15 × £6.50 = £1,920.00 + £97.50, not 1,593 tiles.
    expect(screen.getByTestId('amount-now').textContent).toBe('£2,017.50');
    expect(screen.getByTestId('amount-to-follow').textContent).toBe('£119.04');
    expect(screen.getByTestId('amount-dropped').textContent).toBe('£32.50');
    const amounts = screen.getByRole('region', { name: 'What the order comes to' });
    expect(amounts.textContent).toContain('93 × Interlocking tile, slate grey at £1.28 = £119.04');
    expect(amounts.textContent).toContain('5 × Half-round ridge at £6.50 = £32.50');
    expect(amounts.textContent).toContain('on a follow-up order, not started yet');
    expect(screen.queryByText(/Subtotal/)).toBeNull();
  });

  it('names the follow-up order the packs travel on', () => {
    stubFetch(stock);
    renderWithProviders(render(partConfirmed({ followed_by: { id: 7, reference: 'RL-000007', status: 'agreed', status_label: 'Agreed' } })));
    const amounts = screen.getByRole('region', { name: 'What the order comes to' });
    expect(within(amounts).getByRole('link', { name: 'RL-000007' }).getAttribute('href')).toBe(followPath);
  });

  it('writes every count with thousands separators', () => {
    stubFetch(stock);
    renderWithProviders(render(partConfirmed()));
    const table = screen.getByRole('table', { name: 'Lines of the order' });
    expect(within(table).getByText('1,593', { exact: false })).toBeTruthy();
    expect(within(table).getAllByText('1,500').length).toBeGreaterThan(0);
    expect(within(table).queryByText('1593')).toBeNull();
    expect(within(table).queryByText('1500')).toBeNull();
  });
});
