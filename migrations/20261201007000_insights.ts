// Insights: the record of steps asked for when nothing was free, and the indexes that keep the
// owner's figures quick on a ledger of a million rows. Every figure is an aggregate over
// stock_ledger; the partial, covering indexes below let PostgreSQL read only the rows a figure
// needs, mostly from the index alone (the ledger is append-only, so its pages stay all-visible).
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    -- One row each time a piston was needed at a step and none was free to put aside. For a job,
    -- the first time per cylinder and step counts (the same cylinder asked about twice is one
    -- shortage); a counter sale (no job) counts every time.
    --   step_chosen  a cylinder's step was chosen and, when the change was committed, no measured
    --                piston of that family and step was free and none was held for the cylinder
    --                (trigger below)
    --   hold         a hold was refused because nothing was free (recorded by the caller)
    --   counter      a customer asked at the counter and nothing was free (recorded by the caller)
    CREATE TABLE step_shortages (
      id bigserial PRIMARY KEY,
      at timestamptz NOT NULL DEFAULT now(),
      family_id uuid NOT NULL REFERENCES engine_families (id),
      step_id uuid NOT NULL REFERENCES series_steps (id),
      job_id uuid REFERENCES jobs (id) ON DELETE CASCADE,
      cylinder integer,
      source text NOT NULL,
      user_id uuid REFERENCES users (id),
      CONSTRAINT step_shortages_source_check
        CHECK (source IN ('step_chosen', 'hold', 'counter')),
      CONSTRAINT step_shortages_cylinder_check CHECK (cylinder IS NULL OR cylinder >= 1),
      CONSTRAINT step_shortages_cylinder_needs_job_check
        CHECK (cylinder IS NULL OR job_id IS NOT NULL)
    );
    CREATE UNIQUE INDEX step_shortages_job_once
      ON step_shortages (job_id, coalesce(cylinder, 0), step_id) WHERE job_id IS NOT NULL;
    CREATE INDEX step_shortages_step_at_idx ON step_shortages (family_id, step_id, at);
    CREATE INDEX step_shortages_at_idx ON step_shortages (at);

    -- Checked when the transaction that chose the step commits, so a piston held in the same
    -- transaction (before or after the choice) counts as found, not as a shortage. Closed jobs
    -- (history being entered) are left alone.
    CREATE FUNCTION job_cylinder_note_shortage() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE fam uuid;
      BEGIN
        IF NEW.chosen_step_id IS NULL THEN RETURN NULL; END IF;
        SELECT j.family_id INTO fam FROM jobs j
         WHERE j.id = NEW.job_id AND j.state NOT IN ('handed_back', 'called_off');
        IF fam IS NULL THEN RETURN NULL; END IF;
        -- Still the step chosen at commit (a later change in the same transaction decides).
        IF NOT EXISTS (SELECT 1 FROM job_cylinders c
                        WHERE c.job_id = NEW.job_id AND c.n = NEW.n
                          AND c.chosen_step_id = NEW.chosen_step_id) THEN
          RETURN NULL;
        END IF;
        IF EXISTS (SELECT 1 FROM holds h JOIN parts p ON p.id = h.part_id AND p.kind = 'piston'
                    WHERE h.job_id = NEW.job_id AND h.cylinder = NEW.n AND h.released_at IS NULL) THEN
          RETURN NULL;
        END IF;
        -- Free means what the job list means by it: a measured piston nobody holds.
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
    CREATE CONSTRAINT TRIGGER job_cylinders_note_shortage
      AFTER INSERT OR UPDATE OF chosen_step_id ON job_cylinders
      DEFERRABLE INITIALLY DEFERRED
      FOR EACH ROW EXECUTE FUNCTION job_cylinder_note_shortage();

    -- Sales, months, top sellers and ABC: issues in a period, read from the index alone.
    CREATE INDEX stock_ledger_issue_at_idx ON stock_ledger (at)
      INCLUDE (part_id, quantity, unit_cost, sale_price) WHERE kind = 'issue';
    -- Dead stock: the last issue and the last receipt of each part, one index probe per part.
    CREATE INDEX stock_ledger_issue_part_at_idx ON stock_ledger (part_id, at) WHERE kind = 'issue';
    CREATE INDEX stock_ledger_receipt_part_at_idx ON stock_ledger (part_id, at)
      WHERE kind = 'receipt';
    -- Turnover: every movement that changed on-hand in a window, with its kind and cost.
    CREATE INDEX stock_ledger_moves_at_idx ON stock_ledger (at)
      INCLUDE (part_id, kind, quantity, unit_cost) WHERE quantity <> 0;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP INDEX stock_ledger_moves_at_idx;
    DROP INDEX stock_ledger_receipt_part_at_idx;
    DROP INDEX stock_ledger_issue_part_at_idx;
    DROP INDEX stock_ledger_issue_at_idx;
    DROP TRIGGER job_cylinders_note_shortage ON job_cylinders;
    DROP FUNCTION job_cylinder_note_shortage();
    DROP TABLE step_shortages;
  `);
}
