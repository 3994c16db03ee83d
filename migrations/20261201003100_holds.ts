// Holds: a measured piston (or a number of ring sets) put aside for one cylinder of one job, so
// nobody else may take it before the cut. A unit is held at most once while the hold is active;
// a cylinder holds at most one piston. Also ties piston units and ledger rows to their jobs, and
// adds the seam through which purchasing reports what is on order.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE holds (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      job_id uuid NOT NULL REFERENCES jobs (id),
      cylinder integer NOT NULL,
      part_id uuid NOT NULL REFERENCES parts (id),
      unit_id uuid REFERENCES piston_units (id),
      quantity integer NOT NULL DEFAULT 1,
      expires_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      created_by uuid REFERENCES users (id),
      released_at timestamptz,
      -- released: let go by a person; moved: replaced by a hold on another job or cylinder;
      -- expired: the daily sweep; cancelled: the job was called off; issued: the job was collected.
      release_reason text,
      released_by uuid REFERENCES users (id),
      moved_from_hold_id uuid REFERENCES holds (id),
      FOREIGN KEY (job_id, cylinder) REFERENCES job_cylinders (job_id, n),
      CONSTRAINT holds_quantity_check CHECK (quantity BETWEEN 1 AND 1000),
      CONSTRAINT holds_unit_quantity_check CHECK (unit_id IS NULL OR quantity = 1),
      CONSTRAINT holds_release_check CHECK (
        (released_at IS NULL AND release_reason IS NULL)
        OR (released_at IS NOT NULL
            AND release_reason IN ('released', 'moved', 'expired', 'cancelled', 'issued')))
    );
    -- The guarantee the whole product rests on: one active hold per piston unit.
    CREATE UNIQUE INDEX holds_active_unit_unique ON holds (unit_id)
      WHERE released_at IS NULL AND unit_id IS NOT NULL;
    -- One piston per cylinder.
    CREATE UNIQUE INDEX holds_active_cylinder_piston_unique ON holds (job_id, cylinder)
      WHERE released_at IS NULL AND unit_id IS NOT NULL;
    CREATE INDEX holds_job_idx ON holds (job_id, cylinder);
    CREATE INDEX holds_active_expiry_idx ON holds (expires_at)
      WHERE released_at IS NULL AND expires_at IS NOT NULL;
    CREATE INDEX holds_part_idx ON holds (part_id);

    ALTER TABLE piston_units
      ADD CONSTRAINT piston_units_held_for_job_fk FOREIGN KEY (held_for_job_id) REFERENCES jobs (id),
      -- Deferred: a hold first claims the unit (the conditional UPDATE that decides a race), then
      -- writes its own row, in the same transaction.
      ADD CONSTRAINT piston_units_hold_fk FOREIGN KEY (hold_id) REFERENCES holds (id)
        DEFERRABLE INITIALLY DEFERRED,
      ADD CONSTRAINT piston_units_held_check CHECK (
        status <> 'held'
        OR (held_for_job_id IS NOT NULL AND hold_id IS NOT NULL AND held_cylinder IS NOT NULL));
    ALTER TABLE stock_ledger
      ADD CONSTRAINT stock_ledger_job_fk FOREIGN KEY (job_id) REFERENCES jobs (id);

    -- What is on order per part, for the step recommendation. Nothing until purchase orders are
    -- recorded: the purchasing migration replaces this body (CREATE OR REPLACE, same signature).
    CREATE FUNCTION parts_on_order() RETURNS TABLE (part_id uuid, quantity bigint)
      LANGUAGE sql STABLE AS $$ SELECT NULL::uuid, 0::bigint WHERE false $$;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP FUNCTION parts_on_order();
    ALTER TABLE stock_ledger DROP CONSTRAINT stock_ledger_job_fk;
    ALTER TABLE piston_units
      DROP CONSTRAINT piston_units_held_check,
      DROP CONSTRAINT piston_units_hold_fk,
      DROP CONSTRAINT piston_units_held_for_job_fk;
    DROP TABLE holds;
  `);
}
