// One definition of "free", "empty step" and "waiting for parts", kept in the database so the
// job bench, the step ladder, Empty steps, Ran short and the shortage trigger all read the same
// rows. A cylinder is fitted with a piston and a ring set of its step, so both count:
//   free piston    a measured piston unit of the family and step that nobody holds (a piston not
//                  yet measured cannot be chosen for a bore, so it is not free for a job)
//   free ring set  ring sets of the family and step on hand and not held
//   empty step     a step within the family's largest oversize with no free piston, or no free
//                  ring set, or neither
//   waiting        an uncut cylinder of an open job whose chosen step has no free piston while none
//                  is held for it, or no free ring set while none is held for it
// Shortages record which of the two ran short, so Ran short can say "piston" or "rings".
import type { Knex } from 'knex';

const OPEN = `('booked_in', 'gauged', 'parts_set_aside', 'on_the_bar', 'at_the_hone', 'ready_to_go')`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE VIEW step_free_parts AS
    SELECT f.id AS family_id, ss.id AS step_id, ss.position, ss.label, ss.offset_nm,
           (ss.offset_nm <= f.max_oversize_nm) AS within_oversize,
           (SELECT count(*) FROM piston_units pu JOIN parts p ON p.id = pu.part_id
             WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'piston'
               AND pu.status = 'free' AND pu.skirt_nm IS NOT NULL)::int AS pistons_free,
           (SELECT count(*) FROM piston_units pu JOIN parts p ON p.id = pu.part_id
             WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'piston'
               AND pu.status = 'free' AND pu.skirt_nm IS NULL)::int AS pistons_to_measure,
           (SELECT coalesce(sum(pl.on_hand - pl.held), 0) FROM parts p
              JOIN part_levels pl ON pl.part_id = p.id
             WHERE p.family_id = f.id AND p.step_id = ss.id AND p.kind = 'rings')::int AS rings_free
      FROM engine_families f
      JOIN series_steps ss ON ss.series_id = f.step_series_id;

    CREATE VIEW cylinder_part_needs AS
    SELECT x.*,
           (NOT x.piston_held AND x.pistons_free = 0) AS waiting_piston,
           (NOT x.rings_held AND x.rings_free = 0) AS waiting_rings
      FROM (SELECT c.job_id, c.n AS cylinder, j.family_id, c.chosen_step_id AS step_id,
                   EXISTS (SELECT 1 FROM holds h JOIN parts p ON p.id = h.part_id
                            WHERE h.job_id = c.job_id AND h.cylinder = c.n
                              AND h.released_at IS NULL AND p.kind = 'piston') AS piston_held,
                   EXISTS (SELECT 1 FROM holds h JOIN parts p ON p.id = h.part_id
                            WHERE h.job_id = c.job_id AND h.cylinder = c.n
                              AND h.released_at IS NULL AND p.kind = 'rings') AS rings_held,
                   s.pistons_free, s.rings_free
              FROM job_cylinders c
              JOIN jobs j ON j.id = c.job_id
              JOIN step_free_parts s ON s.family_id = j.family_id AND s.step_id = c.chosen_step_id
             WHERE j.state IN ${OPEN} AND c.cut_at IS NULL) x;

    ALTER TABLE step_shortages ADD COLUMN part text NOT NULL DEFAULT 'piston'
      CONSTRAINT step_shortages_part_check CHECK (part IN ('piston', 'rings'));
    DROP INDEX step_shortages_job_once;
    CREATE UNIQUE INDEX step_shortages_job_once
      ON step_shortages (job_id, coalesce(cylinder, 0), step_id, part) WHERE job_id IS NOT NULL;

    -- As before, checked at commit; now through the view, and once for each part that is short.
    CREATE OR REPLACE FUNCTION job_cylinder_note_shortage() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE need record;
      BEGIN
        IF NEW.chosen_step_id IS NULL THEN RETURN NULL; END IF;
        SELECT * INTO need FROM cylinder_part_needs n
         WHERE n.job_id = NEW.job_id AND n.cylinder = NEW.n AND n.step_id = NEW.chosen_step_id;
        IF NOT FOUND THEN RETURN NULL; END IF;
        IF need.waiting_piston THEN
          INSERT INTO step_shortages (family_id, step_id, job_id, cylinder, source, user_id, part)
          VALUES (need.family_id, NEW.chosen_step_id, NEW.job_id, NEW.n, 'step_chosen',
                  NEW.measured_by, 'piston')
          ON CONFLICT DO NOTHING;
        END IF;
        IF need.waiting_rings THEN
          INSERT INTO step_shortages (family_id, step_id, job_id, cylinder, source, user_id, part)
          VALUES (need.family_id, NEW.chosen_step_id, NEW.job_id, NEW.n, 'step_chosen',
                  NEW.measured_by, 'rings')
          ON CONFLICT DO NOTHING;
        END IF;
        RETURN NULL;
      END $$;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE FUNCTION job_cylinder_note_shortage() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE fam uuid;
      BEGIN
        IF NEW.chosen_step_id IS NULL THEN RETURN NULL; END IF;
        SELECT j.family_id INTO fam FROM jobs j
         WHERE j.id = NEW.job_id AND j.state NOT IN ('handed_back', 'called_off');
        IF fam IS NULL THEN RETURN NULL; END IF;
        IF NOT EXISTS (SELECT 1 FROM job_cylinders c
                        WHERE c.job_id = NEW.job_id AND c.n = NEW.n
                          AND c.chosen_step_id = NEW.chosen_step_id) THEN
          RETURN NULL;
        END IF;
        IF EXISTS (SELECT 1 FROM holds h JOIN parts p ON p.id = h.part_id AND p.kind = 'piston'
                    WHERE h.job_id = NEW.job_id AND h.cylinder = NEW.n AND h.released_at IS NULL) THEN
          RETURN NULL;
        END IF;
        IF EXISTS (SELECT 1 FROM piston_units pu JOIN parts p ON p.id = pu.part_id
                    WHERE p.family_id = fam AND p.step_id = NEW.chosen_step_id
                      AND pu.status = 'free' AND pu.skirt_nm IS NOT NULL) THEN
          RETURN NULL;
        END IF;
        INSERT INTO step_shortages (family_id, step_id, job_id, cylinder, source, user_id)
        VALUES (fam, NEW.chosen_step_id, NEW.job_id, NEW.n, 'step_chosen', NEW.measured_by)
        ON CONFLICT DO NOTHING;
        RETURN NULL;
      END $$;
    DELETE FROM step_shortages WHERE part = 'rings';
    DROP INDEX step_shortages_job_once;
    CREATE UNIQUE INDEX step_shortages_job_once
      ON step_shortages (job_id, coalesce(cylinder, 0), step_id) WHERE job_id IS NOT NULL;
    ALTER TABLE step_shortages DROP COLUMN part;
    DROP VIEW cylinder_part_needs;
    DROP VIEW step_free_parts;
  `);
}
