import type { EngineResult } from '../../../shared/engine/result';
import type { EstimateLine, WastePct } from '../../../shared/schemas/estimate.schema';
import type { RoofSystem } from '../../../shared/schemas/roof-system.schema';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import type { BillLine } from './bill-of-materials';

export interface EstimateRow {
  id: number;
  organisation_id: number;
  project_id: number;
  schedule_id: number;
  schedule_version: number;
  roof_system_id: number | null;
  branch_id: number | null;
  system_name: string;
  system_input: RoofSystem;
  waste_pct: WastePct;
  engine_version: string;
  result: EngineResult;
  not_counted: unknown[];
  subtotal: number | null;
  weight_kg: number;
  pallets: number;
  loads: number;
  recomputed_from: number | null;
  created_at: string;
  created_by: { id: number; name: string } | null;
}

/** An estimate as it is written: the row less what the database gives it (id, schedule version, time) and the author by id. */
export type NewEstimate = Omit<EstimateRow, 'id' | 'schedule_version' | 'created_at' | 'created_by'> & { created_by: number };

const SUMMARY_COLUMNS = [
  'e.id',
  'e.organisation_id',
  'e.project_id',
  'e.schedule_id',
  's.version as schedule_version',
  'e.roof_system_id',
  'e.branch_id',
  'e.system_name',
  'e.system_input',
  'e.waste_pct',
  'e.engine_version',
  'e.subtotal',
  'e.weight_kg',
  'e.pallets',
  'e.loads',
  'e.recomputed_from',
  'e.created_at',
  'e.created_by',
  'u.name as created_by_name',
];
const COLUMNS = [...SUMMARY_COLUMNS, 'e.result'];

export type EstimateSummaryRow = Omit<EstimateRow, 'result' | 'not_counted'>;

function toSummaryRow(r: Record<string, unknown>): EstimateSummaryRow {
  return {
    id: r.id as number,
    organisation_id: r.organisation_id as number,
    project_id: r.project_id as number,
    schedule_id: r.schedule_id as number,
    schedule_version: r.schedule_version as number,
    roof_system_id: (r.roof_system_id as number | null) ?? null,
    branch_id: (r.branch_id as number | null) ?? null,
    system_name: r.system_name as string,
    system_input: JSON.parse(r.system_input as string) as RoofSystem,
    waste_pct: JSON.parse(r.waste_pct as string) as WastePct,
    engine_version: r.engine_version as string,
    subtotal: (r.subtotal as number | null) ?? null,
    weight_kg: Number(r.weight_kg),
    pallets: r.pallets as number,
    loads: r.loads as number,
    recomputed_from: (r.recomputed_from as number | null) ?? null,
    created_at: r.created_at as string,
    created_by: r.created_by ? { id: r.created_by as number, name: (r.created_by_name as string) ?? '' } : null,
  };
}

function toRow(r: Record<string, unknown>): EstimateRow {
  // The result is stored with the parts the engine did not count, so reopening shows the same bill.
  const stored = JSON.parse(r.result as string) as { engine: EngineResult; not_counted: unknown[] };
  return { ...toSummaryRow(r), result: stored.engine, not_counted: stored.not_counted };
}

function toLine(r: Record<string, unknown>): EstimateLine {
  return {
    id: r.id as number,
    position: r.position as number,
    category: r.category as EstimateLine['category'],
    product_id: (r.product_id as number | null) ?? null,
    sku: (r.sku as string | null) ?? null,
    description: r.description as string,
    quantity: Number(r.quantity),
    unit: r.unit as string,
    pack_size: r.pack_size as number,
    packs: r.packs as number,
    unit_price: (r.unit_price as number | null) ?? null,
    total: (r.total as number | null) ?? null,
    figure: r.figure as EstimateLine['figure'],
  };
}

export function estimatesRepository(db: Db) {
  const base = (trx: Db) => trx('estimates as e').join('schedules as s', 's.id', 'e.schedule_id').leftJoin('users as u', 'u.id', 'e.created_by');

  return {
    async insert(e: NewEstimate, lines: BillLine[]): Promise<number> {
      return db.transaction(async (trx) => {
        const [row] = await trx('estimates')
          .insert({
            organisation_id: e.organisation_id,
            project_id: e.project_id,
            schedule_id: e.schedule_id,
            roof_system_id: e.roof_system_id,
            branch_id: e.branch_id,
            system_name: e.system_name,
            system_input: JSON.stringify(e.system_input),
            waste_pct: JSON.stringify(e.waste_pct),
            engine_version: e.engine_version,
            result: JSON.stringify({ engine: e.result, not_counted: e.not_counted }),
            subtotal: e.subtotal,
            weight_kg: e.weight_kg,
            pallets: e.pallets,
            loads: e.loads,
            recomputed_from: e.recomputed_from,
            created_by: e.created_by,
            created_at: nowIso(),
          })
          .returning('id');
        const id = (row as { id: number }).id;
        if (lines.length > 0) {
          await trx('estimate_lines').insert(
            lines.map((l, i) => ({
              estimate_id: id,
              position: i + 1,
              category: l.category,
              product_id: l.product_id,
              sku: l.sku,
              description: l.description,
              quantity: l.quantity,
              unit: l.unit,
              pack_size: l.pack_size,
              packs: l.packs,
              unit_price: l.unit_price,
              total: l.total,
              figure: l.figure,
            })),
          );
        }
        return id;
      });
    },

    async find(organisationId: number, id: number, trx: Db = db): Promise<EstimateRow | undefined> {
      const row = await base(trx).where({ 'e.organisation_id': organisationId, 'e.id': id }).select(COLUMNS).first();
      return row ? toRow(row) : undefined;
    },

    async lines(estimateId: number, trx: Db = db): Promise<EstimateLine[]> {
      const rows = await trx('estimate_lines').where({ estimate_id: estimateId }).orderBy('position');
      return rows.map(toLine);
    },

    async listForProject(organisationId: number, projectId: number): Promise<EstimateSummaryRow[]> {
      const rows = await base(db).where({ 'e.organisation_id': organisationId, 'e.project_id': projectId }).select(SUMMARY_COLUMNS).orderBy('e.id', 'desc');
      return rows.map(toSummaryRow);
    },

    async findSummary(organisationId: number, id: number): Promise<EstimateSummaryRow | undefined> {
      const row = await base(db).where({ 'e.organisation_id': organisationId, 'e.id': id }).select(SUMMARY_COLUMNS).first();
      return row ? toSummaryRow(row) : undefined;
    },
  };
}

export type EstimatesRepository = ReturnType<typeof estimatesRepository>;
