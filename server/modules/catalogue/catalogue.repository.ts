import type { ProductCategory, SystemRole } from '../../../shared/schemas/catalogue.schema';
import type { Db } from '../../db/knex';

/** What a product is and how it packs: the fields a merchant (or the demo seed) writes and the engine reads. */
export interface ProductFigures {
  sku: string;
  name: string;
  category: ProductCategory;
  unit: string;
  pack_size: number;
  pack_weight_kg: number;
  technical: Record<string, unknown>;
}

export interface ProductRow extends ProductFigures {
  id: number;
  organisation_id: number;
}

/** A product as one branch sells it: price per pack and stock in packs. */
export interface BranchProductRow extends ProductRow {
  branch_id: number;
  pack_price: number;
  on_hand: number;
  reserved: number;
  reorder_level: number;
}

export interface BranchWithMerchant {
  id: number;
  name: string;
  town: string;
  address: string;
  merchant: { id: number; name: string };
}

export interface SystemRow {
  id: number;
  organisation_id: number;
  branch_id: number;
  name: string;
  description: string;
  settings: Record<string, unknown>;
  branch: BranchWithMerchant;
  /** Each component with its price and stock at the system's branch; null price when the branch does not sell it. */
  components: { role: SystemRole; product: ProductRow; price: { pack_price: number; on_hand: number; reserved: number; reorder_level: number } | null }[];
}

/** Who is looking: a contractor sees every merchant's offer, a merchant only its own. */
export interface CatalogueViewer {
  kind: 'contractor' | 'merchant';
  organisationId: number;
}

const PRODUCT_COLUMNS = ['p.id', 'p.organisation_id', 'p.sku', 'p.name', 'p.category', 'p.unit', 'p.pack_size', 'p.pack_weight_kg', 'p.technical'];

/** A `products` row's figures, whichever database read it: the weight as a number, the technical fields parsed from their JSON text. */
export function productFigures(r: Record<string, unknown>): ProductFigures {
  return {
    sku: r.sku as string,
    name: r.name as string,
    category: r.category as ProductCategory,
    unit: r.unit as string,
    pack_size: r.pack_size as number,
    pack_weight_kg: Number(r.pack_weight_kg),
    technical: JSON.parse(r.technical as string) as Record<string, unknown>,
  };
}

function toProduct(r: Record<string, unknown>): ProductRow {
  return { id: r.id as number, organisation_id: r.organisation_id as number, ...productFigures(r) };
}

