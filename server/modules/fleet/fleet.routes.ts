import { z } from 'zod';
import { createLorryBodySchema, updateLorryBodySchema } from '../../../shared/schemas/fleet.schema';
import { idParamsSchema } from '../../../shared/schemas/members.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { FleetService } from './fleet.service';

const listQuery = z.object({ archived: z.enum(['true', 'false']).default('false') });

export function fleetRoutes(fleet: FleetService) {
  const r = apiRouter();

  r.get('/branches/:id/lorries', { access: { action: 'slots:read' }, params: idParamsSchema, query: listQuery }, async (req, res, { params, query }) => {
    res.json(await fleet.list(currentUser(req), params.id, query.archived === 'true'));
  });
  r.post('/branches/:id/lorries', { access: { action: 'fleet:manage' }, params: idParamsSchema, body: createLorryBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await fleet.create(currentUser(req), params.id, body));
  });
  r.patch('/lorries/:id', { access: { action: 'fleet:manage' }, params: idParamsSchema, body: updateLorryBodySchema }, async (req, res, { params, body }) => {
    res.json(await fleet.update(currentUser(req), params.id, body));
  });
  r.delete('/lorries/:id', { access: { action: 'fleet:manage' }, params: idParamsSchema }, async (req, res, { params }) => {
    res.json(await fleet.archive(currentUser(req), params.id));
  });
  r.post('/lorries/:id/restore', { access: { action: 'fleet:manage' }, params: idParamsSchema }, async (req, res, { params }) => {
    res.json(await fleet.restore(currentUser(req), params.id));
  });
  r.get('/drivers', { access: { action: 'slots:read' } }, async (req, res) => {
    res.json(await fleet.drivers(currentUser(req)));
  });

  return r.router;
}
