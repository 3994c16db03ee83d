// The ladder's nearest pistons read from indexes instead of every piston of the family: a part's
// free pistons in skirt then label order, once ascending (the nearest at or above a step's nominal
// bore, and those still to measure, whose skirt is null) and once with the skirt descending (the
// nearest below it), so each is the first few entries of a short range scan, ties by label included.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE INDEX piston_units_free_skirt_idx ON piston_units (part_id, skirt_nm, label)
      WHERE status = 'free';
    CREATE INDEX piston_units_free_skirt_desc_idx ON piston_units (part_id, skirt_nm DESC, label)
      WHERE status = 'free' AND skirt_nm IS NOT NULL;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP INDEX piston_units_free_skirt_desc_idx;
    DROP INDEX piston_units_free_skirt_idx;
  `);
}
