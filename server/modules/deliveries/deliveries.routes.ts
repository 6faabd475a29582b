import type { Request, RequestHandler } from 'express';
import { parse } from 'zod';
import * as z from 'zod/mini';
import { orderParamsSchema, recordDeliveryBodySchema } from '../../../shared/schemas/order.schema';
import { driverDayQuerySchema, recordProofBodySchema, runParamsSchema } from '../../../shared/schemas/run.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { DeliveriesService, DeliveryRecord } from './deliveries.service';
import { checkProofFiles, formFields, proofUpload } from './proof-files';

const photoParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()), photoId: z.coerce.number().check(z.int(), z.positive()) });
const draftParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });
const driverRunsQuerySchema = z.extend(driverDayQuerySchema, { driver_id: z.optional(z.coerce.number().check(z.int(), z.positive())) });

/** The body as a delivery record: the phone's fields, or the older JSON body (received_by, notes, delivered_quantity). */
// zod's classic `parse` throws the ZodError the error handler answers with 422 (a zod/mini schema's own
// `.parse` throws zod's core error, which it does not recognise).
function readRecord(req: Request): DeliveryRecord {
  const raw = (req.is('multipart/form-data') ? formFields(req.body as Record<string, unknown>) : (req.body ?? {})) as Record<string, unknown>;
  const older = 'received_by' in raw || 'notes' in raw || (Array.isArray(raw.lines) && raw.lines.some((l) => l && typeof l === 'object' && 'delivered_quantity' in l));
  if (older) {
    const b = parse(recordDeliveryBodySchema, raw);
    return {
      receiver_name: b.received_by,
      note: b.notes ?? '',
      delivered_at: b.delivered_at,
      lines: b.lines?.map((l) => ({ line_id: l.line_id, handed_over: l.delivered_quantity, short: null, damaged: 0 })),
    };
  }
  const b = parse(recordProofBodySchema, raw);
  return { receiver_name: b.receiver_name, note: b.note ?? '', delivered_at: b.delivered_at, lines: b.lines, position: b.position };
}

/**
 * The driver's day, cautions read, proof of delivery (record, read, its signature and photos by
 * access-checked routes only), the delivery note and the draft credit notes deliveries raise.
 * `idempotent` is the shared Idempotency-Key middleware: the phone's offline queue retries with one key.
 */
export function deliveriesRoutes(deliveries: DeliveriesService, idempotent: RequestHandler) {
  const r = apiRouter();

  r.get('/driver/runs', { access: { action: 'deliveries:read' }, query: driverRunsQuerySchema }, async (req, res, { query }) => {
    res.json(await deliveries.driverDay(currentUser(req), query));
  });

  r.post('/runs/:id/cautions-read', { access: { action: 'deliveries:read' }, params: runParamsSchema }, async (req, res, { params }) => {
    res.json(await deliveries.readCautions(currentUser(req), params.id));
  });

  r.post('/orders/:id/delivery', { access: { action: 'deliveries:record' }, params: orderParamsSchema, before: [proofUpload, idempotent] }, async (req, res, { params }) => {
    const record = readRecord(req);
    const files = await checkProofFiles(req.files as { signature?: Express.Multer.File[]; photos?: Express.Multer.File[] } | undefined);
    res.json(await deliveries.record(currentUser(req), params.id, record, files));
  });

  r.get('/orders/:id/delivery', { access: { action: 'deliveries:proof' }, params: orderParamsSchema }, async (req, res, { params }) => {
    res.json(await deliveries.proof(currentUser(req), params.id));
  });

  const sendImage = (res: Parameters<Parameters<typeof r.get>[2]>[1], f: { content_type: string; data: Buffer }) => {
    res.set('Cache-Control', 'private, max-age=3600');
    res.set('Content-Disposition', 'inline');
    res.type(f.content_type).send(f.data);
  };

  r.get('/orders/:id/delivery/signature', { access: { action: 'deliveries:proof' }, params: orderParamsSchema }, async (req, res, { params }) => {
    sendImage(res, await deliveries.file(currentUser(req), params.id, 'signature', null, false));
  });

  r.get('/orders/:id/delivery/photos/:photoId', { access: { action: 'deliveries:proof' }, params: photoParamsSchema }, async (req, res, { params }) => {
    sendImage(res, await deliveries.file(currentUser(req), params.id, 'photo', params.photoId, false));
  });

  r.get('/orders/:id/delivery/photos/:photoId/thumbnail', { access: { action: 'deliveries:proof' }, params: photoParamsSchema }, async (req, res, { params }) => {
    sendImage(res, await deliveries.file(currentUser(req), params.id, 'photo', params.photoId, true));
  });

  r.get('/orders/:id/delivery-note.pdf', { access: { action: 'deliveries:proof' }, params: orderParamsSchema }, async (req, res, { params }) => {
    const note = await deliveries.deliveryNote(currentUser(req), params.id);
    res.set('Cache-Control', 'private, no-store');
    res.type('application/pdf');
    res.set('Content-Disposition', `inline; filename="delivery-note-${note.reference}.pdf"`);
    res.send(note.pdf);
  });

  r.get('/credit-note-drafts', { access: { action: 'invoices:issue' } }, async (req, res) => {
    res.json(await deliveries.drafts(currentUser(req)));
  });

  r.post('/credit-note-drafts/:id/issue', { access: { action: 'invoices:issue' }, params: draftParamsSchema, before: [idempotent] }, async (req, res, { params }) => {
    res.json(await deliveries.issueDraft(currentUser(req), params.id));
  });

  r.get('/credit-note-drafts/:id', { access: { action: 'invoices:issue' }, params: draftParamsSchema }, async (req, res, { params }) => {
    res.json(await deliveries.draft(currentUser(req), params.id));
  });

  return r.router;
}
