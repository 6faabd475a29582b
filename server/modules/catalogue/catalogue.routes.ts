import { systemsListQuerySchema } from '../../../shared/schemas/catalogue.schema';
import { idParamsSchema } from '../../../shared/schemas/members.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { CatalogueService } from './catalogue.service';

export function catalogueRoutes(catalogue: CatalogueService) {
  const r = apiRouter();

  r.get('/systems', { access: { action: 'systems:read' }, query: systemsListQuerySchema }, async (req, res, { query }) => {
    res.json({ systems: await catalogue.listSystems(currentUser(req), query) });
  });

  r.get('/systems/:id', { access: { action: 'systems:read' }, params: idParamsSchema }, async (req, res, { params }) => {
    res.json(await catalogue.getSystem(currentUser(req), params.id));
  });

  r.get('/merchant-branches', { access: { action: 'systems:read' } }, async (_req, res) => {
    const branches = await catalogue.listMerchantBranches();
    res.json({ branches: branches.map(({ id, name, town, merchant }) => ({ id, name, town, merchant })) });
  });

  return r.router;
}
