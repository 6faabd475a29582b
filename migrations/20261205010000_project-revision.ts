import type { Knex } from 'knex';

/**
 * A site's revision, raised by every edit: an edit names the revision it was made on and is refused
 * when someone else has saved in between, so two people editing one site cannot overwrite each other.
 * Plain ADD COLUMN keeps the table (and anything attached to it) as it is.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE projects ADD COLUMN revision INTEGER NOT NULL DEFAULT 1');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE projects DROP COLUMN revision');
}
