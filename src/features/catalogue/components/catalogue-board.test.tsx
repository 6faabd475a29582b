import { fireEvent, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { CatalogueBoard } from './catalogue-board';

const organisation = { id: 9, kind: 'merchant', name: 'Stanmoor Roofing Supplies', branches: [{ id: 3, name: 'Quillsby yard', address: '4 Kiln Lane', town: 'Quillsby', phone: null }] };

describe('CatalogueBoard', () => {
  it('opens the section named in the address and moves between sections by link', async () => {
    stubFetch({
      'GET /api/organisation': { status: 200, body: organisation },
      'GET /api/roof-systems?branch_id=3': { status: 200, body: { systems: [] } },
      'GET /api/products?archived=all': { status: 200, body: { products: [] } },
      'GET /api/products?archived=false': { status: 200, body: { products: [] } },
    });
    const { router } = renderWithProviders(<CatalogueBoard canImportPrices canImportStock />, { path: '/catalogue?section=roof-systems' });
    expect(await screen.findByText('No roof systems at this branch yet')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Roof systems' }).getAttribute('aria-current')).toBe('page');
    fireEvent.click(screen.getByRole('link', { name: 'Products' }));
    expect(await screen.findByText('No products here yet')).toBeTruthy();
    expect(router.state.location.search).toBe('?section=products');
  });
});
