import type { Pallet } from '../../../shared/engine/delivery';
import { orderReference } from '../../../shared/schemas/order.schema';
import type { Slot } from '../../../shared/schemas/slot.schema';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import type { OrderLoad } from './order-load';

/** Small slack for the sum of weights kept to 0.1 kg in floating point. */
const KG_SLACK = 0.001;

export interface SlotRow {
  id: number;
  organisation_id: number;
  branch_id: number;
  lorry_id: number;
  date: string;
  time_window: string;
  driver_user_id: number | null;
  booked_kg: number;
  booked_pallets: number;
  registration: string;
  lorry_name: string;
  payload_kg: number;
  pallet_slots: number;
  has_crane: boolean;
  /** Set once the lorry is out of service: its remaining runs take no new bookings. */
  lorry_archived_at: string | null;
  crane_max_kg: number | null;
  driver_name: string | null;
}

export interface BookingRow {
  id: number;
  order_id: number;
  slot_id: number;
  weight_kg: number;
  pallets: number;
  heaviest_pallet_kg: number;
  plan: { pallets: Pallet[] };
  booked_at: string;
  delivered_at: string | null;
  received_by: string | null;
  delivery_notes: string | null;
  recorded_by: number | null;
  recorded_by_name: string | null;
}

/** A slot with its lorry and driver: the columns the delivery calendar and the runs both read. */
export const SLOT_WITH_LORRY_COLUMNS = [
  's.id',
  's.organisation_id',
  's.branch_id',
  's.lorry_id',
  's.date',
  's.time_window',
  's.driver_user_id',
  's.booked_kg',
  's.booked_pallets',
  'l.registration',
  'l.name as lorry_name',
  'l.payload_kg',
  'l.pallet_slots',
  'l.has_crane',
  'l.crane_max_kg',
  'u.name as driver_name',
];

const SLOT_COLUMNS = [...SLOT_WITH_LORRY_COLUMNS, 'l.archived_at as lorry_archived_at'];

/** One merchant's slots joined to their lorry and driver, reading the columns given. */
export function slotsWithLorry(trx: Db, orgId: number, columns: readonly string[]) {
  return trx('delivery_slots as s').join('lorries as l', 'l.id', 's.lorry_id').leftJoin('users as u', 'u.id', 's.driver_user_id').where('s.organisation_id', orgId).select(columns);
}

/** A slot row with its weight as a number and the crane as a flag, whichever database handed it back. */
export function slotFigures<T extends Pick<SlotRow, 'booked_kg' | 'has_crane'>>(r: Record<string, unknown>): T {
  return { ...(r as unknown as T), booked_kg: Number(r.booked_kg), has_crane: Boolean(r.has_crane) };
}

const toSlotRow = (r: Record<string, unknown>): SlotRow => slotFigures<SlotRow>(r);

const toBooking = (r: Record<string, unknown>): BookingRow => ({
  ...(r as unknown as BookingRow),
  weight_kg: Number(r.weight_kg),
  heaviest_pallet_kg: Number(r.heaviest_pallet_kg),
  plan: JSON.parse(r.plan as string) as { pallets: Pallet[] },
});

