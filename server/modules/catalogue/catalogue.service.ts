import { parseRoofSystem } from '../../../shared/engine/roof-system';
import type { RoofSystem } from '../../../shared/schemas/roof-system.schema';
import { REQUIRED_SYSTEM_ROLES, TECHNICAL_SCHEMAS, systemSettingsSchema, type RoofSystemOffer, type StockState, type SystemRole } from '../../../shared/schemas/catalogue.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { AppError } from '../../http/app-error';
import { catalogueRepository, type CatalogueViewer, type SystemRow } from './catalogue.repository';

type Technical = Record<string, unknown>;

/** Why a system cannot be offered, or its engine input and the component per role. */
export type BuiltSystem = { ok: true; system: RoofSystem; components: Map<SystemRole, SystemRow['components'][number]> } | { ok: false; problems: string[] };

/**
 * The engine's roof-system input, taken from the products' technical fields and the system's own
 * settings. A system without a hip product uses its ridge for the hips too (the same piece is laid).
 */
export function buildSystem(row: SystemRow): BuiltSystem {
  const problems: string[] = [];
  const byRole = new Map<SystemRole, SystemRow['components'][number]>();
  for (const c of row.components) byRole.set(c.role, c);
  for (const role of REQUIRED_SYSTEM_ROLES) if (!byRole.has(role)) problems.push(`has no ${role} product`);
  for (const c of row.components) {
    if (c.product.category !== c.role) problems.push(`${c.role}: ${c.product.sku} is a ${c.product.category} product`);
    if (!c.price) problems.push(`${c.role}: ${c.product.sku} has no price at ${row.branch.name}`);
    const technical = TECHNICAL_SCHEMAS[c.role].safeParse(c.product.technical);
    if (!technical.success) problems.push(`${c.role}: ${c.product.sku} technical fields: ${technical.error.issues.map((i) => `${i.path.join('.')} ${i.message}`).join('; ')}`);
  }
  const settings = systemSettingsSchema.safeParse(row.settings);
  if (!settings.success) problems.push(`settings: ${settings.error.issues.map((i) => `${i.path.join('.')} ${i.message}`).join('; ')}`);
  if (problems.length > 0 || !settings.success) return { ok: false, problems };

  const t = (role: SystemRole): Technical => byRole.get(role)?.product.technical ?? {};
  const s = settings.data;
  const ridge = t('ridge');
  const hip = byRole.has('hip') ? t('hip') : ridge;
  const batten = t('batten');
  const underlay = t('underlay');
  const weight = (role: SystemRole) => (byRole.has(role) ? (t(role).weight_kg as number) : undefined);
  const tile = {
    ...t('tile'),
    ...(byRole.has('eaves_tile') ? { eaves_tile_kg: weight('eaves_tile') } : {}),
    ...(byRole.has('top_tile') ? { top_tile_kg: weight('top_tile') } : {}),
    ...(byRole.has('tile_and_half') ? { tile_and_half_kg: weight('tile_and_half') } : {}),
  };
  const trough = t('valley_trough');
  const input = {
    ...(s.setting_out ? { setting_out: s.setting_out } : {}),
    ...(s.rafter_spacing_mm ? { rafter_spacing_mm: s.rafter_spacing_mm } : {}),
    ...(s.waste_pct ? { waste_pct: s.waste_pct } : {}),
    ...(s.roof_loading ? { roof_loading: s.roof_loading } : {}),
    ...(s.truck ? { truck: s.truck } : {}),
    tile,
    ridge: { cover_mm: ridge.cover_mm, weight_kg: ridge.weight_kg },
    hip: { cover_mm: hip.cover_mm, weight_kg: hip.weight_kg, ...(byRole.has('hip_iron') ? { iron_kg: weight('hip_iron') } : {}) },
    // The fittings a system names decide how its verges and valleys are done.
    verge: byRole.has('dry_verge') ? { kind: 'dry', unit_kg: weight('dry_verge'), ...(byRole.has('ridge_end_cap') ? { end_cap_kg: weight('ridge_end_cap') } : {}) } : { kind: 'mortar' },
    valley: byRole.has('valley_trough') ? { kind: 'trough', unit_length_mm: trough.unit_length_mm, lap_mm: trough.lap_mm, unit_kg: trough.weight_kg } : { kind: 'lined' },
    batten: { stock_length_mm: batten.stock_length_mm, kg_per_m: batten.kg_per_m, ...s.batten },
    underlay: { roll_width_mm: underlay.roll_width_mm, roll_length_mm: underlay.roll_length_mm, roll_kg: underlay.roll_kg, ...s.underlay },
    fixing: { ...s.fixing, batten_nail_g: t('batten_nail').nail_g, tile_nail_g: t('tile_nail').nail_g },
  };
  const parsed = parseRoofSystem(input);
  if (!parsed.ok) return { ok: false, problems: parsed.errors.map((e) => `${e.field}: ${e.message}`) };
  return { ok: true, system: parsed.system, components: byRole };
}

