import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { memoryStorage } from '../lib/outbox';
import type { QueuedDelivery } from '../lib/outbox-types';
import { OutboxProvider } from '../lib/phone-outbox';
import { createTestOutbox } from '../lib/test-outbox';
import { OutboxPanel } from './outbox-panel';

const waiting: QueuedDelivery = {
  kind: 'delivery',
  key: '6f1c9a52-3d1e-4b7a-9c0e-2a4b6c8d0e1f',
  order_id: 12,
  reference: 'RL-000012',
  site_name: 'Quarry Rise',
  data: { receiver_name: 'Ffion Castell', note: '', delivered_at: '2027-03-01T10:05:00.000Z', lines: [{ line_id: 201, handed_over: 4, short: 0, damaged: 0 }] },
  signature: new Blob(['png'], { type: 'image/png' }),
  photos: [],
  queued_at: '2027-03-01T10:05:00.000Z',
  attempts: 1,
  state: 'waiting',
  last_error: 'Ridgeload could not be reached. Check the connection and try again.',
};

describe('OutboxPanel', () => {
  it('lists what waits to send and sends it on "Send now" with the key it was recorded with', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/orders/12/delivery': { status: 200, body: {} } });
    const storage = memoryStorage();
    await storage.put(waiting);
    const outbox = createTestOutbox({ storage, online: () => false });
    renderWithProviders(
      <OutboxProvider outbox={outbox}>
        <OutboxPanel />
      </OutboxProvider>,
    );
    expect(await screen.findByRole('heading', { name: 'Waiting to send: 1' })).toBeTruthy();
    expect(screen.getByTestId('waiting-entry').textContent).toContain('Delivery of RL-000012 at Quarry Rise, taken by Ffion Castell (signature)');
    fireEvent.click(screen.getByRole('button', { name: 'Send now' }));
    await waitFor(() => expect(screen.queryByRole('heading', { name: /Waiting to send/ })).toBeNull());
    expect(screen.getByText('Everything recorded on this phone has been sent.')).toBeTruthy();
    const call = fetchMock.mock.calls.find(([url]) => String(url) === '/api/orders/12/delivery');
    expect((call?.[1]?.headers as Record<string, string>)['Idempotency-Key']).toBe(waiting.key);
    expect(await storage.all()).toEqual([]);
  });
});
