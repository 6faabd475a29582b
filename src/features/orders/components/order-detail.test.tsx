import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { OrderDetail as OrderDetailData } from '../../../../shared/schemas/order.schema';
import { fixtureLine, orderFixture } from '../../../test-utils/order-fixture';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { OrderDetail } from './order-detail';

/** An invented confirmed order of Brackenfold Roofworks with 4 tile packs back-ordered. */
function contractorOrder(overrides: Partial<OrderDetailData> = {}): OrderDetailData {
  return orderFixture({
    status: 'confirmed',
    status_label: 'Confirmed',
    revision: 2,
    subtotal: 30_720 * 10,
    line_count: 1,
    updated_at: '2027-02-21 09:00:00',
    lines: [{ ...fixtureLine(101, 11, 'TRS-FL420-SG', 'Interlocking tile, slate grey', 10), confirmed_quantity: 6, back_order_quantity: 4, reserved_quantity: 6, status: 'part_agreed' }],
    allowed_actions: [],
    confirmed_at: '2027-02-21 09:00:00',
    back_ordered_packs: 4,
    ...overrides,
  });
}

const linked = () => screen.queryByRole('list', { name: 'Back-ordered packs' });

describe('OrderDetail (contractor) and back-ordered packs', () => {
  it('says the back-ordered packs will follow as a separate order while none is started', () => {
    stubFetch({});
    renderWithProviders(<OrderDetail order={contractorOrder()} />);
    expect(linked()?.textContent).toContain('4 back-ordered packs follow as a separate order once the merchant has the stock');
    expect(within(linked()!).queryByRole('link')).toBeNull();
  });

  it('links to the order carrying the packs once the merchant has started it, and drops the promise', () => {
    stubFetch({});
    renderWithProviders(<OrderDetail order={contractorOrder({ followed_by: { id: 7, reference: 'RL-000007', status: 'agreed', status_label: 'Changes agreed, waiting for confirmation' } })} />);
    expect(linked()?.textContent).toContain('The back-ordered packs follow as RL-000007 (Changes agreed, waiting for confirmation)');
    expect(screen.getByRole('link', { name: 'RL-000007' }).getAttribute('href')).toBe('/orders/7');
    expect(linked()?.textContent).not.toContain('separate order');
  });

  it('links a follow-up order to the order whose packs it carries', () => {
    stubFetch({});
    renderWithProviders(
      <OrderDetail order={contractorOrder({ id: 7, reference: 'RL-000007', back_ordered_packs: 0, follows: { id: 1, reference: 'RL-000001', status: 'delivered', status_label: 'Delivered' } })} />,
    );
    expect(linked()?.textContent).toContain('Carries the back-ordered packs of RL-000001 (Delivered)');
    expect(screen.getByRole('link', { name: 'RL-000001' }).getAttribute('href')).toBe('/orders/1');
  });

  it('promises nothing on an order with nothing back-ordered, or one turned down', () => {
    stubFetch({});
    const { unmount } = renderWithProviders(<OrderDetail order={contractorOrder({ back_ordered_packs: 0 })} />);
    expect(linked()).toBeNull();
    unmount();
    renderWithProviders(<OrderDetail order={contractorOrder({ status: 'turned_down', status_label: 'Turned down by the merchant' })} />);
    expect(linked()).toBeNull();
  });
});
