import type { ProductCategory, SystemRole } from '../../../shared/schemas/catalogue.schema';
import type { Product } from '../../../shared/schemas/price-list.schema';
import type { Db } from '../../db/knex';
import { productFigures, type ProductFigures } from '../catalogue/catalogue.repository';
import { nowIso } from '../../db/time';

export interface ProductValues extends ProductFigures {
  tax_rate_bp: number;
  /** The pallet's footprint; the column's default (1200 × 1000) when left out. */
  pallet_length_mm?: number;
  pallet_width_mm?: number;
}

export interface BranchRow {
  id: number;
  name: string;
  town: string;
}

/** A product on a branch's price list: its values as written, with its id and the branch's pack price. */
export interface PriceListRow extends Pick<ProductValues, 'sku' | 'name' | 'category' | 'unit' | 'pack_size' | 'pack_weight_kg' | 'tax_rate_bp'> {
  product_id: number;
  pack_price: number;
}

const likePattern = (q: string) => `%${q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** The merchant's own products, roof systems and branch prices; every query is scoped to the merchant. */
export function priceListRepository(db: Db) {
  async function withBranches(orgId: number, rows: Record<string, unknown>[], trx: Db): Promise<Product[]> {
    if (rows.length === 0) return [];
    const prices = await trx('branch_products as bp')
      .join('branches as b', 'b.id', 'bp.branch_id')
      .where('b.organisation_id', orgId)
      .whereIn(
        'bp.product_id',
        rows.map((r) => r.id as number),
      )
      .select('bp.product_id', 'bp.branch_id', 'b.name as branch_name', 'bp.pack_price', 'bp.on_hand', 'bp.reserved', 'bp.reorder_level')
      .orderBy(['b.name', 'b.id']);
    return rows.map((r) => ({
      id: r.id as number,
      ...productFigures(r),
      tax_rate_bp: r.tax_rate_bp as number,
      pallet_length_mm: Number(r.pallet_length_mm),
      pallet_width_mm: Number(r.pallet_width_mm),
      branches: prices
        .filter((p) => p.product_id === r.id)
        .map((p) => ({
          branch_id: p.branch_id,
          branch_name: p.branch_name,
          pack_price: p.pack_price,
          on_hand: p.on_hand,
          reserved: p.reserved,
          available: p.on_hand - p.reserved,
          reorder_level: p.reorder_level,
        })),
      archived_at: (r.archived_at as string | null) ?? null,
      created_at: r.created_at as string,
      updated_at: r.updated_at as string,
    }));
  }

  return {
    async branch(orgId: number, branchId: number, trx: Db = db): Promise<BranchRow | undefined> {
      return trx('branches').where({ id: branchId, organisation_id: orgId }).select('id', 'name', 'town').first();
    },

    async listProducts(orgId: number, f: { q?: string; category?: ProductCategory; archived: 'false' | 'true' | 'all' }): Promise<Product[]> {
      const q = db('products').where('organisation_id', orgId);
      if (f.category) q.where('category', f.category);
      if (f.archived === 'false') q.whereNull('archived_at');
      if (f.archived === 'true') q.whereNotNull('archived_at');
      if (f.q) {
        const pattern = likePattern(f.q);
        q.where((w) => w.whereRaw(`lower(??) like ? escape '\\'`, ['sku', pattern]).orWhereRaw(`lower(??) like ? escape '\\'`, ['name', pattern]));
      }
      return withBranches(orgId, await q.orderBy(['category', 'sku']), db);
    },

    async findProduct(orgId: number, id: number, trx: Db = db): Promise<Product | undefined> {
      const row = await trx('products').where({ organisation_id: orgId, id }).first();
      return row ? (await withBranches(orgId, [row], trx))[0] : undefined;
    },

    async productIdBySku(orgId: number, sku: string, trx: Db = db): Promise<number | undefined> {
      const row = await trx('products').where('organisation_id', orgId).whereRaw('lower(??) = ?', ['sku', sku.toLowerCase()]).first('id');
      return row?.id as number | undefined;
    },

    async insertProduct(trx: Db, orgId: number, v: ProductValues): Promise<number> {
      const now = nowIso();
      const [row] = await trx('products')
        .insert({ organisation_id: orgId, ...v, technical: JSON.stringify(v.technical), created_at: now, updated_at: now })
        .returning('id');
      return (row as { id: number }).id;
    },

    async updateProduct(trx: Db, orgId: number, id: number, v: Partial<ProductValues>): Promise<void> {
      const { technical, ...rest } = v;
      await trx('products')
        .where({ organisation_id: orgId, id })
        .update({ ...rest, ...(technical ? { technical: JSON.stringify(technical) } : {}), updated_at: nowIso() });
    },

    async setArchived(orgId: number, id: number, archived: boolean): Promise<void> {
      await db('products')
        .where({ organisation_id: orgId, id })
        .update({ archived_at: archived ? nowIso() : null, updated_at: nowIso() });
    },

    /** Sells the product at the branch at this pack price, or changes its price there. Returns whether it was new. */
    async setBranchPrice(trx: Db, branchId: number, productId: number, packPrice: number): Promise<'added' | 'updated' | 'unchanged'> {
      const existing = await trx('branch_products').where({ branch_id: branchId, product_id: productId }).first();
      if (!existing) {
        await trx('branch_products').insert({ branch_id: branchId, product_id: productId, pack_price: packPrice, on_hand: 0, reserved: 0, reorder_level: 0, updated_at: nowIso() });
        return 'added';
      }
      if (existing.pack_price === packPrice) return 'unchanged';
      await trx('branch_products').where({ id: existing.id }).update({ pack_price: packPrice, updated_at: nowIso() });
      return 'updated';
    },

    /** Every product the branch sells, with its price, for the price-list file. */
    async priceList(orgId: number, branchId: number): Promise<PriceListRow[]> {
      return db('branch_products as bp')
        .join('products as p', 'p.id', 'bp.product_id')
        .join('branches as b', 'b.id', 'bp.branch_id')
        .where({ 'bp.branch_id': branchId, 'b.organisation_id': orgId, 'p.organisation_id': orgId })
        .whereNull('p.archived_at')
        .select('p.id as product_id', 'p.sku', 'p.name', 'p.category', 'p.unit', 'p.pack_size', 'p.pack_weight_kg', 'p.tax_rate_bp', 'bp.pack_price')
        .orderBy(['p.category', 'p.sku']);
    },

    /** The merchant's products by lower-cased SKU, for an import. */
    async productsBySku(orgId: number, trx: Db = db): Promise<Map<string, { id: number; tax_rate_bp: number; archived_at: string | null }>> {
      const rows = await trx('products').where('organisation_id', orgId).select('id', 'sku', 'tax_rate_bp', 'archived_at');
      return new Map(rows.map((r) => [String(r.sku).toLowerCase(), { id: r.id, tax_rate_bp: r.tax_rate_bp, archived_at: r.archived_at }]));
    },

    async insertSystem(trx: Db, orgId: number, v: { branch_id: number; name: string; description: string; settings: unknown }, components: Partial<Record<SystemRole, number>>): Promise<number> {
      const now = nowIso();
      const [row] = await trx('roof_systems')
        .insert({ organisation_id: orgId, branch_id: v.branch_id, name: v.name, description: v.description, settings: JSON.stringify(v.settings), created_at: now, updated_at: now })
        .returning('id');
      const id = (row as { id: number }).id;
      await this.replaceComponents(trx, id, components);
      return id;
    },

    async replaceComponents(trx: Db, systemId: number, components: Partial<Record<SystemRole, number>>): Promise<void> {
      await trx('roof_system_components').where({ roof_system_id: systemId }).delete();
      const rows = Object.entries(components).map(([role, product_id]) => ({ roof_system_id: systemId, role, product_id }));
      if (rows.length > 0) await trx('roof_system_components').insert(rows);
    },

    async updateSystem(trx: Db, orgId: number, id: number, v: { name?: string; description?: string; settings?: unknown }): Promise<void> {
      await trx('roof_systems')
        .where({ organisation_id: orgId, id })
        .update({
          ...(v.name !== undefined ? { name: v.name } : {}),
          ...(v.description !== undefined ? { description: v.description } : {}),
          ...(v.settings !== undefined ? { settings: JSON.stringify(v.settings) } : {}),
          updated_at: nowIso(),
        });
    },

    async systemRow(orgId: number, id: number, trx: Db = db) {
      return trx('roof_systems').where({ organisation_id: orgId, id }).first();
    },

    async archiveSystem(orgId: number, id: number): Promise<void> {
      await db('roof_systems').where({ organisation_id: orgId, id }).update({ archived_at: nowIso(), updated_at: nowIso() });
    },

    async productsOf(orgId: number, ids: number[], trx: Db = db): Promise<Map<number, { id: number; sku: string; name: string; category: ProductCategory }>> {
      if (ids.length === 0) return new Map();
      const rows = await trx('products').where('organisation_id', orgId).whereIn('id', ids).select('id', 'sku', 'name', 'category');
      return new Map(rows.map((r) => [r.id as number, r]));
    },
  };
}

export type PriceListRepository = ReturnType<typeof priceListRepository>;
