import type { z } from 'zod';
import { DELIVERY_METHOD_LABELS, orderReference, type OrderLine, type OrderSite } from '../../../shared/schemas/order.schema';
import { CRANE_LIFT_LABELS, OVERHEAD_LINES_LABELS, VEHICLE_ACCESS_LABELS } from '../../../shared/schemas/project.schema';
import type { createSlotBodySchema, generateSlotsBodySchema, LoadingSheet, updateSlotBodySchema } from '../../../shared/schemas/slot.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import { addDays } from '../../../shared/domain/business-calendar';
import { AppError } from '../../http/app-error';
import { orderCautions } from '../estimates/cautions';
import { estimatesRepository } from '../estimates/estimates.repository';
import { fleetRepository } from '../fleet/fleet.repository';
import { priceListRepository } from '../price-list/price-list.repository';
import { orderLoad, type OrderLoad } from './order-load';
import { slotsRepository, toSlot, type SlotRow } from './slots.repository';

type CreateBody = z.output<typeof createSlotBodySchema>;
type GenerateBody = z.output<typeof generateSlotsBodySchema>;
type UpdateBody = z.output<typeof updateSlotBodySchema>;

/** The order as booking needs it. */
export interface BookableOrder {
  id: number;
  branch_id: number;
  contractor_organisation_id: number;
  estimate_id: number | null;
  delivery_method: 'ground' | 'roof';
}

const kg = (v: number) => `${Math.round(v).toLocaleString('en-GB')} kg`;

/** ISO weekday of a YYYY-MM-DD date: 1 = Monday … 7 = Sunday. */
const weekday = (date: string) => ((new Date(`${date}T00:00:00Z`).getUTCDay() + 6) % 7) + 1;

