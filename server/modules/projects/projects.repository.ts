import type { Project, ProjectSummary } from '../../../shared/schemas/project.schema';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';

export interface ProjectValues {
  name: string;
  reference: string;
  site_address: string;
  site_postcode: string;
  contact_name: string;
  contact_phone: string;
  vehicle_access: Project['vehicle_access'];
  crane_lift: Project['crane_lift'];
  overhead_lines: Project['overhead_lines'];
  set_down_place: string;
  access_notes: string;
}

export interface BuildingValues {
  name: string;
  kind: 'building' | 'plot';
  notes: string;
}

export interface ListFilter {
  q?: string;
  sort: 'name' | 'created_at' | 'updated_at' | 'site_address';
  dir: 'asc' | 'desc';
  page: number;
  page_size: number;
  archived: 'false' | 'true' | 'all';
}

const SUMMARY_COLUMNS = ['p.id', 'p.name', 'p.reference', 'p.site_address', 'p.site_postcode', 'p.contact_name', 'p.contact_phone', 'p.archived_at', 'p.created_at', 'p.updated_at'];
const DETAIL_COLUMNS = [...SUMMARY_COLUMNS, 'p.revision', 'p.vehicle_access', 'p.crane_lift', 'p.overhead_lines', 'p.set_down_place', 'p.access_notes'];

/** Special characters of LIKE are matched literally, so a search for "50%" finds "50%". */
const likePattern = (q: string) => `%${q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

export function projectsRepository(db: Db) {
  async function addCounts<T extends { id: number }>(rows: T[], trx: Db): Promise<(T & Pick<ProjectSummary, 'building_count' | 'schedule' | 'estimate_count'>)[]> {
    if (rows.length === 0) return [];
    const ids = rows.map((r) => r.id);
    const buildings = await trx('project_buildings').whereIn('project_id', ids).groupBy('project_id').select('project_id').count({ n: '*' });
    const estimates = await trx('estimates').whereIn('project_id', ids).groupBy('project_id').select('project_id').count({ n: '*' });
    const latest = await trx('schedules as s')
      .whereIn('s.project_id', ids)
      .whereNotExists(function () {
        this.select('*').from('schedules as s2').whereRaw('?? = ??', ['s2.project_id', 's.project_id']).andWhereRaw('?? > ??', ['s2.version', 's.version']);
      })
      .select('s.id', 's.project_id', 's.version', 's.face_count');
    const count = (list: { project_id: number; n: unknown }[], id: number) => Number(list.find((x) => x.project_id === id)?.n ?? 0);
    return rows.map((r) => {
      const s = latest.find((x) => x.project_id === r.id);
      return {
        ...r,
        building_count: count(buildings as { project_id: number; n: unknown }[], r.id),
        estimate_count: count(estimates as { project_id: number; n: unknown }[], r.id),
        schedule: s ? { id: s.id, version: s.version, face_count: s.face_count } : null,
      };
    });
  }

  async function replaceBuildings(projectId: number, buildings: BuildingValues[], trx: Db) {
    await trx('project_buildings').where({ project_id: projectId }).delete();
    if (buildings.length > 0) {
      await trx('project_buildings').insert(buildings.map((b, i) => ({ project_id: projectId, position: i + 1, ...b })));
    }
  }

  return {
    async create(organisationId: number, userId: number, values: ProjectValues, buildings: BuildingValues[]): Promise<number> {
      return db.transaction(async (trx) => {
        const now = nowIso();
        const [row] = await trx('projects')
          .insert({ organisation_id: organisationId, ...values, created_by: userId, created_at: now, updated_at: now })
          .returning('id');
        const id = (row as { id: number }).id;
        await replaceBuildings(id, buildings, trx);
        return id;
      });
    },

    async list(organisationId: number, f: ListFilter): Promise<{ rows: ProjectSummary[]; total: number }> {
      const base = () => {
        const q = db('projects as p').where('p.organisation_id', organisationId);
        if (f.archived === 'false') q.whereNull('p.archived_at');
        if (f.archived === 'true') q.whereNotNull('p.archived_at');
        if (f.q) {
          const pattern = likePattern(f.q);
          q.where((w) => {
            for (const col of ['p.name', 'p.reference', 'p.site_address', 'p.site_postcode', 'p.contact_name']) {
              w.orWhereRaw(`lower(??) like ? escape '\\'`, [col, pattern]);
            }
          });
        }
        return q;
      };
      const totalRow = await base().count({ n: '*' }).first();
      const rows = await base()
        .select(SUMMARY_COLUMNS)
        .orderBy([
          { column: `p.${f.sort}`, order: f.dir },
          { column: 'p.id', order: f.dir },
        ])
        .limit(f.page_size)
        .offset((f.page - 1) * f.page_size);
      return { rows: await addCounts(rows, db), total: Number(totalRow?.n ?? 0) };
    },

    async find(organisationId: number, id: number, trx: Db = db): Promise<Project | undefined> {
      const row = await trx('projects as p').where({ 'p.organisation_id': organisationId, 'p.id': id }).select(DETAIL_COLUMNS).first();
      if (!row) return undefined;
      const [withCounts] = await addCounts([row], trx);
      const buildings = await trx('project_buildings').where({ project_id: id }).orderBy('position').select('id', 'name', 'kind', 'notes');
      return { ...withCounts, buildings } as Project;
    },

    /** Whether the site is the organisation's and still open (not archived). */
    async findOpen(organisationId: number, id: number, trx: Db = db): Promise<{ id: number; archived_at: string | null } | undefined> {
      return trx('projects').where({ organisation_id: organisationId, id }).select('id', 'archived_at').first();
    },

    /** Saves an edit made on `revision`; false when the site is not there or has moved on since. */
    async update(organisationId: number, id: number, revision: number, values: Partial<ProjectValues>, buildings?: BuildingValues[]): Promise<boolean> {
      return db.transaction(async (trx) => {
        const n = await trx('projects')
          .where({ organisation_id: organisationId, id, revision })
          .update({ ...values, revision: revision + 1, updated_at: nowIso() });
        if (n === 0) return false;
        if (buildings) await replaceBuildings(id, buildings, trx);
        return true;
      });
    },

    async setArchived(organisationId: number, id: number, archived: boolean): Promise<boolean> {
      const now = nowIso();
      const n = await db('projects')
        .where({ organisation_id: organisationId, id })
        .update({ archived_at: archived ? now : null, updated_at: now });
      return n > 0;
    },
  };
}

export type ProjectsRepository = ReturnType<typeof projectsRepository>;
