// One estimate per job and its lines. Lines Stepstock put there from the job carry a key (the labour
// operation, the hold) so a later look at the job updates them instead of adding them twice; a key
// the staff removed or edited by hand is remembered and never proposed again. The version the
// customer approved last is kept as it was (lines and totals), whatever changes afterwards.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE estimates (
      job_id uuid PRIMARY KEY REFERENCES jobs (id) ON DELETE CASCADE,
      state text NOT NULL DEFAULT 'draft',
      version integer NOT NULL DEFAULT 1,
      dismissed_keys text[] NOT NULL DEFAULT '{}',
      sent_at timestamptz,
      decided_at timestamptz,
      approval_how text,
      approval_by uuid REFERENCES users (id),
      approval_note text,
      approved_version integer,
      approved_snapshot jsonb,
      approved_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT estimates_state_check CHECK (state IN ('draft', 'sent', 'approved', 'declined')),
      CONSTRAINT estimates_version_check CHECK (version >= 1),
      CONSTRAINT estimates_how_check CHECK (approval_how IS NULL OR approval_how IN ('link', 'counter', 'phone')),
      -- An approved estimate knows which version was approved and has its copy.
      CONSTRAINT estimates_approved_check
        CHECK (state <> 'approved' OR (approved_snapshot IS NOT NULL AND approved_version = version))
    );
    CREATE INDEX estimates_state_idx ON estimates (state);

    CREATE TABLE estimate_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      job_id uuid NOT NULL REFERENCES estimates (job_id) ON DELETE CASCADE,
      kind text NOT NULL,
      description text NOT NULL,
      quantity numeric(10, 3) NOT NULL,
      unit_price numeric(12, 2) NOT NULL,
      auto_key text,
      labour_operation_id uuid REFERENCES labour_operations (id),
      part_id uuid REFERENCES parts (id),
      position integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT estimate_lines_kind_check CHECK (kind IN ('labour', 'part', 'other')),
      CONSTRAINT estimate_lines_quantity_check CHECK (quantity > 0),
      -- Only a discount (an 'other' line) may be negative.
      CONSTRAINT estimate_lines_price_check CHECK (unit_price >= 0 OR kind = 'other'),
      CONSTRAINT estimate_lines_description_check CHECK (length(trim(description)) > 0)
    );
    CREATE INDEX estimate_lines_job_idx ON estimate_lines (job_id, position);
    CREATE UNIQUE INDEX estimate_lines_key_unique ON estimate_lines (job_id, auto_key)
      WHERE auto_key IS NOT NULL;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TABLE estimate_lines; DROP TABLE estimates;');
}
