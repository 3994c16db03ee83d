// The shortage check that runs at commit when a cylinder gets a step (a hold that settles a step,
// a chosen step) finds the cylinder by its key instead of through cylinder_part_needs. Through the
// view the planner could reach the cylinder by the step's index, and with statistics taken before
// most cylinders had a step (a freshly loaded shop, a busy morning before autovacuum) it did: every
// check walked all cylinders of the step, more with each hold, about 14 ms of each commit at the
// bench. Here each look-up has only one index it can use, and the free counts are read (from
// step_free_parts, the one definition of free) only for a part that is not already held.
// What is recorded is the same as through the view: a row for each of piston and rings that the
// view would show as waiting, for an uncut cylinder of an open job still on that step, with the
// step in its family's series; "held" is the view's own test (a live hold of that kind of part).
import type { Knex } from 'knex';

const OPEN = `('booked_in', 'gauged', 'parts_set_aside', 'on_the_bar', 'at_the_hone', 'ready_to_go')`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE FUNCTION job_cylinder_note_shortage() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE
        cyl record;
        fam uuid;
        piston_held boolean;
        rings_held boolean;
        need record;
      BEGIN
        IF NEW.chosen_step_id IS NULL THEN RETURN NULL; END IF;
        -- The cylinder as it stands at commit, by its primary key alone.
        SELECT c.chosen_step_id, c.cut_at INTO cyl FROM job_cylinders c
         WHERE c.job_id = NEW.job_id AND c.n = NEW.n;
        IF NOT FOUND OR cyl.cut_at IS NOT NULL
           OR cyl.chosen_step_id IS DISTINCT FROM NEW.chosen_step_id THEN
          RETURN NULL;
        END IF;
        SELECT j.family_id INTO fam FROM jobs j WHERE j.id = NEW.job_id AND j.state IN ${OPEN};
        IF fam IS NULL THEN RETURN NULL; END IF;
        piston_held := EXISTS (SELECT 1 FROM holds h JOIN parts p ON p.id = h.part_id
                                WHERE h.job_id = NEW.job_id AND h.cylinder = NEW.n
                                  AND h.released_at IS NULL AND p.kind = 'piston');
        rings_held := EXISTS (SELECT 1 FROM holds h JOIN parts p ON p.id = h.part_id
                               WHERE h.job_id = NEW.job_id AND h.cylinder = NEW.n
                                 AND h.released_at IS NULL AND p.kind = 'rings');
        IF piston_held AND rings_held THEN RETURN NULL; END IF;
        -- CASE leaves the count of what is already held uncounted.
        SELECT CASE WHEN piston_held THEN false ELSE s.pistons_free = 0 END AS waiting_piston,
               CASE WHEN rings_held THEN false ELSE s.rings_free = 0 END AS waiting_rings
          INTO need
          FROM step_free_parts s
         WHERE s.family_id = fam AND s.step_id = NEW.chosen_step_id;
        IF NOT FOUND THEN RETURN NULL; END IF;
        IF need.waiting_piston THEN
          INSERT INTO step_shortages (family_id, step_id, job_id, cylinder, source, user_id, part)
          VALUES (fam, NEW.chosen_step_id, NEW.job_id, NEW.n, 'step_chosen', NEW.measured_by,
                  'piston')
          ON CONFLICT DO NOTHING;
        END IF;
        IF need.waiting_rings THEN
          INSERT INTO step_shortages (family_id, step_id, job_id, cylinder, source, user_id, part)
          VALUES (fam, NEW.chosen_step_id, NEW.job_id, NEW.n, 'step_chosen', NEW.measured_by,
                  'rings')
          ON CONFLICT DO NOTHING;
        END IF;
        RETURN NULL;
      END $$;
  `);
}

/** Back to reading the cylinder through cylinder_part_needs (20261203141500_part_needs). */
export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
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
