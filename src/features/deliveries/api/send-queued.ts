import * as z from 'zod/mini';
import { apiClient, isApiError } from '../../../lib/api-client';
import type { QueuedCautionsRead, QueuedDelivery } from '../lib/outbox-types';

/**
 * Sends one delivery record: JSON when it has no pictures, otherwise multipart with the fields as a
 * JSON string named `data`, the signature as `signature` (PNG) and each photo as `photos`. The
 * Idempotency-Key made on the phone goes with every try, so a retry is recorded once.
 */
export async function sendDelivery(entry: QueuedDelivery): Promise<void> {
  const hasFiles = entry.signature !== null || entry.photos.length > 0;
  let body: unknown = entry.data;
  if (hasFiles) {
    const form = new FormData();
    form.append('data', JSON.stringify(entry.data));
    if (entry.signature) form.append('signature', entry.signature, 'signature.png');
    for (const photo of entry.photos) form.append('photos', photo.blob, photo.name);
    body = form;
  }
  await apiClient.post(`/api/orders/${entry.order_id}/delivery`, { body, headers: { 'Idempotency-Key': entry.key }, redirectOnUnauthenticated: false });
}

/** Records that the driver read a run's cautions. */
export async function sendCautionsRead(entry: QueuedCautionsRead): Promise<void> {
  await apiClient.post(`/api/runs/${entry.run_id}/cautions-read`, { headers: { 'Idempotency-Key': entry.key }, redirectOnUnauthenticated: false });
}

/** True when the order already has a proof of delivery on the server (a 404 says it has none). */
export async function deliveryIsRecorded(orderId: number): Promise<boolean> {
  try {
    await apiClient.get(`/api/orders/${orderId}/delivery`, { schema: z.looseObject({ order_id: z.number() }), redirectOnUnauthenticated: false });
    return true;
  } catch (error) {
    if (isApiError(error) && error.status === 404) return false;
    throw error;
  }
}
