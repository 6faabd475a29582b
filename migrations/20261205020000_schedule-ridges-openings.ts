import type { Knex } from 'knex';

/**
 * A schedule version keeps the ridge each face meets and the openings in its faces (roof windows,
 * chimneys, dormers, hatches). `top_assumed` marks stored faces that have a hip or valley edge but
 * were saved before top_mm was required there: their top was taken as the eaves, and the engine warns
 * when it estimates them. Plain ADD COLUMN keeps the table as it is (no rebuild).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE schedule_faces ADD COLUMN ridge VARCHAR(100) NULL');
  await knex.raw('ALTER TABLE schedule_faces ADD COLUMN top_assumed BOOLEAN NOT NULL DEFAULT FALSE');
  await knex.raw(
    "UPDATE schedule_faces SET top_assumed = TRUE WHERE top_mm = eaves_mm AND (left_edge IN ('hip', 'valley') OR right_edge IN ('hip', 'valley'))",
  );
  await knex.schema.createTable('schedule_openings', (t) => {
    t.increments('id').primary();
    t.integer('schedule_id').notNullable().references('id').inTable('schedules').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.string('building', 100).notNullable();
    t.string('face', 100).notNullable();
    t.string('kind', 20).notNullable();
    t.double('width_mm').notNullable();
    t.double('height_mm').notNullable();
    t.integer('quantity').notNullable();
    t.index(['schedule_id', 'position']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('schedule_openings');
  await knex.raw('ALTER TABLE schedule_faces DROP COLUMN top_assumed');
  await knex.raw('ALTER TABLE schedule_faces DROP COLUMN ridge');
}
