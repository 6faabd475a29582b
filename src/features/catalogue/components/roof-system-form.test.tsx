import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { merchantRoofSystemSchema, productSchema } from '../../../../shared/schemas/price-list.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { RoofSystemForm } from './roof-system-form';

const csrf = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };
const product = (id: number, sku: string, name: string, category: string, archived = false) =>
  productSchema.parse({
    id,
    sku,
    name,
    category,
    unit: 'piece',
    pack_size: 1,
    pack_weight_kg: 1,
    tax_rate_bp: 2000,
    technical: {},
    pallet_length_mm: 1200,
    pallet_width_mm: 1000,
    branches: [],
    archived_at: archived ? '2026-11-01T00:00:00.000Z' : null,
    created_at: '2026-10-01T00:00:00.000Z',
    updated_at: '2026-10-01T00:00:00.000Z',
  });
const products = [
  product(1, 'TRS-FL420-SG', 'Flat interlocking tile, slate grey', 'tile'),
  product(2, 'TRS-FL420-BR', 'Flat interlocking tile, brindle', 'tile'),
  product(3, 'TRS-RHR-SG', 'Half-round ridge, slate grey', 'ridge'),
  product(4, 'TRS-BAT-3825', 'Treated batten 38 × 25 mm', 'batten'),
  product(5, 'TRS-NB65-1K', 'Batten nails 65 × 3.35 mm', 'batten_nail'),
  product(6, 'TRS-NT38-1K', 'Tile nails 38 × 3.35 mm', 'tile_nail'),
  product(7, 'TRS-UVP-50', 'Vapour-open underlay, 50 m roll', 'underlay'),
  product(8, 'TRS-OLD-TILE', 'Old tile, no longer sold', 'tile', true),
  product(9, 'TRS-EVC-5M', 'Eaves vent strip with comb filler, 5 m roll', 'eaves_vent'),
  product(10, 'TRS-VUC-2M', 'Verge undercloak strip 150 mm, 2 m length', 'verge_undercloak'),
  product(11, 'TRS-FLR-6M', 'Flashing roll 300 mm × 6 m', 'flashing'),
];
const branch = { id: 3, name: 'Quillsby yard', town: 'Quillsby', merchant: { id: 9, name: 'Stanmoor Roofing Supplies' } };
const savedSystem = (over: Record<string, unknown> = {}) => ({ id: 40, name: 'Flat tile on 38 × 25', description: '', branch, settings: {}, components: [], offerable: true, problems: [], archived_at: null, ...over });
const choose = (label: string, value: string) => fireEvent.change(screen.getByLabelText(label), { target: { value } });
const sentBody = (fetchMock: ReturnType<typeof stubFetch>, method: string, path: string) => {
  const call = fetchMock.mock.calls.find(([url, init]) => String(url).endsWith(path) && init?.method === method);
  return call ? (JSON.parse(String(call[1]?.body)) as unknown) : undefined;
};

