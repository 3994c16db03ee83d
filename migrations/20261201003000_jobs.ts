// Cylinder jobs: the customer's job, one row per cylinder with its bore readings and the sizes
// recorded at the machine, notes on the job (its history), and intake photos.
//
// A job's state, in our own words:
//   booked_in        taken in, nothing measured yet
//   gauged           bores measured
//   parts_set_aside  the measured pistons are held for the job
//   on_the_bar       boring (refused unless every cylinder being cut has its piston held)
//   at_the_hone      honing and finishing
//   ready_to_go      done, waiting for the customer
//   handed_back      collected: held parts issued
//   called_off       cancelled: every hold released
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE SEQUENCE job_number_seq;
    -- "CY-2612-0042": CY, the year and month the job came in, and a running number that never
    -- restarts (so a number is never reused), four digits at least.
    CREATE FUNCTION next_job_number() RETURNS text LANGUAGE plpgsql AS $$
      DECLARE n bigint := nextval('job_number_seq');
      BEGIN
        RETURN 'CY-' || to_char(now() AT TIME ZONE 'UTC', 'YYMM') || '-'
          || lpad(n::text, greatest(4, length(n::text)), '0');
      END $$;

    CREATE TABLE jobs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      number text NOT NULL DEFAULT next_job_number(),
      customer_name text NOT NULL,
      customer_phone text,
      customer_email text,
      family_id uuid NOT NULL REFERENCES engine_families (id),
      cylinders integer NOT NULL,
      asked_for text NOT NULL DEFAULT '',
      due_date date,
      notes text NOT NULL DEFAULT '',
      state text NOT NULL DEFAULT 'booked_in',
      notify_customer boolean NOT NULL DEFAULT true,
      created_by uuid REFERENCES users (id),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      state_changed_at timestamptz NOT NULL DEFAULT now(),
      closed_at timestamptz,
      CONSTRAINT jobs_state_check CHECK (state IN ('booked_in', 'gauged', 'parts_set_aside',
        'on_the_bar', 'at_the_hone', 'ready_to_go', 'handed_back', 'called_off')),
      CONSTRAINT jobs_customer_check CHECK (length(trim(customer_name)) > 0),
      CONSTRAINT jobs_cylinders_check CHECK (cylinders BETWEEN 1 AND 24),
      -- A closed job (collected or cancelled) says when; an open one does not.
      CONSTRAINT jobs_closed_check
        CHECK ((state IN ('handed_back', 'called_off')) = (closed_at IS NOT NULL))
    );
    CREATE UNIQUE INDEX jobs_number_unique ON jobs (number);
    CREATE INDEX jobs_state_due_idx ON jobs (state, due_date);
    CREATE INDEX jobs_family_idx ON jobs (family_id);
    CREATE INDEX jobs_created_idx ON jobs (created_at);

    CREATE TABLE job_cylinders (
      job_id uuid NOT NULL REFERENCES jobs (id) ON DELETE CASCADE,
      n integer NOT NULL,
      -- Worst wear from the readings, kept with them so lists need not recompute it.
      largest_nm integer,
      taper_nm integer,
      out_of_round_nm integer,
      measured_at timestamptz,
      measured_by uuid REFERENCES users (id),
      chosen_step_id uuid REFERENCES series_steps (id),
      -- Piston-to-wall clearance chosen for this bore; null = the shop's policy within the range.
      clearance_nm integer,
      cut_at timestamptz,
      cut_by uuid REFERENCES users (id),
      measured_after_hone_nm integer,
      ring_gap_nm integer,
      PRIMARY KEY (job_id, n),
      CONSTRAINT job_cylinders_n_check CHECK (n BETWEEN 1 AND 24),
      CONSTRAINT job_cylinders_wear_check CHECK (
        (largest_nm IS NULL OR largest_nm > 0) AND (taper_nm IS NULL OR taper_nm >= 0)
        AND (out_of_round_nm IS NULL OR out_of_round_nm >= 0)),
      CONSTRAINT job_cylinders_clearance_check CHECK (clearance_nm IS NULL OR clearance_nm >= 0),
      CONSTRAINT job_cylinders_after_check CHECK (
        (measured_after_hone_nm IS NULL OR measured_after_hone_nm > 0)
        AND (ring_gap_nm IS NULL OR ring_gap_nm >= 0)),
      -- Sizes after honing are recorded only for a cylinder that has been cut.
      CONSTRAINT job_cylinders_cut_first_check CHECK (
        cut_at IS NOT NULL OR (measured_after_hone_nm IS NULL AND ring_gap_nm IS NULL))
    );
    CREATE INDEX job_cylinders_step_idx ON job_cylinders (chosen_step_id)
      WHERE chosen_step_id IS NOT NULL;

    -- Bore-gauge readings: three depths on two axes, each diameter exact in nm, with the unit it
    -- was typed in so it reads back as typed.
    CREATE TABLE bore_readings (
      job_id uuid NOT NULL,
      n integer NOT NULL,
      depth text NOT NULL,
      axis text NOT NULL,
      diameter_nm integer NOT NULL,
      unit text NOT NULL,
      PRIMARY KEY (job_id, n, depth, axis),
      FOREIGN KEY (job_id, n) REFERENCES job_cylinders (job_id, n) ON DELETE CASCADE,
      CONSTRAINT bore_readings_depth_check CHECK (depth IN ('top', 'middle', 'bottom')),
      CONSTRAINT bore_readings_axis_check CHECK (axis IN ('pin', 'thrust')),
      CONSTRAINT bore_readings_diameter_check CHECK (diameter_nm > 0),
      CONSTRAINT bore_readings_unit_check CHECK (unit IN ('mm', 'in'))
    );

    -- The job's history: notes people add and what Stepstock did by itself (a hold that expired).
    CREATE TABLE job_events (
      id bigserial PRIMARY KEY,
      job_id uuid NOT NULL REFERENCES jobs (id) ON DELETE CASCADE,
      at timestamptz NOT NULL DEFAULT now(),
      user_id uuid REFERENCES users (id),
      kind text NOT NULL,
      text text NOT NULL,
      CONSTRAINT job_events_kind_check CHECK (kind IN ('note', 'state', 'hold', 'work', 'system')),
      CONSTRAINT job_events_text_check CHECK (length(trim(text)) > 0 AND length(text) <= 2000)
    );
    CREATE INDEX job_events_job_idx ON job_events (job_id, at);

    -- Intake photos live in the database, so every server process and every backup has them.
    -- The thumbnail is made by the browser before upload; without one the client scales the photo.
    CREATE TABLE job_photos (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      job_id uuid NOT NULL REFERENCES jobs (id) ON DELETE CASCADE,
      content_type text NOT NULL,
      size_bytes integer NOT NULL,
      data bytea NOT NULL,
      thumbnail_type text,
      thumbnail bytea,
      original_name text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users (id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT job_photos_type_check
        CHECK (content_type IN ('image/jpeg', 'image/png', 'image/webp')),
      CONSTRAINT job_photos_size_check
        CHECK (size_bytes > 0 AND size_bytes <= 10485760 AND size_bytes = octet_length(data)),
      CONSTRAINT job_photos_thumbnail_check CHECK (
        (thumbnail IS NULL AND thumbnail_type IS NULL)
        OR (thumbnail IS NOT NULL
            AND thumbnail_type IN ('image/jpeg', 'image/png', 'image/webp')))
    );
    CREATE INDEX job_photos_job_idx ON job_photos (job_id, created_at);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TABLE job_photos;
    DROP TABLE job_events;
    DROP TABLE bore_readings;
    DROP TABLE job_cylinders;
    DROP TABLE jobs;
    DROP FUNCTION next_job_number();
    DROP SEQUENCE job_number_seq;
  `);
}
