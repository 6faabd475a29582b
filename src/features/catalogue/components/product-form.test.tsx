import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { productSchema } from '../../../../shared/schemas/price-list.schema';
import { productFixture, TILE_VALUES } from '../../../test-utils/product-fixture';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { ProductForm } from './product-form';

const csrf = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };
const type = (label: string | RegExp, value: string) => fireEvent.change(screen.getByLabelText(label), { target: { value } });
const sentBody = (fetchMock: ReturnType<typeof stubFetch>, method: string, path: string) => {
  const call = fetchMock.mock.calls.find(([url, init]) => String(url).endsWith(path) && init?.method === method);
  return call ? (JSON.parse(String(call[1]?.body)) as unknown) : undefined;
};
function fillCommon(sku: string, name: string, category: string, unit: string) {
  type('SKU', sku);
  type('Name', name);
  type('Category', category);
  type('Unit', unit);
  type('Pack size (units in one pack)', '1');
}

describe('ProductForm', () => {
  it('shows the tile fields for a tile and the nail fields, not the tile ones, for tile nails', () => {
    stubFetch({});
    renderWithProviders(<ProductForm />);
    expect(screen.queryByLabelText('Tile length (mm)')).toBeNull();
    type('Category', 'tile');
    const tile = screen.getByRole('region', { name: 'Technical fields for Tiles' });
    for (const label of [
      'Tile kind',
      'Tile length (mm)',
      'Tile width (mm)',
      'Weight of one tile (kg)',
      'Tiles per pallet',
      'Closed up (min)',
      'Nominal',
      'Spread (max)',
      'Band 1: from pitch (°)',
      'Band 1: minimum headlap (mm)',
    ]) {
      expect(within(tile).getByLabelText(label)).toBeTruthy();
    }
    type('Category', 'tile_nail');
    const nails = screen.getByRole('region', { name: 'Technical fields for Tile nails' });
    expect(within(nails).getByLabelText('Nail length (mm)')).toBeTruthy();
    expect(within(nails).getByLabelText('Shank diameter (mm)')).toBeTruthy();
    expect(within(nails).getByLabelText('Weight of one nail (g)')).toBeTruthy();
    expect(screen.queryByLabelText('Tile length (mm)')).toBeNull();
    expect(screen.queryByLabelText('Band 1: minimum headlap (mm)')).toBeNull();
  });

  it('adds a single-lap tile with its sizes in mm, cover, two headlap bands and the tax rate in basis points', async () => {
    const fetchMock = stubFetch({ ...csrf, 'POST /api/products': { status: 201, body: productFixture() } });
    renderWithProviders(<ProductForm />);
    fillCommon('TRS-FL420-BR', 'Stanmoor flat interlocking tile, brindle', 'tile', 'tile');
    type('Pack weight (kg)', '4.4');
    type('Tax rate (%)', '20');
    type('Tile kind', 'single_lap');
    type('Tile length (mm)', '420');
    type('Tile width (mm)', '330');
    // Side-lock play of about 3 mm either way: NHBC Standards 7.2.19 ("about 3 mm tolerance at the side joint").
    type('Closed up (min)', '297');
    type('Nominal', '300');
    type('Spread (max)', '303');
    // 75 mm headlap from 30° for concrete single-lap interlocking tiles: NHBC Standards 7.2.19, table "Pitch, gauge and lap".
    type('Band 1: from pitch (°)', '30');
    type('Band 1: minimum headlap (mm)', '75');
    fireEvent.click(screen.getByRole('button', { name: 'Add a pitch band' }));
    // A steeper band with a smaller lap: common practice (the tile maker's table gives the figures).
    type('Band 2: from pitch (°)', '35');
    type('Band 2: minimum headlap (mm)', '65');
    // 4.4 kg a tile, 180 a pallet: from memory, a typical concrete interlocking tile.
    type('Weight of one tile (kg)', '4.4');
    type('Tiles per pallet', '180');
    fireEvent.click(screen.getByRole('button', { name: 'Add the product' }));
    await waitFor(() =>
      expect(sentBody(fetchMock, 'POST', '/api/products')).toEqual({
        ...TILE_VALUES,
        technical: {
          kind: 'single_lap',
          length_mm: 420,
          width_mm: 330,
          cover_width_mm: { min: 297, nominal: 300, max: 303 },
          headlap_mm: [
            { from_pitch_deg: 30, min_mm: 75 },
            { from_pitch_deg: 35, min_mm: 65 },
          ],
          weight_kg: 4.4,
          per_pallet: 180,
        },
      }),
    );
    expect(await screen.findByText('TRS-FL420-BR is added to the catalogue.')).toBeTruthy();
  });

  it('refuses a single-lap tile without its cover width and a headlap as long as the tile, naming each, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<ProductForm />);
    fillCommon('TRS-FL420-BR', 'Stanmoor flat interlocking tile, brindle', 'tile', 'tile');
    type('Pack weight (kg)', '4.4');
    type('Tile kind', 'single_lap');
    type('Tile length (mm)', '420');
    type('Tile width (mm)', '330');
    type('Band 1: from pitch (°)', '30');
    type('Band 1: minimum headlap (mm)', '420');
    type('Weight of one tile (kg)', '4.4');
    type('Tiles per pallet', '180');
    fireEvent.click(screen.getByRole('button', { name: 'Add the product' }));
    expect(await screen.findByText('is required for a single-lap tile: give min, nominal and max (the side-lock play)')).toBeTruthy();
    expect(screen.getByText('must be less than the tile length (420 mm)')).toBeTruthy();
    expect(screen.getByLabelText('Band 1: minimum headlap (mm)').getAttribute('aria-invalid')).toBe('true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('adds tile nails with only the nail fields in technical', async () => {
    const fetchMock = stubFetch({ ...csrf, 'POST /api/products': { status: 201, body: productFixture({ sku: 'TRS-NT38-1K', category: 'tile_nail' }) } });
    renderWithProviders(<ProductForm />);
    fillCommon('TRS-NT38-1K', 'Aluminium tile nails 38 × 3.35 mm, 1 kg', 'tile_nail', 'box');
    type('Pack weight (kg)', '1');
    type('Tax rate (%)', '17.5');
    // 38 × 3.35 mm: common practice for a tile nail; the gram weight is from memory.
    type('Nail length (mm)', '38');
    type('Shank diameter (mm)', '3.35');
    type('Weight of one nail (g)', '0.9');
    fireEvent.click(screen.getByRole('button', { name: 'Add the product' }));
    await waitFor(() =>
      expect(sentBody(fetchMock, 'POST', '/api/products')).toEqual({
        sku: 'TRS-NT38-1K',
        name: 'Aluminium tile nails 38 × 3.35 mm, 1 kg',
        category: 'tile_nail',
        unit: 'box',
        pack_size: 1,
        pack_weight_kg: 1,
        tax_rate_bp: 1750,
        pallet_length_mm: 1200,
        pallet_width_mm: 1000,
        technical: { length_mm: 38, diameter_mm: 3.35, nail_g: 0.9 },
      }),
    );
  });

  it('shows the server’s field errors at their fields: a taken SKU (409) and a technical field (422)', async () => {
    stubFetch({
      ...csrf,
      'POST /api/products': [
        { status: 409, body: { error: { code: 'sku_taken', message: 'Another product already has the SKU TRS-RDG-01', details: [{ path: 'sku', message: 'is already used by another product' }] } } },
        { status: 422, body: { error: { code: 'validation_failed', message: 'The request has 1 problem', details: [{ path: 'technical.cover_mm', message: 'must be at most 1000' }] } } },
      ],
    });
    renderWithProviders(<ProductForm />);
    fillCommon('TRS-RDG-01', 'Half-round ridge, slate grey', 'ridge', 'piece');
    type('Pack weight (kg)', '4.6');
    type('Cover along the ridge (mm)', '420');
    type('Weight of one piece (kg)', '4.6');
    fireEvent.click(screen.getByRole('button', { name: 'Add the product' }));
    expect(await screen.findByText('is already used by another product')).toBeTruthy();
    expect(screen.getByLabelText('SKU').getAttribute('aria-invalid')).toBe('true');
    type('SKU', 'TRS-RDG-02');
    fireEvent.click(screen.getByRole('button', { name: 'Add the product' }));
    expect(await screen.findByText('must be at most 1000')).toBeTruthy();
    expect(screen.getByLabelText('Cover along the ridge (mm)').getAttribute('aria-invalid')).toBe('true');
  });

  it('sends the pallet footprint as typed, 1200 × 1000 mm unless changed, and shows the server’s refusal of it under its field', async () => {
    const fetchMock = stubFetch({
      ...csrf,
      'POST /api/products': [
        { status: 422, body: { error: { code: 'validation_failed', message: 'The request has 1 problem', details: [{ path: 'pallet_width_mm', message: 'is wider than any lorry deck of the branch' }] } } },
        { status: 201, body: productFixture({ sku: 'TRS-RDG-03', category: 'ridge', pallet_width_mm: 800 }) },
      ],
    });
    renderWithProviders(<ProductForm />);
    expect((screen.getByLabelText('Pallet length (mm)') as HTMLInputElement).value).toBe('1200');
    expect((screen.getByLabelText('Pallet width (mm)') as HTMLInputElement).value).toBe('1000');
    fillCommon('TRS-RDG-03', 'Half-round ridge, slate grey', 'ridge', 'piece');
    type('Pack weight (kg)', '4.6');
    type('Cover along the ridge (mm)', '420');
    type('Weight of one piece (kg)', '4.6');
    type('Pallet width (mm)', '2400');
    fireEvent.click(screen.getByRole('button', { name: 'Add the product' }));
    const width = screen.getByLabelText('Pallet width (mm)');
    await waitFor(() => expect(width.getAttribute('aria-invalid')).toBe('true'));
    const describedBy = (width.getAttribute('aria-describedby') ?? '').split(' ');
    expect(describedBy.map((id) => document.getElementById(id)?.textContent).join(' ')).toBe('is wider than any lorry deck of the branch');
    expect(screen.getByRole('alert').textContent).toContain('Check the fields marked below.');
    expect(document.activeElement).toBe(width);
    // 1200 × 800 mm: the smaller common pallet (common practice).
    type('Pallet width (mm)', '800');
    await waitFor(() => expect(width.getAttribute('aria-invalid')).toBeNull());
    fireEvent.click(screen.getByRole('button', { name: 'Add the product' }));
    await waitFor(() => expect(fetchMock.mock.calls.filter(([url]) => String(url).endsWith('/api/products'))).toHaveLength(2));
    const bodies = fetchMock.mock.calls.filter(([url]) => String(url).endsWith('/api/products')).map(([, init]) => JSON.parse(String(init?.body)) as unknown);
    expect(bodies[0]).toMatchObject({ pallet_length_mm: 1200, pallet_width_mm: 2400 });
    expect(bodies[1]).toMatchObject({ pallet_length_mm: 1200, pallet_width_mm: 800 });
    expect(await screen.findByText('TRS-RDG-03 is added to the catalogue.')).toBeTruthy();
  });

  it('changes a stored tile with PATCH, keeping its fields and the engine label not on the form', async () => {
    // 1.1 kg a plain tile, 1000 a pallet: from memory.
    const tile = productSchema.parse(
      productFixture({
        sku: 'TRS-PT265-RD',
        name: 'Stanmoor plain tile, red',
        pack_weight_kg: 1.1,
        pallet_width_mm: 800,
        technical: { name: 'Stanmoor plain', kind: 'double_lap', length_mm: 265, width_mm: 165, headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }], weight_kg: 1.1, per_pallet: 1000, nails_per_tile: 2 },
      }),
    );
    const fetchMock = stubFetch({ ...csrf, 'PATCH /api/products/21': { status: 200, body: tile } });
    renderWithProviders(<ProductForm product={tile} onDone={() => undefined} />);
    // Plain tile 265 × 165 mm at 65 mm headlap from 35°: NHBC Standards 7.2.19, table "Pitch, gauge and lap".
    expect((screen.getByLabelText('Band 1: minimum headlap (mm)') as HTMLInputElement).value).toBe('65');
    // A 1200 × 800 mm pallet: the smaller common size (common practice).
    expect((screen.getByLabelText('Pallet width (mm)') as HTMLInputElement).value).toBe('800');
    type('Tiles per pallet', '1,200');
    fireEvent.click(screen.getByRole('button', { name: 'Save the product' }));
    await waitFor(() =>
      expect(sentBody(fetchMock, 'PATCH', '/api/products/21')).toEqual({
        sku: 'TRS-PT265-RD',
        name: 'Stanmoor plain tile, red',
        category: 'tile',
        unit: 'tile',
        pack_size: 1,
        pack_weight_kg: 1.1,
        tax_rate_bp: 2000,
        pallet_length_mm: 1200,
        pallet_width_mm: 800,
        technical: { name: 'Stanmoor plain', kind: 'double_lap', length_mm: 265, width_mm: 165, headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }], weight_kg: 1.1, per_pallet: 1200, nails_per_tile: 2 },
      }),
    );
  });

  it('adds a flashing roll sold by the metre, with its weight as the only technical field', async () => {
    const fetchMock = stubFetch({ ...csrf, 'POST /api/products': { status: 201, body: productFixture({ sku: 'TRS-FLR-6M', category: 'flashing', unit: 'm', pack_size: 6 }) } });
    renderWithProviders(<ProductForm />);
    fillCommon('TRS-FLR-6M', 'Flashing roll 300 mm × 6 m', 'flashing', 'm');
    type('Pack size (units in one pack)', '6');
    type('Pack weight (kg)', '4.8');
    const technical = screen.getByRole('region', { name: 'Technical fields for Flashing' });
    expect(
      within(technical)
        .getAllByRole('textbox')
        .map((i) => i.getAttribute('name')),
    ).toEqual(['technical.weight_kg']);
    type('Weight of one length or roll (kg)', '4.8');
    fireEvent.click(screen.getByRole('button', { name: 'Add the product' }));
    await waitFor(() =>
      expect(sentBody(fetchMock, 'POST', '/api/products')).toEqual({
        sku: 'TRS-FLR-6M',
        name: 'Flashing roll 300 mm × 6 m',
        category: 'flashing',
        unit: 'm',
        pack_size: 6,
        pack_weight_kg: 4.8,
        tax_rate_bp: 2000,
        pallet_length_mm: 1200,
        pallet_width_mm: 1000,
        technical: { weight_kg: 4.8 },
      }),
    );
  });
});
