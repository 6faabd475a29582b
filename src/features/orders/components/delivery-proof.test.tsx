import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { DeliveryProof } from '../../../../shared/schemas/run.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { DeliveryProofCard } from './delivery-proof';

/** An invented proof: one line short and damaged, a signature and two photos. */
const proof: DeliveryProof = {
  order_id: 11,
  receiver_name: 'Gethin Marlow',
  delivered_at: '2027-03-01T09:41:00.000Z',
  recorded_by: { id: 8, name: 'Kofi Brennagh' },
  position: { lat: 53.1234567, lng: -2.7654321, accuracy_m: 12 },
  note: 'Left on the hardstanding by the cabin',
  signature_url: '/api/orders/11/delivery/signature',
  photos: [
    { id: 1, url: '/api/orders/11/delivery/photos/1', thumbnail_url: '/api/orders/11/delivery/photos/1/thumbnail', content_type: 'image/jpeg' },
    { id: 2, url: '/api/orders/11/delivery/photos/2', thumbnail_url: '/api/orders/11/delivery/photos/2/thumbnail', content_type: 'image/webp' },
  ],
  lines: [
    { line_id: 101, sku: 'TRS-FL420-SG', description: 'Interlocking tile, slate grey', unit: 'pack', sent: 10, handed_over: 8, short: 1, damaged: 1 },
    { line_id: 102, sku: 'TRS-RDG-SG', description: 'Dry ridge tile, slate grey', unit: 'pack', sent: 2, handed_over: 2, short: 0, damaged: 0 },
  ],
  credit_note_id: 4,
};

describe('DeliveryProofCard', () => {
  it('shows the receiver, the time, the signature, photo thumbnails opening the full photo and each line short or damaged', async () => {
    stubFetch({ 'GET /api/orders/11/delivery': { status: 200, body: proof } });
    renderWithProviders(<DeliveryProofCard orderId={11} status="delivered" />);
    expect(await screen.findByText('Gethin Marlow')).toBeTruthy();
    expect(screen.getByText(/recorded by Kofi Brennagh/)).toBeTruthy();
    expect(screen.getByRole('img', { name: 'Signature of Gethin Marlow' }).getAttribute('src')).toBe('/api/orders/11/delivery/signature');
    const photos = within(screen.getByRole('list', { name: 'Delivery photos' })).getAllByRole('link');
    expect(photos.map((a) => a.getAttribute('href'))).toEqual(['/api/orders/11/delivery/photos/1', '/api/orders/11/delivery/photos/2']);
    expect(within(photos[0]).getByRole('img').getAttribute('src')).toBe('/api/orders/11/delivery/photos/1/thumbnail');
    const row = screen.getByRole('row', { name: /Interlocking tile/ });
    expect(
      within(row)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['10', '8', '1', '1']);
    expect(screen.getByText(/credit note drafted/)).toBeTruthy();
    expect(screen.getByText('Left on the hardstanding by the cabin')).toBeTruthy();
  });

  it('asks for nothing before the order is delivered', () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<DeliveryProofCard orderId={11} status="on_the_road" />);
    expect(screen.queryByText('Proof of delivery')).toBeNull();
    expect(fetchMock).not.toHaveBeenCalled();
  });
});
