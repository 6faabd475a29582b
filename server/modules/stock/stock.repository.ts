import type { ProductCategory } from '../../../shared/schemas/catalogue.schema';
import type { StockItem } from '../../../shared/schemas/stock.schema';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import { stockState } from '../catalogue/catalogue.service';

const likePattern = (q: string) => `%${q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

function toItem(r: Record<string, unknown>): StockItem {
  const onHand = r.on_hand as number;
  const reserved = r.reserved as number;
  const reorder = r.reorder_level as number;
  return {
    product_id: r.product_id as number,
    sku: r.sku as string,
    name: r.name as string,
    category: r.category as ProductCategory,
    unit: r.unit as string,
    pack_size: r.pack_size as number,
    pack_price: r.pack_price as number,
    on_hand: onHand,
    reserved,
    available: onHand - reserved,
    reorder_level: reorder,
    state: stockState({ on_hand: onHand, reserved, reorder_level: reorder }),
    updated_at: r.updated_at as string,
  };
}

/**
 * Stock per branch in packs. Reservations and deliveries change it only through guarded updates
 * (the row changes only if the stock is still there), so two confirmations competing for the last
 * pallets cannot both take them, on SQLite or PostgreSQL alike.
 */
export function stockRepository(db: Db) {
  const base = (trx: Db, orgId: number, branchId: number) =>
    trx('branch_products as bp')
      .join('products as p', 'p.id', 'bp.product_id')
      .join('branches as b', 'b.id', 'bp.branch_id')
      .where({ 'bp.branch_id': branchId, 'b.organisation_id': orgId, 'p.organisation_id': orgId })
      .select('bp.product_id', 'p.sku', 'p.name', 'p.category', 'p.unit', 'p.pack_size', 'bp.pack_price', 'bp.on_hand', 'bp.reserved', 'bp.reorder_level', 'bp.updated_at');

  return {
    async list(orgId: number, branchId: number, f: { q?: string; category?: ProductCategory; low: boolean }): Promise<StockItem[]> {
      const q = base(db, orgId, branchId).whereNull('p.archived_at');
      if (f.category) q.where('p.category', f.category);
      if (f.low) q.whereRaw('?? - ?? <= ??', ['bp.on_hand', 'bp.reserved', 'bp.reorder_level']);
      if (f.q) {
        const pattern = likePattern(f.q);
        q.where((w) => w.whereRaw(`lower(??) like ? escape '\\'`, ['p.sku', pattern]).orWhereRaw(`lower(??) like ? escape '\\'`, ['p.name', pattern]));
      }
      return (await q.orderBy(['p.category', 'p.sku'])).map(toItem);
    },

    async item(orgId: number, branchId: number, productId: number, trx: Db = db): Promise<StockItem | undefined> {
      const row = await base(trx, orgId, branchId).where('bp.product_id', productId).first();
      return row ? toItem(row) : undefined;
    },

    /** Stock of the given products at a branch, by product id. */
    async levels(trx: Db, branchId: number, productIds: number[]): Promise<Map<number, { on_hand: number; reserved: number }>> {
      if (productIds.length === 0) return new Map();
      const rows = await trx('branch_products').where('branch_id', branchId).whereIn('product_id', productIds).select('product_id', 'on_hand', 'reserved');
      return new Map(rows.map((r) => [r.product_id as number, { on_hand: r.on_hand, reserved: r.reserved }]));
    },

    /** Sets a count or reorder level; refuses an on-hand count below what is reserved. Returns whether it changed. */
    async update(trx: Db, branchId: number, productId: number, v: { on_hand?: number; reorder_level?: number }): Promise<boolean> {
      const q = trx('branch_products').where({ branch_id: branchId, product_id: productId });
      if (v.on_hand !== undefined) q.where('reserved', '<=', v.on_hand);
      const n = await q.update({ ...v, updated_at: nowIso() });
      return n > 0;
    },

    /** Holds packs for an order, only if that many are still free. */
    async reserve(trx: Db, branchId: number, productId: number, packs: number): Promise<boolean> {
      if (packs === 0) return true;
      const n = await trx('branch_products')
        .where({ branch_id: branchId, product_id: productId })
        .whereRaw('?? - ?? >= ?', ['on_hand', 'reserved', packs])
        .update({ reserved: trx.raw('?? + ?', ['reserved', packs]), updated_at: nowIso() });
      return n > 0;
    },

    async release(trx: Db, branchId: number, productId: number, packs: number): Promise<void> {
      if (packs === 0) return;
      await trx('branch_products')
        .where({ branch_id: branchId, product_id: productId })
        .where('reserved', '>=', packs)
        .update({ reserved: trx.raw('?? - ?', ['reserved', packs]), updated_at: nowIso() });
    },

    /** Goods leave the yard: the order's hold is released and what was handed over leaves on hand. */
    async consume(trx: Db, branchId: number, productId: number, reservedPacks: number, deliveredPacks: number): Promise<boolean> {
      if (reservedPacks === 0 && deliveredPacks === 0) return true;
      const n = await trx('branch_products')
        .where({ branch_id: branchId, product_id: productId })
        .where('reserved', '>=', reservedPacks)
        .whereRaw('?? - ? >= ?? - ?', ['on_hand', deliveredPacks, 'reserved', reservedPacks])
        .update({
          reserved: trx.raw('?? - ?', ['reserved', reservedPacks]),
          on_hand: trx.raw('?? - ?', ['on_hand', deliveredPacks]),
          updated_at: nowIso(),
        });
      return n > 0;
    },
  };
}

export type StockRepository = ReturnType<typeof stockRepository>;
