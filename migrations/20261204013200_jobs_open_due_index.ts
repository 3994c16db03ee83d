// The job bench's open jobs in the list's own order (due date, then number), so its first page is
// read straight from the index and its count from the index alone, instead of sorting every open
// job of the shop for each page.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE INDEX jobs_open_due_idx ON jobs (due_date, number)
      WHERE state IN ('booked_in', 'gauged', 'parts_set_aside', 'on_the_bar', 'at_the_hone',
                      'ready_to_go');
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX jobs_open_due_idx;');
}
