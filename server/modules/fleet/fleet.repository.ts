import type { Lorry } from '../../../shared/schemas/fleet.schema';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';

export interface LorryValues {
  registration: string;
  name: string;
  payload_kg: number;
  pallet_slots: number;
  has_crane: boolean;
  crane_max_kg: number | null;
  deck_length_mm?: number;
  deck_width_mm?: number;
}

export function toLorry(r: Record<string, unknown>): Lorry {
  return {
    id: r.id as number,
    branch_id: r.branch_id as number,
    registration: r.registration as string,
    name: r.name as string,
    payload_kg: r.payload_kg as number,
    pallet_slots: r.pallet_slots as number,
    has_crane: Boolean(r.has_crane),
    crane_max_kg: (r.crane_max_kg as number | null) ?? null,
    deck_length_mm: (r.deck_length_mm as number | undefined) ?? 7300,
    deck_width_mm: (r.deck_width_mm as number | undefined) ?? 2450,
    archived_at: (r.archived_at as string | null) ?? null,
  };
}

/** A merchant's lorries and drivers, scoped to the merchant. */
export function fleetRepository(db: Db) {
  return {
    async list(orgId: number, branchId: number, includeArchived: boolean): Promise<Lorry[]> {
      const q = db('lorries').where({ organisation_id: orgId, branch_id: branchId });
      if (!includeArchived) q.whereNull('archived_at');
      return (await q.orderBy('registration')).map(toLorry);
    },

    async find(orgId: number, id: number, trx: Db = db): Promise<Lorry | undefined> {
      const row = await trx('lorries').where({ organisation_id: orgId, id }).first();
      return row ? toLorry(row) : undefined;
    },

    async registrationTaken(orgId: number, registration: string, exceptId?: number): Promise<boolean> {
      const q = db('lorries').where({ organisation_id: orgId, registration });
      if (exceptId) q.whereNot('id', exceptId);
      return Boolean(await q.first('id'));
    },

    async insert(orgId: number, branchId: number, v: LorryValues): Promise<number> {
      const now = nowIso();
      const [row] = await db('lorries')
        .insert({ organisation_id: orgId, branch_id: branchId, ...v, created_at: now, updated_at: now })
        .returning('id');
      return (row as { id: number }).id;
    },

    async update(orgId: number, id: number, v: Partial<LorryValues> & { archived_at?: string | null }, trx: Db = db): Promise<void> {
      await trx('lorries')
        .where({ organisation_id: orgId, id })
        .update({ ...v, updated_at: nowIso() });
    },

    /** The lorry's runs from a day on, with how many of their orders are still to be delivered and how many are done. */
    async comingSlots(lorryId: number, fromDate: string, trx: Db = db): Promise<{ id: number; date: string; time_window: string; waiting: number; done: number }[]> {
      const rows = await trx('delivery_slots as s')
        .leftJoin('slot_bookings as sb', 'sb.slot_id', 's.id')
        .where('s.lorry_id', lorryId)
        .where('s.date', '>=', fromDate)
        .groupBy('s.id')
        .orderBy([{ column: 's.date' }, { column: 's.time_window' }])
        .select('s.id', 's.date', 's.time_window', trx.raw('count(sb.id) - count(sb.delivered_at) as waiting'), trx.raw('count(sb.delivered_at) as done'));
      return rows.map((r) => ({ id: r.id as number, date: r.date as string, time_window: r.time_window as string, waiting: Number(r.waiting), done: Number(r.done) }));
    },

    async removeSlots(ids: number[], trx: Db): Promise<void> {
      if (ids.length > 0) await trx('delivery_slots').whereIn('id', ids).delete();
    },

    /** The heaviest booking on any of the lorry's future slots, to refuse shrinking it below what is booked. */
    async bookedPeak(lorryId: number, fromDate: string): Promise<{ kg: number; pallets: number; heaviest: number }> {
      const row = await db('delivery_slots as s')
        .leftJoin('slot_bookings as sb', 'sb.slot_id', 's.id')
        .where('s.lorry_id', lorryId)
        .where('s.date', '>=', fromDate)
        .max({ kg: 's.booked_kg', pallets: 's.booked_pallets', heaviest: 'sb.heaviest_pallet_kg' })
        .first();
      return { kg: Number(row?.kg ?? 0), pallets: Number(row?.pallets ?? 0), heaviest: Number(row?.heaviest ?? 0) };
    },

    async drivers(orgId: number): Promise<{ id: number; name: string; email: string }[]> {
      return db('users').where({ organisation_id: orgId, role: 'driver' }).select('id', 'name', 'email').orderBy('name');
    },

    async driver(orgId: number, userId: number, trx: Db = db): Promise<{ id: number; name: string } | undefined> {
      return trx('users').where({ organisation_id: orgId, id: userId, role: 'driver' }).select('id', 'name').first();
    },
  };
}

export type FleetRepository = ReturnType<typeof fleetRepository>;
