import type { z } from 'zod';
import type { createLorryBodySchema, updateLorryBodySchema } from '../../../shared/schemas/fleet.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { nowIso } from '../../db/time';
import { AppError } from '../../http/app-error';
import { priceListRepository } from '../price-list/price-list.repository';
import { fleetRepository } from './fleet.repository';

type CreateBody = z.output<typeof createLorryBodySchema>;
type UpdateBody = z.output<typeof updateLorryBodySchema>;

const taken = (registration: string) => AppError.conflict('registration_taken', `A lorry with the registration ${registration} is already in your fleet`, [{ path: 'registration', message: 'is already in your fleet' }]);

export function fleetService({ db, config }: Pick<AppDeps, 'db' | 'config'>) {
  const fleet = fleetRepository(db);
  const branches = priceListRepository(db);

  async function lorry(user: AuthUser, id: number) {
    const l = await fleet.find(user.organisation.id, id);
    if (!l) throw AppError.notFound('Lorry');
    return l;
  }

  return {
    async list(user: AuthUser, branchId: number, includeArchived: boolean) {
      if (!(await branches.branch(user.organisation.id, branchId))) throw AppError.notFound('Branch');
      return { lorries: await fleet.list(user.organisation.id, branchId, includeArchived) };
    },

    async create(user: AuthUser, branchId: number, body: CreateBody) {
      if (!(await branches.branch(user.organisation.id, branchId))) throw AppError.notFound('Branch');
      if (await fleet.registrationTaken(user.organisation.id, body.registration)) throw taken(body.registration);
      return lorry(user, await fleet.insert(user.organisation.id, branchId, body));
    },

    /** Changes a lorry; its capacity may not fall below what its coming slots already carry. */
    async update(user: AuthUser, id: number, body: UpdateBody) {
      const existing = await lorry(user, id);
      if (body.registration && (await fleet.registrationTaken(user.organisation.id, body.registration, id))) throw taken(body.registration);
      const hasCrane = body.has_crane ?? existing.has_crane;
      const craneMax = body.has_crane === false ? null : body.crane_max_kg !== undefined ? body.crane_max_kg : existing.crane_max_kg;
      if (hasCrane && !craneMax) throw AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path: 'crane_max_kg', message: 'give the heaviest load the crane lifts, in kg' }]);
      const peak = await fleet.bookedPeak(id, config.calendar.today());
      const problems: { path: string; message: string }[] = [];
      if (body.payload_kg !== undefined && body.payload_kg < peak.kg) problems.push({ path: 'payload_kg', message: `a coming slot already carries ${Math.ceil(peak.kg)} kg` });
      if (body.pallet_slots !== undefined && body.pallet_slots < peak.pallets) problems.push({ path: 'pallet_slots', message: `a coming slot already carries ${peak.pallets} pallets` });
      if (problems.length > 0) throw AppError.conflict('lorry_booked', 'The lorry is booked beyond the new capacity; move those orders first', problems);
      await fleet.update(user.organisation.id, id, { ...body, has_crane: hasCrane, crane_max_kg: hasCrane ? craneMax : null });
      return lorry(user, id);
    },

    /**
     * Takes a lorry out of service. Its coming runs go with it, so nobody books onto a lorry that is
     * no longer there; a run with orders still to deliver holds it back (move them first), and runs
     * already delivered today stay as the record.
     */
    async archive(user: AuthUser, id: number) {
      await db.transaction(async (trx) => {
        const l = await fleet.find(user.organisation.id, id, trx);
        if (!l) throw AppError.notFound('Lorry');
        if (l.archived_at) return;
        const coming = await fleet.comingSlots(id, config.calendar.today(), trx);
        const booked = coming.filter((s) => s.waiting > 0);
        if (booked.length > 0) {
          throw AppError.conflict(
            'lorry_booked',
            `${l.registration} still has orders to deliver on ${booked.length === 1 ? 'a coming run' : `${booked.length} coming runs`}; move them to another lorry first`,
            booked.map((s) => ({ message: `${s.date} ${s.time_window}: ${s.waiting} ${s.waiting === 1 ? 'order' : 'orders'} to deliver`, slot_id: s.id, date: s.date, time_window: s.time_window })),
          );
        }
        await fleet.removeSlots(
          coming.filter((s) => s.done === 0).map((s) => s.id),
          trx,
        );
        await fleet.update(user.organisation.id, id, { archived_at: nowIso() }, trx);
      });
      return lorry(user, id);
    },

    /** Puts an archived lorry back in service (its runs are made again from the calendar). */
    async restore(user: AuthUser, id: number) {
      const l = await lorry(user, id);
      if (l.archived_at) await fleet.update(user.organisation.id, id, { archived_at: null });
      return lorry(user, id);
    },

    drivers: async (user: AuthUser) => ({ drivers: await fleet.drivers(user.organisation.id) }),
  };
}

export type FleetService = ReturnType<typeof fleetService>;