/** The delivery calendar of a merchant; every query is scoped to the merchant. */
export function slotsRepository(db: Db) {
  const slots = (trx: Db, orgId: number) => slotsWithLorry(trx, orgId, SLOT_COLUMNS);

  return {
    async find(orgId: number, id: number, trx: Db = db): Promise<SlotRow | undefined> {
      const row = await slots(trx, orgId).where('s.id', id).first();
      return row ? toSlotRow(row) : undefined;
    },

    async forDay(orgId: number, branchId: number, date: string): Promise<SlotRow[]> {
      return (await slots(db, orgId).where({ 's.branch_id': branchId, 's.date': date }).orderBy(['s.time_window', 'l.registration'])).map(toSlotRow);
    },

    async forDriver(orgId: number, driverId: number, date: string): Promise<SlotRow[]> {
      return (await slots(db, orgId).where({ 's.driver_user_id': driverId, 's.date': date }).orderBy(['s.time_window', 'l.registration'])).map(toSlotRow);
    },

    async bookingsOfSlots(slotIds: number[], trx: Db = db) {
      if (slotIds.length === 0) return [];
      return trx('slot_bookings as sb')
        .join('orders as o', 'o.id', 'sb.order_id')
        .join('organisations as co', 'co.id', 'o.contractor_organisation_id')
        .whereIn('sb.slot_id', slotIds)
        .select('sb.*', 'o.status', 'o.site_name', 'o.site', 'o.delivery_method', 'o.notes', 'o.time_window as order_window', 'co.id as contractor_id', 'co.name as contractor_name')
        .orderBy(['sb.booked_at', 'sb.id']);
    },

    async insert(orgId: number, v: { branch_id: number; lorry_id: number; date: string; time_window: string; driver_user_id: number | null }, trx: Db = db): Promise<number | null> {
      const exists = await trx('delivery_slots').where({ lorry_id: v.lorry_id, date: v.date, time_window: v.time_window }).first('id');
      if (exists) return null;
      const now = nowIso();
      const [row] = await trx('delivery_slots')
        .insert({ organisation_id: orgId, ...v, booked_kg: 0, booked_pallets: 0, created_at: now, updated_at: now })
        .returning('id');
      return (row as { id: number }).id;
    },

    async update(orgId: number, id: number, v: { driver_user_id?: number | null; time_window?: string }): Promise<void> {
      await db('delivery_slots')
        .where({ organisation_id: orgId, id })
        .update({ ...v, updated_at: nowIso() });
    },

    async remove(orgId: number, id: number): Promise<boolean> {
      return (
        (await db('delivery_slots')
          .where({ organisation_id: orgId, id, booked_pallets: 0 })
          .whereNotExists(db('slot_bookings').whereRaw('?? = ??', ['slot_bookings.slot_id', 'delivery_slots.id']))
          .delete()) > 0
      );
    },

    async booking(orderId: number, trx: Db = db): Promise<BookingRow | undefined> {
      const row = await trx('slot_bookings as sb').leftJoin('users as u', 'u.id', 'sb.recorded_by').where('sb.order_id', orderId).select('sb.*', 'u.name as recorded_by_name').first();
      return row ? toBooking(row) : undefined;
    },

    /**
     * Adds an order's load to a slot only if the slot's lorry still has the payload and the pallet
     * slots for it; one guarded update, so two bookings cannot both take the last room.
     */
    async take(trx: Db, slotId: number, load: Pick<OrderLoad, 'weight_kg' | 'pallets'>): Promise<boolean> {
      const n = await trx('delivery_slots')
        .where('id', slotId)
        // Weights are fractional: the casts keep PostgreSQL from typing the bindings as integers.
        .whereRaw('?? + CAST(? AS DOUBLE PRECISION) <= (select ?? from ?? where ?? = ??) + CAST(? AS DOUBLE PRECISION)', [
          'booked_kg',
          load.weight_kg,
          'payload_kg',
          'lorries',
          'lorries.id',
          'delivery_slots.lorry_id',
          KG_SLACK,
        ])
        .whereRaw('?? + ? <= (select ?? from ?? where ?? = ??)', ['booked_pallets', load.pallets, 'pallet_slots', 'lorries', 'lorries.id', 'delivery_slots.lorry_id'])
        .update({ booked_kg: trx.raw('?? + CAST(? AS DOUBLE PRECISION)', ['booked_kg', load.weight_kg]), booked_pallets: trx.raw('?? + ?', ['booked_pallets', load.pallets]), updated_at: nowIso() });
      return n > 0;
    },

    async give(trx: Db, slotId: number, load: Pick<OrderLoad, 'weight_kg' | 'pallets'>): Promise<void> {
      await trx('delivery_slots')
        .where('id', slotId)
        .update({
          booked_kg: trx.raw('case when ?? > CAST(? AS DOUBLE PRECISION) then ?? - CAST(? AS DOUBLE PRECISION) else 0 end', ['booked_kg', load.weight_kg, 'booked_kg', load.weight_kg]),
          booked_pallets: trx.raw('case when ?? > ? then ?? - ? else 0 end', ['booked_pallets', load.pallets, 'booked_pallets', load.pallets]),
          updated_at: nowIso(),
        });
    },

    async insertBooking(trx: Db, orderId: number, slotId: number, load: OrderLoad, userId: number): Promise<void> {
      await trx('slot_bookings').insert({
        order_id: orderId,
        slot_id: slotId,
        weight_kg: load.weight_kg,
        pallets: load.pallets,
        heaviest_pallet_kg: load.heaviest_pallet_kg,
        plan: JSON.stringify(load.plan),
        booked_by: userId,
        booked_at: nowIso(),
      });
    },

    async deleteBooking(trx: Db, orderId: number): Promise<void> {
      // Ticks belong to the booking: a moved or re-booked order is loaded afresh.
      await trx('run_loaded_pallets').where({ order_id: orderId }).delete();
      await trx('slot_bookings').where({ order_id: orderId }).delete();
    },

    async recordDelivery(trx: Db, orderId: number, v: { delivered_at: string; received_by: string; delivery_notes: string; recorded_by: number }): Promise<void> {
      await trx('slot_bookings').where({ order_id: orderId }).update(v);
    },
  };
}

export type SlotsRepository = ReturnType<typeof slotsRepository>;

export const bookingRef = (r: { order_id: number }) => orderReference(r.order_id);

/** A slot with what is left on its lorry. */
export function toSlot(s: SlotRow, bookings: Slot['bookings']): Slot {
  return {
    id: s.id,
    branch_id: s.branch_id,
    date: s.date,
    time_window: s.time_window,
    lorry: { id: s.lorry_id, registration: s.registration, name: s.lorry_name, has_crane: s.has_crane, crane_max_kg: s.crane_max_kg },
    driver: s.driver_user_id ? { id: s.driver_user_id, name: s.driver_name ?? '' } : null,
    payload_kg: s.payload_kg,
    pallet_slots: s.pallet_slots,
    booked_kg: Math.round(s.booked_kg * 10) / 10,
    booked_pallets: s.booked_pallets,
    remaining_kg: Math.max(0, Math.round((s.payload_kg - s.booked_kg) * 10) / 10),
    remaining_pallets: Math.max(0, s.pallet_slots - s.booked_pallets),
    bookings,
  };
}
