import { idParamsSchema } from '../../../shared/schemas/members.schema';
import type { OrderLine } from '../../../shared/schemas/order.schema';
import { createSlotBodySchema, generateSlotsBodySchema, loadingSheetQuerySchema, slotsQuerySchema, updateSlotBodySchema } from '../../../shared/schemas/slot.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { SlotsService } from './slots.service';

export function slotsRoutes(slots: SlotsService, linesOf: (orderId: number) => Promise<OrderLine[]>) {
  const r = apiRouter();

  r.get('/branches/:id/slots', { access: { action: 'slots:read' }, params: idParamsSchema, query: slotsQuerySchema }, async (req, res, { params, query }) => {
    res.json(await slots.day(currentUser(req), params.id, query.date));
  });
  r.post('/branches/:id/slots', { access: { action: 'fleet:manage' }, params: idParamsSchema, body: createSlotBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await slots.create(currentUser(req), params.id, body));
  });
  r.post('/branches/:id/slots/generate', { access: { action: 'fleet:manage' }, params: idParamsSchema, body: generateSlotsBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await slots.generate(currentUser(req), params.id, body));
  });
  r.get('/slots/:id', { access: { action: 'slots:read' }, params: idParamsSchema }, async (req, res, { params }) => {
    res.json(await slots.get(currentUser(req), params.id));
  });
  r.patch('/slots/:id', { access: { action: 'fleet:manage' }, params: idParamsSchema, body: updateSlotBodySchema }, async (req, res, { params, body }) => {
    res.json(await slots.update(currentUser(req), params.id, body));
  });
  r.delete('/slots/:id', { access: { action: 'fleet:manage' }, params: idParamsSchema }, async (req, res, { params }) => {
    await slots.remove(currentUser(req), params.id);
    res.status(204).end();
  });
  r.get('/deliveries', { access: { action: 'deliveries:read' }, query: loadingSheetQuerySchema }, async (req, res, { query }) => {
    res.json(await slots.loadingSheet(currentUser(req), query, linesOf));
  });

  return r.router;
}
