// How many of a cylinder's planned boring passes the machinist has ticked as done, in order: the
// bore sheet's "Done" column on screen, so a tablet that drops its network mid-job keeps its place.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE job_cylinders
      ADD COLUMN passes_done smallint NOT NULL DEFAULT 0
        CONSTRAINT job_cylinders_passes_done_check CHECK (passes_done BETWEEN 0 AND 100)
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE job_cylinders DROP COLUMN passes_done');
}
