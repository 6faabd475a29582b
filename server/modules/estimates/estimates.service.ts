import type { z } from 'zod';
import { checkFacesAgainstSystem, estimate } from '../../../shared/engine/estimate';
import type { EngineResult } from '../../../shared/engine/result';
import { parseRoofSystem } from '../../../shared/engine/roof-system';
import { ENGINE_VERSION } from '../../../shared/engine/version';
import { CATEGORY_LABELS, PRODUCT_CATEGORIES, type SystemRole } from '../../../shared/schemas/catalogue.schema';
import type { Estimate, EstimateComparison, WastePct, createEstimateBodySchema } from '../../../shared/schemas/estimate.schema';
import type { RoofSystem } from '../../../shared/schemas/roof-system.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { AppError } from '../../http/app-error';
import { catalogueRepository, type BranchWithMerchant } from '../catalogue/catalogue.repository';
import { catalogueService } from '../catalogue/catalogue.service';
import { projectsService } from '../projects/projects.service';
import { engineFace, engineOpening } from '../../../shared/domain/stored-schedule';
import { schedulesRepository, type ScheduleWithFaces } from '../schedules/schedules.repository';
import { billOfMaterials, type NotCounted, type PricedComponent } from './bill-of-materials';
import { estimateCautions } from './cautions';
import { estimatesRepository, type EstimateSummaryRow } from './estimates.repository';

type CreateBody = z.output<typeof createEstimateBodySchema>;

const branchRef = (b: BranchWithMerchant | undefined) => (b ? { id: b.id, name: b.name, town: b.town, merchant: b.merchant } : null);

/** A system with the waste the estimator asked for laid over its own; errors name the field. */
function resolveSystem(input: unknown, waste: WastePct | undefined, pathPrefix: string): RoofSystem {
  const base = (input ?? {}) as Record<string, unknown>;
  const withWaste = waste ? { ...base, waste_pct: { ...((base.waste_pct as object | undefined) ?? {}), ...waste } } : base;
  const parsed = parseRoofSystem(withWaste);
  if (!parsed.ok) {
    throw AppError.unprocessable(
      'invalid_system',
      'The roof system is not complete or not valid',
      parsed.errors.map((e) => ({ path: `${pathPrefix}${e.field ?? ''}`, message: e.message })),
    );
  }
  return parsed.system;
}

