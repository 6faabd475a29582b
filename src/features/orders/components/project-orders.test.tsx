import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { orderSummaryFixture, stubOrderListApi } from '../../../test-utils/order-book-fixture';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { ProjectOrders } from './project-orders';

describe('ProjectOrders', () => {
  it('shows the site’s orders in their table once its code and the orders have arrived', async () => {
    stubOrderListApi([orderSummaryFixture(12, { status: 'delivered' }), orderSummaryFixture(4, { status: 'confirmed' })], 2);
    renderWithProviders(<ProjectOrders projectId={3} />);
    const table = await screen.findByRole('table', { name: 'Orders of this site' }, { timeout: 5000 });
    expect(within(table).getAllByRole('row')).toHaveLength(3);
  });
});
