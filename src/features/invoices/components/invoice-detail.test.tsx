import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Invoice } from '../../../../shared/schemas/invoice.schema';
import { invoiceFixture } from '../../../test-utils/invoice-fixture';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { InvoiceDetail } from './invoice-detail';

/** An invented account invoice, due in 30 days, nothing paid. */
const accountInvoice = (overrides: Partial<Invoice> = {}) => invoiceFixture({ due_date: '2027-04-01', pay_by: 'account', basis: 'confirmed', ...overrides });

describe('InvoiceDetail for a contractor on account', () => {
  it('offers card payment of an open account invoice beside the due date', () => {
    stubFetch({});
    renderWithProviders(<InvoiceDetail invoice={accountInvoice()} canCredit={false} canPay returned={null} orderPath="/orders/1" />);
    expect(screen.getByRole('button', { name: 'Pay £737.28 by card' })).toBeTruthy();
    expect(screen.getByText(/pay by the due date \(.*\) as usual, or by card now/)).toBeTruthy();
  });

  it('shows no card button when the merchant turned card payment off for the account', () => {
    stubFetch({});
    renderWithProviders(<InvoiceDetail invoice={accountInvoice({ card_payment: false })} canCredit={false} canPay returned={null} orderPath="/orders/1" />);
    expect(screen.queryByRole('button', { name: /by card/ })).toBeNull();
    expect(screen.getByText(/Pay by the due date on your account terms/)).toBeTruthy();
  });
});
