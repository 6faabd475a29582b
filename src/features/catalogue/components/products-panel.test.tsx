import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { ProductsPanel } from './products-panel';

const product = (id: number, sku: string, name: string, archived: boolean) => ({
  id,
  sku,
  name,
  category: 'ridge',
  unit: 'piece',
  pack_size: 1,
  pack_weight_kg: 4.6,
  tax_rate_bp: 2000,
  technical: { cover_mm: 420, weight_kg: 4.6 },
  pallet_length_mm: 1200,
  pallet_width_mm: 1000,
  branches: [],
  archived_at: archived ? '2026-11-20T10:00:00.000Z' : null,
  created_at: '2026-10-01T00:00:00.000Z',
  updated_at: '2026-10-01T00:00:00.000Z',
});
const live = product(3, 'TRS-RHR-SG', 'Half-round ridge, slate grey', false);
const old = product(4, 'TRS-ANG-RD', 'Angle ridge, red', true);
const csrf = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };

describe('ProductsPanel', () => {
  it('lists the catalogue, shows archived products on request and restores one', async () => {
    const fetchMock = stubFetch({
      ...csrf,
      'GET /api/products?archived=false': { status: 200, body: { products: [live] } },
      'GET /api/products?archived=true': [
        { status: 200, body: { products: [old] } },
        { status: 200, body: { products: [] } },
      ],
      'POST /api/products/4/restore': { status: 200, body: { ...old, archived_at: null } },
    });
    renderWithProviders(<ProductsPanel canManage />);
    const table = await screen.findByRole('table', { name: 'Products' });
    expect(within(table).getByText('TRS-RHR-SG')).toBeTruthy();
    expect(within(table).queryByText('TRS-ANG-RD')).toBeNull();
    fireEvent.change(screen.getByLabelText('Show'), { target: { value: 'true' } });
    fireEvent.click(await screen.findByRole('button', { name: 'Restore TRS-ANG-RD' }));
    expect(await screen.findByText('TRS-ANG-RD is back in the catalogue.')).toBeTruthy();
    expect(fetchMock.mock.calls.some(([url, init]) => String(url).endsWith('/api/products/4/restore') && init?.method === 'POST')).toBe(true);
    expect(await screen.findByText('Nothing is archived')).toBeTruthy();
  });

  it('archives a product with DELETE and says how to get it back', async () => {
    const fetchMock = stubFetch({
      ...csrf,
      'GET /api/products?archived=false': [
        { status: 200, body: { products: [live] } },
        { status: 200, body: { products: [] } },
      ],
      'DELETE /api/products/3': { status: 200, body: { ...live, archived_at: '2026-12-01T10:00:00.000Z' } },
    });
    renderWithProviders(<ProductsPanel canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Archive TRS-RHR-SG' }));
    expect(await screen.findByText('TRS-RHR-SG is archived; restore it from the archived list.')).toBeTruthy();
    expect(fetchMock.mock.calls.some(([url, init]) => String(url).endsWith('/api/products/3') && init?.method === 'DELETE')).toBe(true);
    await waitFor(() => expect(screen.queryByRole('table', { name: 'Products' })).toBeNull());
  });

  it('opens the form filled with the product to change it, and shows no change buttons to a read-only role', async () => {
    stubFetch({ 'GET /api/products?archived=false': { status: 200, body: { products: [live] } } });
    const { unmount } = renderWithProviders(<ProductsPanel canManage />);
    fireEvent.click(await screen.findByRole('button', { name: 'Edit TRS-RHR-SG' }));
    const form = screen.getByRole('form', { name: 'Change TRS-RHR-SG' });
    expect((within(form).getByLabelText('Cover along the ridge (mm)') as HTMLInputElement).value).toBe('420');
    unmount();
    renderWithProviders(<ProductsPanel canManage={false} />);
    await screen.findByRole('table', { name: 'Products' });
    expect(screen.queryByRole('button', { name: /Edit|Archive|Add a product/ })).toBeNull();
  });
});
