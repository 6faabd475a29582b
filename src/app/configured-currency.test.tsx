import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import type { InvoiceSummary } from '../../shared/schemas/invoice.schema';
import { ToastProvider } from '../components/ui/toast';
import { setAppCurrency } from '../lib/format';
import { createTestQueryClient, stubFetch } from '../test-utils/render-with-providers';
import { appRoutes } from './router';

const invoice: InvoiceSummary = {
  id: 41,
  number: 'INV-000041',
  status: 'unpaid',
  status_label: 'Unpaid',
  order: { id: 7, reference: 'RL-000007' },
  contractor: { id: 5, name: 'Polwith Roofing' },
  branch: { id: 1, name: 'Carnbrea Yard', town: 'Carnbrea', merchant: { id: 2, name: 'Carnbrea Tile Supplies' } },
  currency: 'EUR',
  issue_date: '2026-12-04',
  due_date: null,
  pay_by: 'card',
  subtotal: 100_000,
  tax_total: 20_000,
  total: 120_000,
  credited: 0,
  paid: 20_050,
  balance: 99_950,
  overdue: false,
};

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
  const queryClient = createTestQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: ['/invoices'] });
  render(
    <QueryClientProvider client={queryClient}>
      <ToastProvider>
        <RouterProvider router={router} />
      </ToastProvider>
    </QueryClientProvider>,
  );
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