export function catalogueRepository(db: Db) {
  async function branchesByIds(ids: number[], trx: Db = db): Promise<Map<number, BranchWithMerchant>> {
    if (ids.length === 0) return new Map();
    const rows = await trx('branches as b')
      .join('organisations as o', 'o.id', 'b.organisation_id')
      .where('o.kind', 'merchant')
      .whereIn('b.id', ids)
      .select('b.id', 'b.name', 'b.town', 'b.address', 'o.id as merchant_id', 'o.name as merchant_name');
    return new Map(rows.map((r) => [r.id as number, { id: r.id, name: r.name, town: r.town, address: r.address, merchant: { id: r.merchant_id, name: r.merchant_name } }]));
  }

  async function loadSystems(query: (q: ReturnType<Db>) => void, trx: Db = db): Promise<SystemRow[]> {
    const q = trx('roof_systems as s').whereNull('s.archived_at');
    query(q);
    const systems = await q.select('s.id', 's.organisation_id', 's.branch_id', 's.name', 's.description', 's.settings').orderBy(['s.branch_id', 's.id']);
    if (systems.length === 0) return [];
    const ids = systems.map((s) => s.id as number);
    const components = await trx('roof_system_components as c')
      .join('products as p', 'p.id', 'c.product_id')
      .join('roof_systems as s', 's.id', 'c.roof_system_id')
      .leftJoin('branch_products as bp', function () {
        this.on('bp.product_id', '=', 'p.id').andOn('bp.branch_id', '=', 's.branch_id');
      })
      .whereIn('c.roof_system_id', ids)
      .select('c.roof_system_id', 'c.role', ...PRODUCT_COLUMNS, 'bp.pack_price', 'bp.on_hand', 'bp.reserved', 'bp.reorder_level')
      .orderBy('c.id');
    const branches = await branchesByIds([...new Set(systems.map((s) => s.branch_id as number))], trx);
    return systems.map((s) => ({
      id: s.id,
      organisation_id: s.organisation_id,
      branch_id: s.branch_id,
      name: s.name,
      description: s.description,
      settings: JSON.parse(s.settings) as Record<string, unknown>,
      branch: branches.get(s.branch_id)!,
      components: components
        .filter((c) => c.roof_system_id === s.id)
        .map((c) => ({
          role: c.role as SystemRole,
          product: toProduct(c),
          price: c.pack_price === null || c.pack_price === undefined ? null : { pack_price: c.pack_price, on_hand: c.on_hand, reserved: c.reserved, reorder_level: c.reorder_level },
        })),
    }));
  }

  const visible = (viewer: CatalogueViewer) => (q: ReturnType<Db>) => {
    if (viewer.kind === 'merchant') q.where('s.organisation_id', viewer.organisationId);
  };

  return {
    branchesByIds,

    async listSystems(viewer: CatalogueViewer, filter: { branchId?: number; merchantId?: number }): Promise<SystemRow[]> {
      return loadSystems((q) => {
        visible(viewer)(q);
        if (filter.branchId) q.where('s.branch_id', filter.branchId);
        if (filter.merchantId) q.where('s.organisation_id', filter.merchantId);
      });
    },

    async findSystem(viewer: CatalogueViewer, id: number, trx: Db = db): Promise<SystemRow | undefined> {
      const [row] = await loadSystems((q) => {
        visible(viewer)(q);
        q.where('s.id', id);
      }, trx);
      return row;
    },

    /** Every branch of every merchant, for choosing where to order or ask for a quote. */
    async listMerchantBranches(): Promise<BranchWithMerchant[]> {
      const rows = await db('branches as b')
        .join('organisations as o', 'o.id', 'b.organisation_id')
        .where('o.kind', 'merchant')
        .select('b.id', 'b.name', 'b.town', 'b.address', 'o.id as merchant_id', 'o.name as merchant_name')
        .orderBy(['o.name', 'b.name']);
      return rows.map((r) => ({ id: r.id, name: r.name, town: r.town, address: r.address, merchant: { id: r.merchant_id, name: r.merchant_name } }));
    },

    /**
     * Products of the given ids (or every product of one category) as one branch sells them; a product
     * the branch does not sell is left out.
     */
    async branchProducts(branchId: number, productIds: number[] | { category: ProductCategory }, trx: Db = db): Promise<Map<number, BranchProductRow>> {
      if (Array.isArray(productIds) && productIds.length === 0) return new Map();
      const rows: Record<string, unknown>[] = await trx('products as p')
        .join('branch_products as bp', 'bp.product_id', 'p.id')
        .join('branches as b', 'b.id', 'bp.branch_id')
        .where('bp.branch_id', branchId)
        .whereRaw('?? = ??', ['b.organisation_id', 'p.organisation_id'])
        .whereNull('p.archived_at')
        .modify((q) => (Array.isArray(productIds) ? q.whereIn('p.id', productIds) : q.where('p.category', productIds.category)))
        .orderBy('p.sku')
        .select(...PRODUCT_COLUMNS, 'bp.branch_id', 'bp.pack_price', 'bp.on_hand', 'bp.reserved', 'bp.reorder_level');
      return new Map(
        rows.map((r) => [
          r.id as number,
          { ...toProduct(r), branch_id: r.branch_id as number, pack_price: r.pack_price as number, on_hand: r.on_hand as number, reserved: r.reserved as number, reorder_level: r.reorder_level as number },
        ]),
      );
    },
  };
}

export type CatalogueRepository = ReturnType<typeof catalogueRepository>;
