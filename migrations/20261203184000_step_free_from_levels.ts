// What is free at a step, counted from the part levels instead of unit by unit. A piston part's
// on hand less held is its free units, measured or not (the stock door keeps the levels equal to
// the units and the ledger); those still to measure are few and found through a small partial
// index, so the free measured ones are the difference. The view keeps its columns and meaning:
// the ladder, the empty steps, the job bench and the shortage check read it unchanged, but it no
// longer reads every piston on the shelf, which at a shop group's size took seconds.
import type { Knex } from 'knex';

const TO_MEASURE = `(SELECT count(*) FROM piston_units pu JOIN parts p ON p.id = pu.part_id
             WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'piston'
               AND pu.status = 'free' AND pu.skirt_nm IS NULL)`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE INDEX piston_units_free_unmeasured_idx ON piston_units (part_id)
      WHERE status = 'free' AND skirt_nm IS NULL;

    CREATE OR REPLACE VIEW step_free_parts AS
    SELECT f.id AS family_id, ss.id AS step_id, ss.position, ss.label, ss.offset_nm,
           (ss.offset_nm <= f.max_oversize_nm) AS within_oversize,
           ((SELECT coalesce(sum(pl.on_hand - pl.held), 0) FROM parts p
               JOIN part_levels pl ON pl.part_id = p.id
              WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'piston')
            - ${TO_MEASURE})::int AS pistons_free,
           ${TO_MEASURE}::int AS pistons_to_measure,
           (SELECT coalesce(sum(pl.on_hand - pl.held), 0) FROM parts p
              JOIN part_levels pl ON pl.part_id = p.id
             WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'rings')::int AS rings_free
      FROM engine_families f
      JOIN series_steps ss ON ss.series_id = f.step_series_id;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE VIEW step_free_parts AS
    SELECT f.id AS family_id, ss.id AS step_id, ss.position, ss.label, ss.offset_nm,
           (ss.offset_nm <= f.max_oversize_nm) AS within_oversize,
           (SELECT count(*) FROM piston_units pu JOIN parts p ON p.id = pu.part_id
             WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'piston'
               AND pu.status = 'free' AND pu.skirt_nm IS NOT NULL)::int AS pistons_free,
           ${TO_MEASURE}::int AS pistons_to_measure,
           (SELECT coalesce(sum(pl.on_hand - pl.held), 0) FROM parts p
              JOIN part_levels pl ON pl.part_id = p.id
             WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'rings')::int AS rings_free
      FROM engine_families f
      JOIN series_steps ss ON ss.series_id = f.step_series_id;
    DROP INDEX piston_units_free_unmeasured_idx;
  `);
}
