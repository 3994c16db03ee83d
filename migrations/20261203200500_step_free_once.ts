// What is free at a step, as the view before, with each count made once per step: the levels of a
// step's piston and ring parts in one pass, and the pistons still to measure once (the view before
// counted those twice, once for itself and once to take them off the free ones).
import type { Knex } from 'knex';

const TO_MEASURE = `(SELECT count(*) FROM piston_units pu JOIN parts p ON p.id = pu.part_id
             WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'piston'
               AND pu.status = 'free' AND pu.skirt_nm IS NULL)`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE VIEW step_free_parts AS
    SELECT f.id AS family_id, ss.id AS step_id, ss.position, ss.label, ss.offset_nm,
           (ss.offset_nm <= f.max_oversize_nm) AS within_oversize,
           (lv.pistons - tm.n)::int AS pistons_free,
           tm.n::int AS pistons_to_measure,
           lv.rings::int AS rings_free
      FROM engine_families f
      JOIN series_steps ss ON ss.series_id = f.step_series_id
      -- Each count once per step: the levels of its piston and ring parts, and those to measure.
      CROSS JOIN LATERAL (
        SELECT coalesce(sum(pl.on_hand - pl.held) FILTER (WHERE p.kind = 'piston'), 0) AS pistons,
               coalesce(sum(pl.on_hand - pl.held) FILTER (WHERE p.kind = 'rings'), 0) AS rings
          FROM parts p JOIN part_levels pl ON pl.part_id = p.id
         WHERE p.family_id = f.id AND p.step_id = ss.id) lv
      CROSS JOIN LATERAL (SELECT ${TO_MEASURE} AS n) tm;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
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
