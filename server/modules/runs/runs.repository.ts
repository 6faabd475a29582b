import type { Pallet } from '../../../shared/engine/delivery';
import type { OrderSite, OrderStatus } from '../../../shared/schemas/order.schema';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import { SLOT_WITH_LORRY_COLUMNS, slotFigures, slotsWithLorry, type SlotRow } from '../slots/slots.repository';

/** A delivery slot read as a run: the slot, its lorry (with its deck) and driver, and whether it has been sent out. */
export interface RunRow extends Omit<SlotRow, 'lorry_archived_at'> {
  deck_length_mm: number;
  deck_width_mm: number;
  sent_out_at: string | null;
  send_out_override: string | null;
}

export interface DropRow {
  slot_id: number;
  order_id: number;
  drop_position: number | null;
  weight_kg: number;
  pallets: number;
  plan: { pallets: Pallet[] };
  status: OrderStatus;
  site_name: string;
  site: OrderSite;
  delivery_method: 'ground' | 'roof';
  notes: string;
  contractor_id: number;
  contractor_name: string;
  delivered_at: string | null;
}

export interface PickRow {
  order_id: number;
  sku: string;
  description: string;
  unit: string;
  pack_size: number;
  reserved_quantity: number;
  back_order_quantity: number;
  status: string;
  category: string;
}

const RUN_COLUMNS = [...SLOT_WITH_LORRY_COLUMNS, 's.sent_out_at', 's.send_out_override', 'l.deck_length_mm', 'l.deck_width_mm'];

const toRun = (r: Record<string, unknown>): RunRow => slotFigures<RunRow>(r);

/** Runs of a merchant: every query is scoped to the merchant's organisation. */
export function runsRepository(db: Db) {
  const runs = (trx: Db, orgId: number) => slotsWithLorry(trx, orgId, RUN_COLUMNS);

  return {
    async find(orgId: number, id: number, trx: Db = db): Promise<RunRow | undefined> {
      const row = await runs(trx, orgId).where('s.id', id).first();
      return row ? toRun(row) : undefined;
    },

    /** The runs of a branch between two dates (inclusive), optionally only one driver's. */
    async between(orgId: number, branchId: number, from: string, to: string, driverId?: number): Promise<RunRow[]> {
      const q = runs(db, orgId).where('s.branch_id', branchId).whereBetween('s.date', [from, to]);
      if (driverId !== undefined) q.where('s.driver_user_id', driverId);
      return (await q.orderBy(['s.date', 's.time_window', 'l.registration'])).map(toRun);
    },

    /** The drops of the runs, each run's in drop order (set ones first, then new bookings in booking order). */
    async drops(slotIds: number[], trx: Db = db): Promise<DropRow[]> {
      if (slotIds.length === 0) return [];
      const rows = await trx('slot_bookings as sb')
        .join('orders as o', 'o.id', 'sb.order_id')
        .join('organisations as co', 'co.id', 'o.contractor_organisation_id')
        .whereIn('sb.slot_id', slotIds)
        .select(
          'sb.slot_id',
          'sb.order_id',
          'sb.drop_position',
          'sb.weight_kg',
          'sb.pallets',
          'sb.plan',
          'sb.delivered_at',
          'o.status',
          'o.site_name',
          'o.site',
          'o.delivery_method',
          'o.notes',
          'co.id as contractor_id',
          'co.name as contractor_name',
        )
        .orderByRaw('sb.slot_id, sb.drop_position is null, sb.drop_position, sb.booked_at, sb.id');
      return rows.map((r: Record<string, unknown>) => ({
        ...(r as unknown as DropRow),
        weight_kg: Number(r.weight_kg),
        plan: JSON.parse(r.plan as string) as DropRow['plan'],
        site: JSON.parse(r.site as string) as OrderSite,
      }));
    },

    async loaded(slotIds: number[], trx: Db = db): Promise<Array<{ slot_id: number; order_id: number; pallet: number }>> {
      if (slotIds.length === 0) return [];
      return trx('run_loaded_pallets').whereIn('slot_id', slotIds).select('slot_id', 'order_id', 'pallet');
    },

    async pickLines(orderIds: number[], trx: Db = db): Promise<PickRow[]> {
      if (orderIds.length === 0) return [];
      return trx('order_lines')
        .whereIn('order_id', orderIds)
        .select('order_id', 'sku', 'description', 'unit', 'pack_size', 'reserved_quantity', 'back_order_quantity', 'status', 'category')
        .orderBy(['order_id', 'position', 'id']);
    },

    /** Pallet footprint (mm) of each order's tiles, from its tile product. */
    async footprints(orderIds: number[], trx: Db = db): Promise<Map<number, { length_mm: number; width_mm: number }>> {
      if (orderIds.length === 0) return new Map();
      const rows = await trx('order_lines as ol')
        .join('products as p', 'p.id', 'ol.product_id')
        .whereIn('ol.order_id', orderIds)
        .where('ol.category', 'tile')
        .groupBy('ol.order_id')
        .select('ol.order_id')
        .max({ length_mm: 'p.pallet_length_mm', width_mm: 'p.pallet_width_mm' });
      return new Map(rows.map((r: Record<string, number>) => [r.order_id, { length_mm: Number(r.length_mm), width_mm: Number(r.width_mm) }]));
    },

    async setDropOrder(trx: Db, slotId: number, orderIds: number[]): Promise<void> {
      for (const [i, id] of orderIds.entries())
        await trx('slot_bookings')
          .where({ slot_id: slotId, order_id: id })
          .update({ drop_position: i + 1 });
    },

    async markLoaded(slotId: number, orderId: number, pallet: number, userId: number): Promise<void> {
      await db('run_loaded_pallets').insert({ slot_id: slotId, order_id: orderId, pallet, loaded_by: userId, loaded_at: nowIso() }).onConflict(['slot_id', 'order_id', 'pallet']).ignore();
    },

    async unmarkLoaded(slotId: number, orderId: number, pallet: number): Promise<void> {
      await db('run_loaded_pallets').where({ slot_id: slotId, order_id: orderId, pallet }).delete();
    },

    async markSentOut(trx: Db, slotId: number, v: { by: number; override: string | null }): Promise<void> {
      await trx('delivery_slots').where('id', slotId).update({ sent_out_at: nowIso(), sent_out_by: v.by, send_out_override: v.override, updated_at: nowIso() });
    },

    async bookingOf(orderId: number, trx: Db = db): Promise<{ slot_id: number } | undefined> {
      return trx('slot_bookings').where('order_id', orderId).first('slot_id');
    },
  };
}

export type RunsRepository = ReturnType<typeof runsRepository>;
