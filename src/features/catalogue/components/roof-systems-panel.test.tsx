import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { RoofSystemsPanel } from './roof-systems-panel';

const branch = { id: 3, name: 'Quillsby yard', town: 'Quillsby', merchant: { id: 9, name: 'Stanmoor Roofing Supplies' } };
const system = {
  id: 40,
  name: 'Flat tile on 38 × 25',
  description: '',
  branch,
  settings: {},
  components: [{ role: 'tile', product_id: 1, sku: 'TRS-FL420-SG', name: 'Flat interlocking tile, slate grey' }],
  offerable: false,
  problems: ['has no ridge product', 'has no underlay product'],
  archived_at: null,
};

describe('RoofSystemsPanel', () => {
  it('says why a system is not offered and deletes it only after the second press', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'GET /api/roof-systems?branch_id=3': [
        { status: 200, body: { systems: [system] } },
        { status: 200, body: { systems: [] } },
      ],
      'GET /api/products?archived=all': { status: 200, body: { products: [] } },
      'DELETE /api/roof-systems/40': { status: 204 },
    });
    renderWithProviders(<RoofSystemsPanel branchId={3} canManage />);
    expect(await screen.findByText('Not offered: has no ridge product; has no underlay product')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Delete Flat tile on 38 × 25' }));
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'DELETE')).toBe(false);
    fireEvent.click(screen.getByRole('button', { name: 'Delete it' }));
    expect(await screen.findByText('Flat tile on 38 × 25 is taken off the branch.')).toBeTruthy();
    expect(fetchMock.mock.calls.some(([url, init]) => String(url).endsWith('/api/roof-systems/40') && init?.method === 'DELETE')).toBe(true);
    await waitFor(() => expect(screen.getByText('No roof systems at this branch yet')).toBeTruthy());
  });
});
