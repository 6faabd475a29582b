import type { Knex } from 'knex';
import { EXAMPLE_SCHEDULE_CSV, EXAMPLE_SCHEDULE_FILENAME } from '../shared/engine/example-schedule';
import { parseScheduleCsv } from '../shared/engine/schedule-parse';
import { EXAMPLE_OPENINGS_CSV } from '../shared/engine/example-openings';
import { parseOpeningsCsv } from '../shared/engine/openings-parse';
import { schedulesRepository } from '../server/modules/schedules/schedules.repository';

/** A demo site for the demo estimator, with the example schedule already imported (invented place and people). */
const DEMO_SITE = {
  organisation: 'Brackenfold Roofworks',
  estimator: 'estimator@demo.test',
  project: {
    name: 'Hollin Brow, plots 1–20',
    reference: 'BRW-2611',
    site_address: 'Hollin Brow, off Sedgecote Lane, Tollerbeck',
    site_postcode: 'TB9 4LW',
    contact_name: 'Gethin Marlow',
    contact_phone: '07700 900 431',
    vehicle_access: 'rigid_only',
    crane_lift: 'allowed',
    overhead_lines: 'present',
    set_down_place: 'Hardstanding by the site cabin; pallets for plots 13–20 on the spine road',
    access_notes: 'Gate opens 07:30. Low cable across the spine road near plot 12: the crane lifts from the cabin side only.',
  },
  buildings: [
    { name: 'Alder', kind: 'building', notes: 'Hipped house type, plots 1–12' },
    { name: 'Birch', kind: 'building', notes: 'Gable house type with porch, plots 13–20' },
  ],
};

/** Safe to run again: a contractor that already has the demo site is left as it is. */
export async function seed(knex: Knex): Promise<void> {
  const org = await knex('organisations').where({ name: DEMO_SITE.organisation, kind: 'contractor' }).first();
  const user = await knex('users').where({ email: DEMO_SITE.estimator }).first();
  if (!org || !user) return;
  if (await knex('projects').where({ organisation_id: org.id, name: DEMO_SITE.project.name }).first()) return;
  const parsed = parseScheduleCsv(EXAMPLE_SCHEDULE_CSV);
  if (!parsed.ok) throw new Error(`the example schedule does not parse: ${parsed.errors.map((e) => e.message).join('; ')}`);
  const openings = parseOpeningsCsv(EXAMPLE_OPENINGS_CSV, parsed.faces);
  if (!openings.ok) throw new Error(`the example openings do not parse: ${openings.errors.map((e) => e.message).join('; ')}`);
  const now = new Date().toISOString();
  await knex.transaction(async (trx) => {
    const [row] = await trx('projects')
      .insert({ organisation_id: org.id, ...DEMO_SITE.project, created_by: user.id, created_at: now, updated_at: now })
      .returning('id');
    const projectId = typeof row === 'object' ? (row as { id: number }).id : (row as number);
    await trx('project_buildings').insert(DEMO_SITE.buildings.map((b, i) => ({ project_id: projectId, position: i + 1, ...b })));
    await schedulesRepository(trx).insertVersion(trx, {
      organisationId: org.id,
      projectId,
      userId: user.id,
      source: 'csv',
      filename: EXAMPLE_SCHEDULE_FILENAME,
      faces: parsed.faces,
      openings: openings.openings,
    });
  });
}
