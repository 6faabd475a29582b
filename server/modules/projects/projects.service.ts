import type { z } from 'zod';
import type { createProjectBodySchema, projectListQuerySchema, updateProjectBodySchema } from '../../../shared/schemas/project.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import { AppError } from '../../http/app-error';
import { projectsRepository } from './projects.repository';

type CreateValues = z.output<typeof createProjectBodySchema>;
type UpdateValues = z.output<typeof updateProjectBodySchema>;
type ListValues = z.output<typeof projectListQuerySchema>;

export function projectsService({ db }: Pick<AppDeps, 'db'>) {
  const projects = projectsRepository(db);

  async function get(user: AuthUser, id: number) {
    const project = await projects.find(user.organisation.id, id);
    if (!project) throw AppError.notFound('Site');
    return project;
  }

  return {
    async create(user: AuthUser, body: CreateValues) {
      const { buildings, ...values } = body;
      const id = await projects.create(user.organisation.id, user.id, values, buildings);
      return get(user, id);
    },

    async list(user: AuthUser, query: ListValues) {
      const { rows, total } = await projects.list(user.organisation.id, query);
      return { projects: rows, total, page: query.page, page_size: query.page_size };
    },

    get,

    async update(user: AuthUser, id: number, body: UpdateValues) {
      const { buildings, revision, ...values } = body;
      const existing = await get(user, id);
      if (existing.archived_at) throw AppError.conflict('project_archived', 'This site is archived; restore it before editing');
      const stale = () => AppError.conflict('project_changed', 'Someone else saved this site since you opened it; reload it and make your change again');
      if (existing.revision !== revision) throw stale();
      if (!(await projects.update(user.organisation.id, id, revision, values, buildings))) throw stale();
      return get(user, id);
    },

    async setArchived(user: AuthUser, id: number, archived: boolean) {
      if (!(await projects.setArchived(user.organisation.id, id, archived))) throw AppError.notFound('Site');
      return get(user, id);
    },

    /** The site of a use case that adds to it (schedule, estimate, order): it must be the caller's and open. */
    async requireOpen(user: AuthUser, id: number, trx: Db = db) {
      const project = await projects.findOpen(user.organisation.id, id, trx);
      if (!project) throw AppError.notFound('Site');
      if (project.archived_at) throw AppError.conflict('project_archived', 'This site is archived; restore it first');
      return project;
    },
  };
}

export type ProjectsService = ReturnType<typeof projectsService>;
