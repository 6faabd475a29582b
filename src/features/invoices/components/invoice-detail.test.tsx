import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Invoice } from '../../../../shared/schemas/invoice.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { InvoiceDetail } from './invoice-detail';

/** An invented account invoice, due in 30 days, nothing paid. */
function accountInvoice(overrides: Partial<Invoice> = {}): Invoice {
  return {
    id: 3,
    number: 'INV-000003',
    status: 'unpaid',
    status_label: 'Not paid yet',
    order: { id: 1, reference: 'RL-000001' },
    contractor: { id: 5, name: 'Brackenfold Roofworks' },
    branch: { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck', merchant: { id: 2, name: 'Tollerbeck Roofing Supplies' } },
    currency: 'GBP',
    issue_date: '2027-03-02',
    due_date: '2027-04-01',
    pay_by: 'account',
    subtotal: 61_440,
    tax_total: 12_288,
    total: 73_728,
    credited: 0,
    paid: 0,
    balance: 73_728,
    overdue: false,
    basis: 'confirmed',
    site_name: 'Hollin Brow',
    po_reference: '',
    lines: [],
    credit_notes: [],
    payments: [],
    card_payment: true,
    created_at: '2027-03-02 09:00:00',
    ...overrides,
  };
}

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
