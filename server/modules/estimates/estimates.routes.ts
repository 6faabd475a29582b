import { compareQuerySchema, createEstimateBodySchema, estimateParamsSchema } from '../../../shared/schemas/estimate.schema';
import { projectParamsSchema } from '../../../shared/schemas/project.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { EstimatesService } from './estimates.service';

export function estimatesRoutes(estimates: EstimatesService) {
  const r = apiRouter();

  r.post('/projects/:id/estimates', { access: { action: 'estimates:write' }, params: projectParamsSchema, body: createEstimateBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await estimates.create(currentUser(req), params.id, body));
  });

  r.get('/projects/:id/estimates', { access: { action: 'estimates:read' }, params: projectParamsSchema }, async (req, res, { params }) => {
    res.json(await estimates.listForProject(currentUser(req), params.id));
  });

  // Declared before /estimates/:id so "compare" is never read as an id.
  r.get('/estimates/compare', { access: { action: 'estimates:read' }, query: compareQuerySchema }, async (req, res, { query }) => {
    res.json(await estimates.compare(currentUser(req), query.a, query.b));
  });

  r.get('/estimates/:id', { access: { action: 'estimates:read' }, params: estimateParamsSchema }, async (req, res, { params }) => {
    res.json(await estimates.get(currentUser(req), params.id));
  });

  r.post('/estimates/:id/recompute', { access: { action: 'estimates:write' }, params: estimateParamsSchema }, async (req, res, { params }) => {
    res.status(201).json(await estimates.recompute(currentUser(req), params.id));
  });

  return r.router;
}