export function estimatesService(deps: Pick<AppDeps, 'db' | 'logger'>) {
  const { db } = deps;
  const estimates = estimatesRepository(db);
  const schedules = schedulesRepository(db);
  const catalogueRepo = catalogueRepository(db);
  const catalogue = catalogueService(deps);
  const projects = projectsService(deps);

  /** Runs the engine and prices its result; nothing is stored when the schedule does not suit the system. */
  async function compute(user: AuthUser, schedule: ScheduleWithFaces, source: { system_id: number; waste?: WastePct } | { system: unknown; waste?: WastePct }, recomputedFrom: number | null) {
    let system: RoofSystem;
    let components: Map<SystemRole, PricedComponent> | null = null;
    let systemName = 'Generic roof system';
    let roofSystemId: number | null = null;
    let branchId: number | null = null;
    if ('system_id' in source) {
      const { row, built } = await catalogue.systemForEstimate(user, source.system_id);
      system = resolveSystem(built.system, source.waste, '');
      components = new Map([...built.components].map(([role, c]) => [role, { product: c.product, pack_price: c.price!.pack_price }] as const));
      systemName = row.name;
      roofSystemId = row.id;
      branchId = row.branch_id;
    } else {
      system = resolveSystem(source.system, source.waste, 'system.');
    }

    const faces = schedule.faces.map(engineFace);
    const problems = checkFacesAgainstSystem(faces, system, (i) => schedule.faces[i].position);
    if (problems.length > 0) {
      throw AppError.unprocessable(
        'schedule_not_suitable',
        'Some faces of the schedule cannot be laid with this roof system',
        problems.map((p) => ({
          row: p.row,
          column: p.column,
          building: faces[(p.row ?? 1) - 1]?.building,
          face: faces[(p.row ?? 1) - 1]?.face,
          message: p.message,
        })),
      );
    }
    const result: EngineResult = estimate(faces, system, schedule.openings.map(engineOpening));
    const bill = billOfMaterials(result, system, components);
    const subtotal = components ? bill.lines.reduce((sum, l) => sum + (l.total ?? 0), 0) : null;
    return estimates.insert(
      {
        organisation_id: user.organisation.id,
        project_id: schedule.project_id,
        schedule_id: schedule.id,
        roof_system_id: roofSystemId,
        branch_id: branchId,
        system_name: systemName,
        system_input: system,
        waste_pct: source.waste ?? {},
        engine_version: result.engine_version,
        result,
        not_counted: bill.not_counted,
        subtotal,
        weight_kg: result.totals.weight_kg,
        pallets: result.pallets.length,
        loads: result.loads.length,
        recomputed_from: recomputedFrom,
        created_by: user.id,
      },
      bill.lines,
    );
  }

  async function branchesOf(rows: { branch_id: number | null }[]) {
    return catalogueRepo.branchesByIds([...new Set(rows.map((r) => r.branch_id).filter((b): b is number => b !== null))]);
  }

  function summary(row: EstimateSummaryRow, branches: Map<number, BranchWithMerchant>) {
    return {
      id: row.id,
      project_id: row.project_id,
      schedule: { id: row.schedule_id, version: row.schedule_version },
      system: {
        source: row.roof_system_id !== null || row.branch_id !== null ? ('catalogue' as const) : ('generic' as const),
        id: row.roof_system_id,
        name: row.system_name,
        branch: row.branch_id !== null ? branchRef(branches.get(row.branch_id)) : null,
      },
      engine_version: row.engine_version,
      engine_current: row.engine_version === ENGINE_VERSION,
      totals: { subtotal: row.subtotal, weight_kg: row.weight_kg, pallets: row.pallets, loads: row.loads },
      created_at: row.created_at,
    };
  }

  async function get(user: AuthUser, id: number): Promise<Estimate> {
    const row = await estimates.find(user.organisation.id, id);
    if (!row) throw AppError.notFound('Estimate');
    const lines = await estimates.lines(id);
    const branches = await branchesOf([row]);
    return {
      ...summary(row, branches),
      system_input: row.system_input,
      waste_pct: row.waste_pct,
      result: row.result,
      lines,
      not_counted: row.not_counted as NotCounted[],
      cautions: estimateCautions(row.result.cautions),
      recomputed_from: row.recomputed_from,
      created_by: row.created_by,
    };
  }

  return {
    async create(user: AuthUser, projectId: number, body: CreateBody) {
      await projects.requireOpen(user, projectId);
      const schedule = await schedules.findVersion(user.organisation.id, projectId, body.schedule_version);
      if (!schedule) {
        if (body.schedule_version !== undefined) throw AppError.notFound('Schedule version');
        throw AppError.conflict('no_schedule', 'Import or enter the roof schedule before estimating');
      }
      const source = body.system_id !== undefined ? { system_id: body.system_id, waste: body.waste_pct } : { system: body.system, waste: body.waste_pct };
      return get(user, await compute(user, schedule, source, null));
    },

    get,

    async listForProject(user: AuthUser, projectId: number) {
      await projects.get(user, projectId);
      const rows = await estimates.listForProject(user.organisation.id, projectId);
      const branches = await branchesOf(rows);
      return { estimates: rows.map((r) => summary(r, branches)) };
    },

    /**
     * The same schedule and system worked out again with today's engine (and, for a merchant's system,
     * today's catalogue and prices), saved as a new estimate; the old one keeps its figures.
     */
    async recompute(user: AuthUser, id: number) {
      const row = await estimates.find(user.organisation.id, id);
      if (!row) throw AppError.notFound('Estimate');
      const schedule = (await schedules.findById(user.organisation.id, row.schedule_id))!;
      await projects.requireOpen(user, row.project_id);
      let source: { system_id: number; waste?: WastePct } | { system: unknown; waste?: WastePct };
      if (row.roof_system_id !== null) source = { system_id: row.roof_system_id, waste: row.waste_pct };
      else if (row.branch_id !== null) throw AppError.conflict('system_unavailable', 'The merchant no longer offers this roof system');
      else source = { system: row.system_input };
      return get(user, await compute(user, schedule, source, row.id));
    },

    /** Two estimates of the same schedule side by side: quantities, weight and price per category. */
    async compare(user: AuthUser, aId: number, bId: number): Promise<EstimateComparison> {
      const [a, b] = await Promise.all([get(user, aId), get(user, bId)]);
      if (a.schedule.id !== b.schedule.id) {
        throw AppError.unprocessable('not_comparable', 'Only estimates of the same schedule version can be compared', [
          { path: 'b', message: `estimate ${b.id} is of schedule version ${b.schedule.version}, estimate ${a.id} of version ${a.schedule.version}` },
        ]);
      }
      const side = (e: Estimate, category: (typeof PRODUCT_CATEGORIES)[number]) => {
        const l = e.lines.find((x) => x.category === category);
        return l ? { sku: l.sku, description: l.description, quantity: l.quantity, unit: l.unit, packs: l.packs, total: l.total } : null;
      };
      const rows = PRODUCT_CATEGORIES.filter((c) => a.lines.some((l) => l.category === c) || b.lines.some((l) => l.category === c)).map((c) => ({
        category: c,
        label: CATEGORY_LABELS[c],
        a: side(a, c),
        b: side(b, c),
      }));
      const pick = ({ id, project_id, schedule, system, engine_version, engine_current, totals, created_at }: Estimate) => ({
        id,
        project_id,
        schedule,
        system,
        engine_version,
        engine_current,
        totals,
        created_at,
      });
      return {
        schedule: a.schedule,
        estimates: [pick(a), pick(b)],
        rows,
        difference: {
          subtotal: a.totals.subtotal !== null && b.totals.subtotal !== null ? b.totals.subtotal - a.totals.subtotal : null,
          weight_kg: Math.round((b.totals.weight_kg - a.totals.weight_kg) * 10) / 10,
          pallets: b.totals.pallets - a.totals.pallets,
        },
      };
    },
  };
}

export type EstimatesService = ReturnType<typeof estimatesService>;
