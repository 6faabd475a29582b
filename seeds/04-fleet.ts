import { BusinessCalendar, DEFAULT_BUSINESS_TIME_ZONE, addDays, isWorkingDay } from '../shared/domain/business-calendar';
import type { Knex } from 'knex';
import type { LorryValues } from '../server/modules/fleet/fleet.repository';

/**
 * The demo merchants' lorries (invented registrations), a calendar of delivery slots for the coming
 * two weeks with the demo drivers on the crane lorries, and account terms for one demo contractor.
 * Payloads are typical of a two- or three-axle rigid in Great Britain (26,000 kg gross on three axles,
 * less the lorry and its crane, Road Vehicles (Authorised Weight) Regulations 1998); crane limits are
 * for the demo only: a real lift follows the crane's own load chart and a lift plan.
 */

type DemoLorry = LorryValues;

export const DEMO_FLEET: { organisation: string; driver: string; branches: { name: string; lorries: DemoLorry[] }[] }[] = [
  {
    organisation: 'Tollerbeck Roofing Supplies',
    driver: 'driver@demo.test',
    branches: [
      {
        name: 'Tollerbeck Yard',
        lorries: [
          { registration: 'RL-TY01', name: 'Three-axle rigid with crane', payload_kg: 14_000, pallet_slots: 12, has_crane: true, crane_max_kg: 1_200 },
          { registration: 'RL-TY02', name: 'Two-axle rigid, tail lift', payload_kg: 8_000, pallet_slots: 8, has_crane: false, crane_max_kg: null },
        ],
      },
      { name: 'Cindermoor Depot', lorries: [{ registration: 'RL-CD01', name: 'Three-axle rigid with crane', payload_kg: 13_500, pallet_slots: 12, has_crane: true, crane_max_kg: 1_100 }] },
    ],
  },
  {
    organisation: 'Caddonmere Tile & Timber',
    driver: 'driver2@demo.test',
    branches: [
      { name: 'Caddonmere Wharf', lorries: [{ registration: 'RL-CW01', name: 'Three-axle rigid with crane', payload_kg: 14_500, pallet_slots: 12, has_crane: true, crane_max_kg: 1_250 }] },
      {
        name: 'Pellingsby Yard',
        lorries: [
          { registration: 'RL-PY01', name: 'Three-axle rigid with crane', payload_kg: 13_000, pallet_slots: 10, has_crane: true, crane_max_kg: 1_000 },
          { registration: 'RL-PY02', name: 'Two-axle rigid, tail lift', payload_kg: 7_500, pallet_slots: 8, has_crane: false, crane_max_kg: null },
        ],
      },
    ],
  },
];

/** A morning and an afternoon run each working day. */
export const DEMO_WINDOWS = ['07:30-12:00', '12:30-16:30'];
const DAYS_AHEAD = 14;

/** Brackenfold Roofworks buys from Tollerbeck on account at 30 days; everyone else pays by card. */
export const DEMO_ACCOUNTS = [{ merchant: 'Tollerbeck Roofing Supplies', contractor: 'Brackenfold Roofworks', terms_days: 30 }];

const idOf = (row: unknown) => (typeof row === 'object' && row !== null ? (row as { id: number }).id : (row as number));

/** Safe to run again: lorries already there are kept, and slots already in the calendar are skipped. */
export async function seed(knex: Knex): Promise<void> {
  const now = new Date().toISOString();
  const today = new BusinessCalendar(process.env.BUSINESS_TIME_ZONE ?? DEFAULT_BUSINESS_TIME_ZONE).today();
  for (const m of DEMO_FLEET) {
    const org = await knex('organisations').where({ name: m.organisation, kind: 'merchant' }).first();
    if (!org) continue;
    const driver = await knex('users').where({ email: m.driver, organisation_id: org.id, role: 'driver' }).first();
    await knex.transaction(async (trx) => {
      for (const b of m.branches) {
        const branch = await trx('branches').where({ organisation_id: org.id, name: b.name }).first();
        if (!branch) continue;
        for (const l of b.lorries) {
          let lorry = await trx('lorries').where({ organisation_id: org.id, registration: l.registration }).first();
          if (!lorry) {
            const [row] = await trx('lorries')
              .insert({ organisation_id: org.id, branch_id: branch.id, ...l, created_at: now, updated_at: now })
              .returning('id');
            lorry = { id: idOf(row) };
          }
          for (let d = 0; d < DAYS_AHEAD; d++) {
            const iso = addDays(today, d);
            if (!isWorkingDay(iso)) continue;
            for (const w of DEMO_WINDOWS) {
              if (await trx('delivery_slots').where({ lorry_id: lorry.id, date: iso, time_window: w }).first()) continue;
              await trx('delivery_slots').insert({
                organisation_id: org.id,
                branch_id: branch.id,
                lorry_id: lorry.id,
                date: iso,
                time_window: w,
                driver_user_id: l.has_crane && driver ? driver.id : null,
                booked_kg: 0,
                booked_pallets: 0,
                created_at: now,
                updated_at: now,
              });
            }
          }
        }
      }
    });
  }
  for (const a of DEMO_ACCOUNTS) {
    const merchant = await knex('organisations').where({ name: a.merchant, kind: 'merchant' }).first();
    const contractor = await knex('organisations').where({ name: a.contractor, kind: 'contractor' }).first();
    if (!merchant || !contractor) continue;
    if (await knex('contractor_accounts').where({ merchant_organisation_id: merchant.id, contractor_organisation_id: contractor.id }).first()) continue;
    await knex('contractor_accounts').insert({ merchant_organisation_id: merchant.id, contractor_organisation_id: contractor.id, terms_days: a.terms_days, created_at: now, updated_at: now });
  }
}
