import type { Invoice } from '../../shared/schemas/invoice.schema';

/**
 * An invented invoice for component tests: two packs' worth at Tollerbeck Yard to Brackenfold
 * Roofworks, £614.40 and £122.88 tax, nothing paid, paid by card on delivery. Firms and places are made up.
 */
export function invoiceFixture(overrides: Partial<Invoice> = {}): Invoice {
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
    due_date: null,
    pay_by: 'card',
    subtotal: 61_440,
    tax_total: 12_288,
    total: 73_728,
    credited: 0,
    paid: 0,
    balance: 73_728,
    overdue: false,
    basis: 'delivered',
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
