import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { setAppCurrency } from '../lib/format';
import { invoiceFixture } from '../test-utils/invoice-fixture';
import { renderRoutes, stubFetch } from '../test-utils/render-with-providers';
import { appRoutes } from './router';

/** An unpaid invoice of 1,200.00 with 200.50 paid, in the currency the server keeps (the list shows it in the session's). */
const invoice = invoiceFixture({ id: 41, number: 'INV-000041', currency: 'EUR', subtotal: 100_000, tax_total: 20_000, total: 120_000, paid: 20_050, balance: 99_950 });

/** The invoices page of a contractor's estimator, signed in on a server whose CURRENCY is `currency`. */
function openInvoices(currency: string) {
  stubFetch({
    'GET /api/auth/session': {
      status: 200,
      body: {
        session: {
          user: { id: 11, email: 'tamsin@polwith.test', name: 'Tamsin Rowe', role: 'contractor_owner' },
          organisation: { id: 5, name: 'Polwith Roofing', kind: 'contractor' },
          calendar: { time_zone: 'Europe/London', today: '2026-12-07' },
          currency,
        },
      },
    },
    'GET /api/dev/outbox': { status: 200, body: { messages: [] } },
    'GET /api/invoices?page=1&page_size=50': { status: 200, body: { invoices: [invoice], total: 1, page: 1, page_size: 50 } },
  });
  renderRoutes(appRoutes, { path: '/invoices' });
}

const amounts = async () => {
  const row = (await screen.findByRole('link', { name: /INV-000041/ }, { timeout: 15_000 })).closest('tr')!;
  return within(row)
    .getAllByRole('cell')
    .map((cell) => cell.textContent)
    .filter((text) => /\d\.\d\d$/.test(text ?? ''));
};

afterEach(() => setAppCurrency('GBP'));

describe('amounts on a page are in the configured currency', () => {
  it('shows euros when the session names EUR', async () => {
    openInvoices('EUR');
    expect(await amounts()).toEqual(['€1,200.00', '€999.50']);
  }, 30_000);

  it('shows pounds when the session names GBP', async () => {
    openInvoices('GBP');
    expect(await amounts()).toEqual(['£1,200.00', '£999.50']);
  }, 30_000);
});