/** In stock above the reorder level, low at or below it, out when nothing is free to promise. */
export function stockState(p: { on_hand: number; reserved: number; reorder_level: number }): StockState {
  const available = p.on_hand - p.reserved;
  if (available <= 0) return 'out_of_stock';
  return available <= p.reorder_level ? 'low' : 'in_stock';
}

export function toOffer(row: SystemRow, built: Extract<BuiltSystem, { ok: true }>): RoofSystemOffer {
  const components = row.components.map((c) => ({
    role: c.role,
    product: {
      id: c.product.id,
      sku: c.product.sku,
      name: c.product.name,
      category: c.product.category,
      unit: c.product.unit,
      pack_size: c.product.pack_size,
      pack_weight_kg: c.product.pack_weight_kg,
    },
    unit_price: c.price!.pack_price,
    stock: stockState(c.price!),
  }));
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    branch: { id: row.branch.id, name: row.branch.name, town: row.branch.town, merchant: row.branch.merchant },
    tile: built.system.tile,
    system: built.system,
    components,
    prices: Object.fromEntries(components.map((c) => [c.role, c.unit_price])),
  };
}

export function viewerOf(user: AuthUser): CatalogueViewer {
  return { kind: user.organisation.kind, organisationId: user.organisation.id };
}

export function catalogueService({ db, logger }: Pick<AppDeps, 'db' | 'logger'>) {
  const catalogue = catalogueRepository(db);

  const offerOrSkip = (row: SystemRow) => {
    const built = buildSystem(row);
    if (!built.ok) {
      // A merchant's half-finished system is left out of the list rather than failing everyone's list.
      logger.warn({ system: row.id, problems: built.problems }, 'roof system cannot be offered');
      return null;
    }
    return toOffer(row, built);
  };

  return {
    async listSystems(user: AuthUser, filter: { branch_id?: number; merchant_id?: number; kind?: 'single_lap' | 'double_lap' }) {
      const rows = await catalogue.listSystems(viewerOf(user), { branchId: filter.branch_id, merchantId: filter.merchant_id });
      return rows
        .map(offerOrSkip)
        .filter((o): o is RoofSystemOffer => o !== null)
        .filter((o) => !filter.kind || o.tile.kind === filter.kind);
    },

    async getSystem(user: AuthUser, id: number) {
      const row = await catalogue.findSystem(viewerOf(user), id);
      const offer = row ? offerOrSkip(row) : null;
      if (!offer) throw AppError.notFound('Roof system');
      return offer;
    },

    /** A system ready for the engine, with its components; refuses one the branch cannot supply whole. */
    async systemForEstimate(user: AuthUser, id: number) {
      const row = await catalogue.findSystem(viewerOf(user), id);
      if (!row) throw AppError.notFound('Roof system');
      const built = buildSystem(row);
      if (!built.ok) {
        throw AppError.conflict(
          'system_unavailable',
          `${row.name} at ${row.branch.name} cannot be estimated at the moment`,
          built.problems.map((message) => ({ path: 'system_id', message })),
        );
      }
      return { row, built };
    },

    listMerchantBranches: () => catalogue.listMerchantBranches(),
  };
}

export type CatalogueService = ReturnType<typeof catalogueService>;
