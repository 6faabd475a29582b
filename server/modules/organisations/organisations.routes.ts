import { idParamsSchema } from '../../../shared/schemas/members.schema';
import type { Db } from '../../db/knex';
import { currentUser } from '../../auth/policy';
import { AppError } from '../../http/app-error';
import { apiRouter } from '../../http/endpoint';
import { organisationsRepository } from './organisations.repository';

const publicBranch = ({ id, name, address, town, phone }: { id: number; name: string; address: string; town: string; phone: string | null }) => ({
  id,
  name,
  address,
  town,
  phone,
});

export function organisationsRoutes(db: Db) {
  const r = apiRouter();
  const organisations = organisationsRepository(db);

  r.get('/organisation', { access: { action: 'organisation:read' } }, async (req, res) => {
    const { organisation } = currentUser(req);
    const branches = organisation.kind === 'merchant' ? await organisations.listBranches(organisation.id) : [];
    res.json({ ...organisation, branches: branches.map(publicBranch) });
  });

  r.get('/branches/:id', { access: { action: 'branches:read' }, params: idParamsSchema }, async (req, res, { params }) => {
    const branch = await organisations.findBranch(currentUser(req).organisation.id, params.id);
    if (!branch) throw AppError.notFound('Branch');
    res.json(publicBranch(branch));
  });

  return r.router;
}
