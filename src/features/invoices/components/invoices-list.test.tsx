import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { InvoicesList } from './invoices-list';

/** Answers GET /api/invoices with no invoices whatever is asked, recording each query. */
function stubInvoices(): URLSearchParams[] {
  const queries: URLSearchParams[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL) => {
      const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
      queries.push(url.searchParams);
      return new Response(JSON.stringify({ invoices: [], total: 0, page: 1, page_size: 50 }), { status: 200, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return queries;
}

describe('InvoicesList filter', () => {
  it('asks for every invoice first, then only those in the chosen state, and every one again', async () => {
    const queries = stubInvoices();
    renderWithProviders(<InvoicesList />);
    await waitFor(() => expect(queries.length).toBeGreaterThan(0));
    expect(queries.at(-1)?.has('status')).toBe(false);
    fireEvent.change(await screen.findByRole('combobox', { name: 'State' }), { target: { value: 'part_paid' } });
    await waitFor(() => expect(queries.at(-1)?.get('status')).toBe('part_paid'));
    fireEvent.change(screen.getByRole('combobox', { name: 'State' }), { target: { value: '' } });
    await waitFor(() => expect(queries.at(-1)?.has('status')).toBe(false));
  });
});