describe('RoofSystemForm', () => {
  it('offers only products of each part’s category, leaving archived ones out', () => {
    stubFetch({});
    renderWithProviders(<RoofSystemForm branchId={3} products={products} />);
    const tiles = within(screen.getByLabelText('Tile'))
      .getAllByRole('option')
      .map((o) => o.textContent);
    expect(tiles).toEqual(['None', 'TRS-FL420-SG · Flat interlocking tile, slate grey', 'TRS-FL420-BR · Flat interlocking tile, brindle']);
    expect(
      within(screen.getByLabelText('Ridge tile'))
        .getAllByRole('option')
        .map((o) => o.textContent),
    ).toEqual(['None', 'TRS-RHR-SG · Half-round ridge, slate grey']);
    expect(screen.getByText('No hip products in the catalogue yet.')).toBeTruthy();
  });

  it('adds a roof system at the branch with the chosen product for each part', async () => {
    const fetchMock = stubFetch({ ...csrf, 'POST /api/roof-systems': { status: 201, body: savedSystem() } });
    renderWithProviders(<RoofSystemForm branchId={3} products={products} />);
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'Flat tile on 38 × 25' } });
    fireEvent.change(screen.getByLabelText('Description (optional)'), { target: { value: 'Brindle, for the Quillsby estates' } });
    choose('Tile', '2');
    choose('Ridge tile', '3');
    choose('Batten', '4');
    choose('Batten nail', '5');
    choose('Tile nail', '6');
    choose('Underlay', '7');
    fireEvent.click(screen.getByRole('button', { name: 'Add the roof system' }));
    await waitFor(() =>
      expect(sentBody(fetchMock, 'POST', '/api/roof-systems')).toEqual({
        branch_id: 3,
        name: 'Flat tile on 38 × 25',
        description: 'Brindle, for the Quillsby estates',
        settings: {},
        components: { tile: 2, ridge: 3, batten: 4, batten_nail: 5, tile_nail: 6, underlay: 7 },
      }),
    );
    expect(await screen.findByText('Flat tile on 38 × 25 is added; contractors can estimate with it.')).toBeTruthy();
  });

  it('shows the server’s refusal of a part at that part’s picker', async () => {
    stubFetch({
      ...csrf,
      'POST /api/roof-systems': {
        status: 422,
        body: { error: { code: 'validation_failed', message: 'The roof system has 1 problem', details: [{ path: 'components.ridge', message: 'TRS-RHR-SG is no longer sold: pick another ridge product' }] } },
      },
    });
    renderWithProviders(<RoofSystemForm branchId={3} products={products} />);
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'Flat tile on 38 × 25' } });
    choose('Tile', '1');
    choose('Ridge tile', '3');
    fireEvent.click(screen.getByRole('button', { name: 'Add the roof system' }));
    expect(await screen.findByText('TRS-RHR-SG is no longer sold: pick another ridge product')).toBeTruthy();
    expect(screen.getByLabelText('Ridge tile').getAttribute('aria-invalid')).toBe('true');
  });

  it('changes a system with PATCH, sending every part still chosen (one set to None is taken off) and leaving its settings out so the stored ones stand', async () => {
    const system = merchantRoofSystemSchema.parse(
      savedSystem({
        description: 'Brindle, for the Quillsby estates',
        // 400 mm rafter centres: common practice for trussed rafters.
        settings: { rafter_spacing_mm: 400, waste_pct: { tiles: 3 } },
        components: [
          { role: 'tile', product_id: 8, sku: 'TRS-OLD-TILE', name: 'Old tile, no longer sold' },
          { role: 'ridge', product_id: 3, sku: 'TRS-RHR-SG', name: 'Half-round ridge, slate grey' },
          { role: 'underlay', product_id: 7, sku: 'TRS-UVP-50', name: 'Vapour-open underlay, 50 m roll' },
        ],
      }),
    );
    const fetchMock = stubFetch({ ...csrf, 'PATCH /api/roof-systems/40': { status: 200, body: savedSystem({ offerable: false, problems: ['has no batten product'] }) } });
    renderWithProviders(<RoofSystemForm branchId={3} products={products} system={system} onDone={() => undefined} />);
    // The archived tile it holds is still shown, so saving does not drop it unseen.
    expect((screen.getByLabelText('Tile') as HTMLSelectElement).value).toBe('8');
    choose('Underlay', '');
    choose('Batten', '4');
    fireEvent.click(screen.getByRole('button', { name: 'Save the roof system' }));
    await waitFor(() =>
      expect(sentBody(fetchMock, 'PATCH', '/api/roof-systems/40')).toEqual({
        name: 'Flat tile on 38 × 25',
        description: 'Brindle, for the Quillsby estates',
        components: { tile: 8, ridge: 3, batten: 4 },
      }),
    );
    expect(await screen.findByText('Flat tile on 38 × 25 is saved; it is not offered yet: has no batten product.')).toBeTruthy();
  });

  it('offers the products sold by the metre as optional parts and sends the ones chosen', async () => {
    const fetchMock = stubFetch({ ...csrf, 'POST /api/roof-systems': { status: 201, body: savedSystem() } });
    renderWithProviders(<RoofSystemForm branchId={3} products={products} />);
    expect(
      within(screen.getByLabelText('Flashing (by the metre) (optional)'))
        .getAllByRole('option')
        .map((o) => o.textContent),
    ).toEqual(['None', 'TRS-FLR-6M · Flashing roll 300 mm × 6 m']);
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'Flat tile on 38 × 25' } });
    choose('Tile', '1');
    choose('Ridge tile', '3');
    choose('Batten', '4');
    choose('Batten nail', '5');
    choose('Tile nail', '6');
    choose('Underlay', '7');
    choose('Eaves ventilation (by the metre) (optional)', '9');
    choose('Verge undercloak (by the metre) (optional)', '10');
    choose('Flashing (by the metre) (optional)', '11');
    fireEvent.click(screen.getByRole('button', { name: 'Add the roof system' }));
    await waitFor(() =>
      expect(sentBody(fetchMock, 'POST', '/api/roof-systems')).toMatchObject({
        components: { tile: 1, ridge: 3, batten: 4, batten_nail: 5, tile_nail: 6, underlay: 7, eaves_vent: 9, verge_undercloak: 10, flashing: 11 },
      }),
    );
  });
});