export function slotsService({ db, config }: Pick<AppDeps, 'db' | 'config'>) {
  const todayIso = () => config.calendar.today();
  const slots = slotsRepository(db);
  const fleet = fleetRepository(db);
  const branches = priceListRepository(db);
  const estimates = estimatesRepository(db);

  async function branchOf(user: AuthUser, branchId: number) {
    const branch = await branches.branch(user.organisation.id, branchId);
    if (!branch) throw AppError.notFound('Branch');
    return branch;
  }

  async function slotOf(user: AuthUser, id: number, trx: Db = db) {
    const s = await slots.find(user.organisation.id, id, trx);
    if (!s) throw AppError.notFound('Slot');
    return s;
  }

  async function withBookings(rows: SlotRow[]) {
    const bookings = await slots.bookingsOfSlots(rows.map((r) => r.id));
    return rows.map((s) =>
      toSlot(
        s,
        bookings
          .filter((b) => b.slot_id === s.id)
          .map((b) => ({
            order_id: b.order_id,
            reference: orderReference(b.order_id),
            status: b.status,
            contractor: { id: b.contractor_id, name: b.contractor_name },
            site_name: b.site_name,
            delivery_method: b.delivery_method,
            weight_kg: Number(b.weight_kg),
            pallets: b.pallets,
            heaviest_pallet_kg: Number(b.heaviest_pallet_kg),
          })),
      ),
    );
  }

  async function driverOf(user: AuthUser, driverId: number | null | undefined, trx: Db = db) {
    if (driverId === null || driverId === undefined) return driverId ?? null;
    const d = await fleet.driver(user.organisation.id, driverId, trx);
    if (!d) throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'driver_id', message: 'is not a driver of yours' }]);
    return d.id;
  }

  return {
    async day(user: AuthUser, branchId: number, date: string) {
      const branch = await branchOf(user, branchId);
      return { branch, date, slots: await withBookings(await slots.forDay(user.organisation.id, branchId, date)) };
    },

    async get(user: AuthUser, id: number) {
      return (await withBookings([await slotOf(user, id)]))[0];
    },

    async create(user: AuthUser, branchId: number, body: CreateBody) {
      await branchOf(user, branchId);
      const lorry = await fleet.find(user.organisation.id, body.lorry_id);
      if (!lorry || lorry.branch_id !== branchId || lorry.archived_at) {
        throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'lorry_id', message: 'is not a lorry of this branch' }]);
      }
      if (body.date < todayIso()) throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'date', message: 'must be today or later' }]);
      const driver = await driverOf(user, body.driver_id);
      const id = await slots.insert(user.organisation.id, { branch_id: branchId, lorry_id: lorry.id, date: body.date, time_window: body.time_window, driver_user_id: driver });
      if (id === null) throw AppError.conflict('slot_exists', `${lorry.registration} already has a slot on ${body.date} at ${body.time_window}`);
      return (await withBookings([await slotOf(user, id)]))[0];
    },

    /** A calendar: each window on each chosen weekday for each lorry; slots already there are kept. */
    async generate(user: AuthUser, branchId: number, body: GenerateBody) {
      await branchOf(user, branchId);
      const lorries = (await fleet.list(user.organisation.id, branchId, false)).filter((l) => !body.lorry_ids || body.lorry_ids.includes(l.id));
      if (body.lorry_ids && lorries.length !== body.lorry_ids.length) {
        throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'lorry_ids', message: 'names a lorry that is not at this branch' }]);
      }
      if (lorries.length === 0) throw AppError.conflict('no_lorries', 'This branch has no lorries yet: add one first');
      const from = body.from < todayIso() ? todayIso() : body.from;
      let created = 0;
      let skipped = 0;
      await db.transaction(async (trx) => {
        for (let d = from; d <= body.to; d = addDays(d, 1)) {
          if (!body.weekdays.includes(weekday(d))) continue;
          for (const l of lorries) {
            for (const w of body.windows) {
              if ((await slots.insert(user.organisation.id, { branch_id: branchId, lorry_id: l.id, date: d, time_window: w, driver_user_id: null }, trx)) === null) skipped++;
              else created++;
            }
          }
        }
      });
      return { created, skipped };
    },

    async update(user: AuthUser, id: number, body: UpdateBody) {
      const s = await slotOf(user, id);
      const values: { driver_user_id?: number | null; time_window?: string } = {};
      if (body.driver_id !== undefined) values.driver_user_id = await driverOf(user, body.driver_id);
      if (body.time_window !== undefined) values.time_window = body.time_window;
      try {
        await slots.update(user.organisation.id, s.id, values);
      } catch (err) {
        if (/unique/i.test(String((err as Error).message))) throw AppError.conflict('slot_exists', `${s.registration} already has a slot on ${s.date} at ${body.time_window}`);
        throw err;
      }
      return (await withBookings([await slotOf(user, id)]))[0];
    },

    async remove(user: AuthUser, id: number) {
      await slotOf(user, id);
      if (!(await slots.remove(user.organisation.id, id))) throw AppError.conflict('slot_booked', 'Orders are booked into this slot: move them first');
    },

    /** The engine's delivery plan of what the order sends now (its reserved packs). */
    async loadOf(trx: Db, order: BookableOrder, lines: OrderLine[]): Promise<OrderLoad> {
      const estimate = order.estimate_id ? await estimates.find(order.contractor_organisation_id, order.estimate_id, trx) : undefined;
      return orderLoad(
        lines.map((l) => ({ category: l.category, packs: l.reserved_quantity, pack_size: l.pack_size, pack_weight_kg: l.pack_weight_kg })),
        estimate ?? null,
      );
    },

    /**
     * Books (or moves) an order into a slot of its branch, inside the caller's transaction: the
     * lorry must have the payload and pallet slots left for this order's plan, and a crane that
     * lifts its heaviest pallet when the order goes onto the roof. Refusals are 409 with the figures.
     */
    async book(trx: Db, user: AuthUser, order: BookableOrder, slotId: number, load: OrderLoad): Promise<SlotRow> {
      const slot = await slots.find(user.organisation.id, slotId, trx);
      if (!slot) throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'slot_id', message: 'is not one of your delivery slots' }]);
      if (slot.branch_id !== order.branch_id)
        throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'slot_id', message: "is a slot of another branch: book a lorry of the order's branch" }]);
      if (slot.date < todayIso()) throw AppError.conflict('slot_past', `The slot on ${slot.date} has passed`);
      if (slot.lorry_archived_at) throw AppError.conflict('lorry_archived', `${slot.registration} is out of service: book another lorry`);
      if (load.pallets === 0) throw AppError.conflict('nothing_to_deliver', 'Nothing on this order is confirmed to send yet');
      if (order.delivery_method === 'roof') {
        if (!slot.has_crane) throw AppError.conflict('crane_needed', `The order is lifted onto the roof, and ${slot.registration} has no crane: choose a crane lorry`);
        if ((slot.crane_max_kg ?? 0) < load.heaviest_pallet_kg) {
          throw AppError.conflict('crane_too_small', `The heaviest pallet weighs ${kg(load.heaviest_pallet_kg)}, more than the ${kg(slot.crane_max_kg ?? 0)} the crane of ${slot.registration} lifts`, [
            { path: 'slot_id', message: `heaviest pallet ${load.heaviest_pallet_kg} kg, crane limit ${slot.crane_max_kg} kg`, heaviest_pallet_kg: load.heaviest_pallet_kg, crane_max_kg: slot.crane_max_kg },
          ]);
        }
      }
      const existing = await slots.booking(order.id, trx);
      if (existing) {
        await slots.give(trx, existing.slot_id, existing);
        await slots.deleteBooking(trx, order.id);
      }
      if (!(await slots.take(trx, slot.id, load))) {
        const now = (await slots.find(user.organisation.id, slot.id, trx))!;
        const remainingKg = Math.max(0, Math.round((now.payload_kg - now.booked_kg) * 10) / 10);
        const remainingPallets = Math.max(0, now.pallet_slots - now.booked_pallets);
        throw AppError.conflict(
          'slot_full',
          `${slot.registration} on ${slot.date} ${slot.time_window} has ${kg(remainingKg)} and ${remainingPallets} pallet slots left; this order needs ${kg(load.weight_kg)} and ${load.pallets} pallets`,
          [{ path: 'slot_id', message: 'the lorry would be overbooked', remaining_kg: remainingKg, remaining_pallets: remainingPallets, weight_kg: load.weight_kg, pallets: load.pallets }],
        );
      }
      await slots.insertBooking(trx, order.id, slot.id, load, user.id);
      return slot;
    },

    async unbook(trx: Db, orderId: number): Promise<boolean> {
      const existing = await slots.booking(orderId, trx);
      if (!existing) return false;
      await slots.give(trx, existing.slot_id, existing);
      await slots.deleteBooking(trx, orderId);
      return true;
    },

    booking: (orderId: number, trx: Db = db) => slots.booking(orderId, trx),
    recordDelivery: (trx: Db, orderId: number, v: { delivered_at: string; received_by: string; delivery_notes: string; recorded_by: number }) => slots.recordDelivery(trx, orderId, v),
    slot: (orgId: number, id: number, trx: Db = db) => slots.find(orgId, id, trx),

    /**
     * A driver's day: each run (slot) with its stops in booking order and the pallets in the order they
     * go onto the lorry, the last stop's first, so the first stop's pallets come off first.
     */
    async loadingSheet(user: AuthUser, q: { date?: string; driver_id?: number }, linesOf: (orderId: number) => Promise<OrderLine[]>): Promise<LoadingSheet> {
      const date = q.date ?? todayIso();
      let driverId: number;
      if (user.role === 'driver') {
        if (q.driver_id && q.driver_id !== user.id) throw AppError.forbidden('A driver sees only their own loading sheet');
        driverId = user.id;
      } else {
        if (!q.driver_id) throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'driver_id', message: 'name the driver whose sheet you want' }]);
        driverId = q.driver_id;
      }
      const driver = await fleet.driver(user.organisation.id, driverId);
      if (!driver) throw AppError.notFound('Driver');
      const runs = await slots.forDriver(user.organisation.id, driverId, date);
      const bookings = await slots.bookingsOfSlots(runs.map((r) => r.id));
      const out: LoadingSheet['runs'] = [];
      for (const run of runs) {
        const stops = [];
        for (const b of bookings.filter((x) => x.slot_id === run.id)) {
          const site = JSON.parse(b.site) as OrderSite;
          const lines = (await linesOf(b.order_id)).filter((l) => l.reserved_quantity > 0);
          const notes = [
            `${DELIVERY_METHOD_LABELS[b.delivery_method as 'ground' | 'roof']}.`,
            site.set_down_place ? `Set down: ${site.set_down_place}` : 'No set-down place recorded: ask the site contact.',
            `Vehicle access: ${VEHICLE_ACCESS_LABELS[site.vehicle_access]}. Crane lift: ${CRANE_LIFT_LABELS[site.crane_lift]}. Overhead lines: ${OVERHEAD_LINES_LABELS[site.overhead_lines]}.`,
            ...(site.access_notes ? [`Access: ${site.access_notes}`] : []),
            ...(site.contact_name || site.contact_phone ? [`Site contact: ${[site.contact_name, site.contact_phone].filter(Boolean).join(', ')}`] : []),
            ...(b.notes ? [`Order notes: ${b.notes}`] : []),
            ...(b.delivery_method === 'roof' ? ['Roof loading: spread the stacks evenly over both slopes and across braced rafters, as the roof loading plan shows; never stack on one spot.'] : []),
          ];
          const plan = JSON.parse(typeof b.plan === 'string' ? b.plan : JSON.stringify(b.plan)) as {
            pallets: {
              n: number;
              kind: 'tiles' | 'accessories';
              weight_kg: number;
              tiles: number;
              faces: { building: string; face: string; tiles: number }[];
              items: { item: string; quantity: number; weight_kg: number }[];
            }[];
          };
          stops.push({
            order_id: b.order_id,
            reference: orderReference(b.order_id),
            status: b.status,
            contractor: { id: b.contractor_id, name: b.contractor_name },
            site,
            delivery_method: b.delivery_method,
            weight_kg: Number(b.weight_kg),
            plan: plan.pallets,
            lines: lines.map((l) => ({ line_id: l.id, sku: l.sku, description: l.description, unit: l.unit, quantity: l.reserved_quantity })),
            notes,
            cautions: orderCautions(b.delivery_method, site),
          });
        }
        // What comes off first goes on last: the last stop is loaded first, each stop's pallets in reverse.
        let position = 0;
        const loadOrder = new Map<number, Map<number, number>>();
        for (const stop of [...stops].reverse()) {
          const m = new Map<number, number>();
          for (const p of [...stop.plan].sort((a, b) => b.n - a.n)) m.set(p.n, ++position);
          loadOrder.set(stop.order_id, m);
        }
        out.push({
          slot_id: run.id,
          time_window: run.time_window,
          lorry: { id: run.lorry_id, registration: run.registration, has_crane: run.has_crane, crane_max_kg: run.crane_max_kg },
          weight_kg: Math.round(run.booked_kg * 10) / 10,
          pallets: run.booked_pallets,
          stops: stops.map(({ plan, ...s }) => ({
            ...s,
            pallets: plan
              .map((p) => ({ load_position: loadOrder.get(s.order_id)!.get(p.n)!, n: p.n, kind: p.kind, weight_kg: p.weight_kg, tiles: p.tiles, faces: p.faces, items: p.items }))
              .sort((a, b) => a.load_position - b.load_position),
          })),
        });
      }
      return { date, driver: { id: driver.id, name: driver.name }, runs: out };
    },
  };
}

export type SlotsService = ReturnType<typeof slotsService>;
