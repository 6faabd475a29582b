import { z } from 'zod';
import { estimateParamsSchema } from '../../../shared/schemas/estimate.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { EstimatesService } from '../estimates/estimates.service';
import type { ProjectsService } from '../projects/projects.service';
import { exportsService } from './exports.service';

const csvQuerySchema = z.object({ table: z.enum(['bill', 'faces']).default('bill') });

export function exportsRoutes(estimates: EstimatesService, projects: ProjectsService) {
  const r = apiRouter();
  const exports = exportsService(estimates, projects);

  r.get('/estimates/:id/export.xlsx', { access: { action: 'estimates:read' }, params: estimateParamsSchema }, async (req, res, { params }) => {
    const buffer = await exports.xlsx(currentUser(req), params.id);
    res.type('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    res.attachment(`estimate-${params.id}.xlsx`);
    res.send(buffer);
  });

  r.get('/estimates/:id/export.csv', { access: { action: 'estimates:read' }, params: estimateParamsSchema, query: csvQuerySchema }, async (req, res, { params, query }) => {
    const text = await exports.csv(currentUser(req), params.id, query.table);
    res.type('text/csv; charset=utf-8');
    res.attachment(`estimate-${params.id}-${query.table === 'faces' ? 'faces' : 'bill-of-materials'}.csv`);
    res.send(text);
  });

  return r.router;
}
