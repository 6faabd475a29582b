import type { Opening } from '../../../shared/schemas/openings.schema';
import type { Face } from '../../../shared/schemas/schedule.schema';
import type { ScheduleVersion, StoredFace, StoredOpening } from '../../../shared/schemas/schedule-upload.schema';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';

export interface ScheduleWithFaces extends ScheduleVersion {
  faces: StoredFace[];
  openings: StoredOpening[];
}

const VERSION_COLUMNS = ['s.id', 's.project_id', 's.version', 's.source', 's.filename', 's.face_count', 's.created_at', 's.created_by', 'u.name as created_by_name'];

function toVersion(r: Record<string, unknown>): ScheduleVersion {
  return {
    id: r.id as number,
    project_id: r.project_id as number,
    version: r.version as number,
    source: r.source as ScheduleVersion['source'],
    filename: (r.filename as string | null) ?? null,
    face_count: r.face_count as number,
    created_at: r.created_at as string,
    created_by: r.created_by ? { id: r.created_by as number, name: (r.created_by_name as string) ?? '' } : null,
  };
}

function toFace(r: Record<string, unknown>): StoredFace {
  return {
    id: r.id as number,
    position: r.position as number,
    building: r.building as string,
    face: r.face as string,
    quantity: r.quantity as number,
    pitch_deg: Number(r.pitch_deg),
    rafter_mm: Number(r.rafter_mm),
    run_mm: Number(r.run_mm),
    eaves_mm: Number(r.eaves_mm),
    top_mm: Number(r.top_mm),
    left: r.left_edge as StoredFace['left'],
    right: r.right_edge as StoredFace['right'],
    top: r.top_edge as StoredFace['top'],
    ridge: (r.ridge as string | null) ?? null,
    top_assumed: Boolean(r.top_assumed),
  };
}

function toOpening(r: Record<string, unknown>): StoredOpening {
  return {
    id: r.id as number,
    position: r.position as number,
    building: r.building as string,
    face: r.face as string,
    kind: r.kind as StoredOpening['kind'],
    width_mm: Number(r.width_mm),
    height_mm: Number(r.height_mm),
    quantity: r.quantity as number,
  };
}

export function schedulesRepository(db: Db) {
  const versions = (trx: Db) => trx('schedules as s').leftJoin('users as u', 'u.id', 's.created_by');

  async function withFaces(version: ScheduleVersion, trx: Db): Promise<ScheduleWithFaces> {
    const faces = await trx('schedule_faces').where({ schedule_id: version.id }).orderBy('position');
    const openings = await trx('schedule_openings').where({ schedule_id: version.id }).orderBy('position');
    return { ...version, faces: faces.map(toFace), openings: openings.map(toOpening) };
  }

  return {
    /**
     * Stores a new version of a site's schedule with all its faces. Runs inside the caller's
     * transaction, so a failure on any face leaves no schedule behind.
     */
    async insertVersion(
      trx: Db,
      input: {
        organisationId: number;
        projectId: number;
        userId: number;
        source: 'csv' | 'form';
        filename: string | null;
        faces: Face[];
        openings: Opening[];
      },
    ): Promise<number> {
      const last = await trx('schedules').where({ project_id: input.projectId }).max({ v: 'version' }).first();
      const version = Number(last?.v ?? 0) + 1;
      const [row] = await trx('schedules')
        .insert({
          organisation_id: input.organisationId,
          project_id: input.projectId,
          version,
          source: input.source,
          filename: input.filename,
          face_count: input.faces.length,
          created_by: input.userId,
          created_at: nowIso(),
        })
        .returning('id');
      const scheduleId = (row as { id: number }).id;
      const rows = input.faces.map((f, i) => ({
        schedule_id: scheduleId,
        position: i + 1,
        building: f.building,
        face: f.face,
        quantity: f.quantity,
        pitch_deg: f.pitch_deg,
        rafter_mm: f.rafter_mm,
        run_mm: f.run_mm,
        eaves_mm: f.eaves_mm,
        top_mm: f.top_mm,
        left_edge: f.left,
        right_edge: f.right,
        top_edge: f.top,
        ridge: f.ridge ?? null,
        top_assumed: f.top_assumed === true,
      }));
      // 15 columns a row: 60 rows stay well inside SQLite's limit on bound parameters.
      for (let i = 0; i < rows.length; i += 60) await trx('schedule_faces').insert(rows.slice(i, i + 60));
      const openingRows = input.openings.map((o, i) => ({
        schedule_id: scheduleId,
        position: i + 1,
        building: o.building,
        face: o.face,
        kind: o.kind,
        width_mm: o.width_mm,
        height_mm: o.height_mm,
        quantity: o.quantity,
      }));
      for (let i = 0; i < openingRows.length; i += 100) await trx('schedule_openings').insert(openingRows.slice(i, i + 100));
      await trx('projects').where({ id: input.projectId }).update({ updated_at: nowIso() });
      return scheduleId;
    },

    async listVersions(organisationId: number, projectId: number): Promise<ScheduleVersion[]> {
      const rows = await versions(db).where({ 's.organisation_id': organisationId, 's.project_id': projectId }).select(VERSION_COLUMNS).orderBy('s.version', 'desc');
      return rows.map(toVersion);
    },

    /** A version of a site's schedule (the newest when no version is given), with its faces. */
    async findVersion(organisationId: number, projectId: number, version?: number, trx: Db = db): Promise<ScheduleWithFaces | undefined> {
      const q = versions(trx).where({ 's.organisation_id': organisationId, 's.project_id': projectId }).select(VERSION_COLUMNS);
      const row = version === undefined ? await q.orderBy('s.version', 'desc').first() : await q.where('s.version', version).first();
      return row ? withFaces(toVersion(row), trx) : undefined;
    },

    async findById(organisationId: number, scheduleId: number, trx: Db = db): Promise<ScheduleWithFaces | undefined> {
      const row = await versions(trx).where({ 's.organisation_id': organisationId, 's.id': scheduleId }).select(VERSION_COLUMNS).first();
      return row ? withFaces(toVersion(row), trx) : undefined;
    },
  };
}

export type SchedulesRepository = ReturnType<typeof schedulesRepository>;
