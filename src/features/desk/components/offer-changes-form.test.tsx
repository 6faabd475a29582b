import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { SubstituteFigures } from '../../../../shared/schemas/order.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { orderFixture, stockFixture } from '../../../test-utils/order-fixture';
import { OfferChangesForm } from './offer-changes-form';

const stock = [stockFixture(11, 'TRS-FL420-SG', 6), stockFixture(12, 'TRS-RHR-SG', 50), stockFixture(13, 'TRS-FL420-BR', 40)];
const csrf = { 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } };
const proposed = { 'POST /api/orders/1/proposals': { status: 201, body: { proposal_id: 9, order: orderFixture({ status: 'changes_offered' }) } } };
const option = (o: Record<string, unknown>) => ({ unit: 'pack', pack_size: 240, pack_price: 30_720, available: 40, reason: null, figures: null, ...o });

/** Invented engine figures for a brindle interlocking tile on the order's roof: more battens and a dearer bill. */
const figures: SubstituteFigures = {
  engine_version: '1.4.0',
  tile: { sku: 'TRS-FL420-BR', description: 'Interlocking tile, brindle', kind: 'single_lap', lowest_pitch_deg: 22.5 },
  refused_faces: [],
  rows: [
    {
      role: 'tile',
      label: 'Tiles',
      changes: true,
      before: { product_id: 11, sku: 'TRS-FL420-SG', description: 'Interlocking tile, slate grey', quantity: 2400, unit: 'tile', packs: 10, unit_price: 30_720, total: 307_200 },
      after: { product_id: 13, sku: 'TRS-FL420-BR', description: 'Interlocking tile, brindle', quantity: 2640, unit: 'tile', packs: 11, unit_price: 30_720, total: 337_920 },
    },
    {
      role: 'batten',
      label: 'Battens',
      changes: true,
      before: { product_id: 14, sku: 'TRS-BAT-3825', description: 'Batten 38 × 25', quantity: 60, unit: 'length', packs: 60, unit_price: 440, total: 26_400 },
      after: { product_id: 14, sku: 'TRS-BAT-3825', description: 'Batten 38 × 25', quantity: 66, unit: 'length', packs: 66, unit_price: 440, total: 29_040 },
    },
  ],
  not_counted: [],
  before_total: 333_600,
  after_total: 366_960,
  price_difference_minor: 33_360,
};

describe('OfferChangesForm', () => {
  it('offers part now, the rest to follow and a substitute with its pack arithmetic, sending only the lines that change', async () => {
    const fetchMock = stubFetch({
      ...csrf,
      ...proposed,
      'GET /api/orders/1/lines/102/substitutes': { status: 200, body: { line_id: 102, options: [option({ product_id: 15, sku: 'TRS-RCL-BR', name: 'Clay ridge', quantity: 3, suitable: true })] } },
    });
    renderWithProviders(<OfferChangesForm order={orderFixture()} stock={stock} />);
    fireEvent.change(screen.getByLabelText('Packs now of TRS-RHR-SG'), { target: { value: '2' } });
    fireEvent.click(screen.getByRole('button', { name: 'Find a substitute for TRS-RHR-SG' }));
    fireEvent.change(await screen.findByLabelText('Substitute for TRS-RHR-SG', {}, { timeout: 5000 }), { target: { value: '15' } });
    // The same quantity in the substitute's pack size, ready to change.
    expect((screen.getByLabelText('Packs of the substitute for TRS-RHR-SG') as HTMLInputElement).value).toBe('3');
    fireEvent.change(screen.getByLabelText('Message to the contractor'), { target: { value: 'Slate grey ridge is short; clay to make up.' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send the offer' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/orders/1/proposals'));
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({
        revision: 1,
        lines: [{ line_id: 102, confirmed_quantity: 2, back_order_quantity: 0, substitute: { product_id: 15, quantity: 3 } }],
        message: 'Slate grey ridge is short; clay to make up.',
      });
    });
  });

  it('offers a substitute tile only with the engine’s figures: unsuitable tiles refused, the whole line replaced, the bill side by side', async () => {
    const fetchMock = stubFetch({
      ...csrf,
      ...proposed,
      'GET /api/orders/1/lines/101/substitutes': {
        status: 200,
        body: {
          line_id: 101,
          options: [
            option({
              product_id: 16,
              sku: 'TRS-KP265-BR',
              name: 'Clay plain tile',
              quantity: 0,
              suitable: false,
              reason: 'not for this roof: Porch Front: 30° is below the lowest pitch TRS-KP265-BR may be laid at (35°)',
            }),
            option({ product_id: 13, sku: 'TRS-FL420-BR', name: 'Interlocking tile, brindle', quantity: 11, suitable: true, figures }),
          ],
        },
      },
    });
    renderWithProviders(<OfferChangesForm order={orderFixture()} stock={stock} />);
    fireEvent.click(screen.getByRole('button', { name: 'Find a substitute for TRS-FL420-SG' }));
    const select = await screen.findByLabelText('Substitute for TRS-FL420-SG', {}, { timeout: 5000 });
    const plain = within(select).getByRole('option', { name: /TRS-KP265-BR/ }) as HTMLOptionElement;
    expect(plain.disabled).toBe(true);
    expect(plain.textContent).toContain('Porch Front: 30° is below the lowest pitch');
    fireEvent.change(select, { target: { value: '13' } });
    const qty = screen.getByLabelText('Packs of the substitute for TRS-FL420-SG') as HTMLInputElement;
    expect(qty.value).toBe('11');
    expect(qty.readOnly).toBe(true);
    expect((screen.getByLabelText('Packs now of TRS-FL420-SG') as HTMLInputElement).value).toBe('0');
    const table = screen.getByRole('table', { name: 'TRS-FL420-SG and TRS-FL420-BR side by side' });
    expect(within(table).getByText('Battens')).toBeTruthy();
    expect(within(table).getByTestId('price-difference').textContent).toBe('(+£333.60)');
    fireEvent.click(screen.getByRole('button', { name: 'Send the offer' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/orders/1/proposals'));
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({ revision: 1, lines: [{ line_id: 101, confirmed_quantity: 0, back_order_quantity: 0, substitute: { product_id: 13, quantity: 11 } }] });
    });
  });

  it('refuses now and to follow adding up to more than is open, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<OfferChangesForm order={orderFixture()} stock={stock} />);
    fireEvent.change(screen.getByLabelText('Packs to follow of TRS-RHR-SG'), { target: { value: '1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send the offer' }));
    expect(await screen.findByText('now and to follow come to 6, more than the 5 packs open')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });
});
