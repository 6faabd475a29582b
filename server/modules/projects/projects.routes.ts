import { createProjectBodySchema, projectListQuerySchema, projectParamsSchema, updateProjectBodySchema } from '../../../shared/schemas/project.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { ProjectsService } from './projects.service';

export function projectsRoutes(projects: ProjectsService) {
  const r = apiRouter();

  r.post('/projects', { access: { action: 'projects:write' }, body: createProjectBodySchema }, async (req, res, { body }) => {
    res.status(201).json(await projects.create(currentUser(req), body));
  });

  r.get('/projects', { access: { action: 'projects:read' }, query: projectListQuerySchema }, async (req, res, { query }) => {
    res.json(await projects.list(currentUser(req), query));
  });

  r.get('/projects/:id', { access: { action: 'projects:read' }, params: projectParamsSchema }, async (req, res, { params }) => {
    res.json(await projects.get(currentUser(req), params.id));
  });

  r.patch('/projects/:id', { access: { action: 'projects:write' }, params: projectParamsSchema, body: updateProjectBodySchema }, async (req, res, { params, body }) => {
    res.json(await projects.update(currentUser(req), params.id, body));
  });

  r.post('/projects/:id/archive', { access: { action: 'projects:write' }, params: projectParamsSchema }, async (req, res, { params }) => {
    res.json(await projects.setArchived(currentUser(req), params.id, true));
  });

  r.post('/projects/:id/restore', { access: { action: 'projects:write' }, params: projectParamsSchema }, async (req, res, { params }) => {
    res.json(await projects.setArchived(currentUser(req), params.id, false));
  });

  return r.router;
}
