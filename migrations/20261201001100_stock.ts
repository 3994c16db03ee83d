// Stock: bins, per-part levels, one row per piston (each measured on its own) and the append-only
// ledger of every movement. The levels and the units change only together with a ledger row, in one
// transaction; the CHECKs make negative or oversold stock impossible whatever the code does.
//
// A piston unit's status:
//   free      on the shelf, may be held for a job (skirt_nm null = not measured yet, "to measure")
//   held      on the shelf, put aside for one job; nobody else may take it
//   issued    gone out to a job or a customer
//   returned  sent back to the supplier (left the shop)
//   scrapped  damaged or unusable, written off
// On hand = free + held. A hold is, in one transaction:
//   UPDATE piston_units SET status = 'held', held_for_job_id = … WHERE id = … AND status = 'free'
//   (0 rows: someone else was first), part_levels.held + 1, and a ledger 'reservation' row with
//   quantity 0 and held_delta +1. A release is the reverse ('release', held_delta -1).
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE bins (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      code text NOT NULL,
      name text NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT bins_code_check CHECK (code ~ '^[A-Za-z0-9][A-Za-z0-9._/-]{0,31}$')
    );
    CREATE UNIQUE INDEX bins_code_unique ON bins (upper(code));

    CREATE TABLE part_levels (
      part_id uuid PRIMARY KEY REFERENCES parts (id) ON DELETE CASCADE,
      on_hand integer NOT NULL DEFAULT 0,
      held integer NOT NULL DEFAULT 0,
      -- Where a counted part (rings, small parts) sits; pistons carry their own bin per unit.
      bin_id uuid REFERENCES bins (id),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT part_levels_check CHECK (on_hand >= 0 AND held >= 0 AND held <= on_hand)
    );

    -- Every part has a levels row from birth, so every feature can lock and update it.
    CREATE FUNCTION part_levels_for_new_part() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        INSERT INTO part_levels (part_id) VALUES (NEW.id);
        RETURN NEW;
      END $$;
    CREATE TRIGGER parts_levels_row AFTER INSERT ON parts
      FOR EACH ROW EXECUTE FUNCTION part_levels_for_new_part();

    CREATE SEQUENCE piston_unit_label_seq;
    -- "PU-000123": six digits at least, more once the shop passes a million pistons.
    CREATE FUNCTION next_piston_unit_label() RETURNS text LANGUAGE plpgsql AS $$
      DECLARE n bigint := nextval('piston_unit_label_seq');
      BEGIN
        RETURN 'PU-' || lpad(n::text, greatest(6, length(n::text)), '0');
      END $$;

    CREATE TABLE piston_units (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      part_id uuid NOT NULL REFERENCES parts (id),
      label text NOT NULL DEFAULT next_piston_unit_label(),
      -- Measured skirt diameter; null until someone measures it.
      skirt_nm integer,
      bin_id uuid REFERENCES bins (id),
      status text NOT NULL DEFAULT 'free',
      held_for_job_id uuid,
      held_cylinder integer,
      hold_id uuid,
      hold_expires_at timestamptz,
      received_at timestamptz NOT NULL DEFAULT now(),
      measured_at timestamptz,
      unit_cost numeric(14, 4) NOT NULL DEFAULT 0,
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT piston_units_status_check
        CHECK (status IN ('free', 'held', 'issued', 'returned', 'scrapped')),
      CONSTRAINT piston_units_skirt_check CHECK (skirt_nm IS NULL OR skirt_nm > 0),
      CONSTRAINT piston_units_cylinder_check CHECK (held_cylinder IS NULL OR held_cylinder >= 1),
      CONSTRAINT piston_units_cost_check CHECK (unit_cost >= 0),
      -- A free unit carries no trace of an old hold.
      CONSTRAINT piston_units_free_check CHECK (
        status <> 'free'
        OR (held_for_job_id IS NULL AND hold_id IS NULL AND hold_expires_at IS NULL
            AND held_cylinder IS NULL))
    );
    CREATE UNIQUE INDEX piston_units_label_unique ON piston_units (label);
    CREATE INDEX piston_units_part_status_idx ON piston_units (part_id, status);
    CREATE INDEX piston_units_job_idx ON piston_units (held_for_job_id) WHERE held_for_job_id IS NOT NULL;
    CREATE INDEX piston_units_bin_idx ON piston_units (bin_id);
    CREATE INDEX piston_units_hold_expiry_idx ON piston_units (hold_expires_at)
      WHERE hold_expires_at IS NOT NULL;

    -- The one source of truth for stock: rows are only ever added. quantity is the signed effect on
    -- on-hand, held_delta the signed effect on held, so for every part
    --   sum(quantity) = part_levels.on_hand and sum(held_delta) = part_levels.held.
    CREATE TABLE stock_ledger (
      id bigserial PRIMARY KEY,
      at timestamptz NOT NULL DEFAULT now(),
      user_id uuid REFERENCES users (id),
      part_id uuid NOT NULL REFERENCES parts (id),
      unit_id uuid REFERENCES piston_units (id),
      kind text NOT NULL,
      quantity integer NOT NULL DEFAULT 0,
      held_delta integer NOT NULL DEFAULT 0,
      unit_cost numeric(14, 4),
      sale_price numeric(14, 4),
      job_id uuid,
      reason text,
      from_bin_id uuid REFERENCES bins (id),
      to_bin_id uuid REFERENCES bins (id),
      ref text,
      CONSTRAINT stock_ledger_kind_check CHECK (kind IN
        ('receipt', 'adjustment', 'reservation', 'release', 'issue', 'return', 'scrap', 'transfer',
         'measure')),
      CONSTRAINT stock_ledger_money_check
        CHECK ((unit_cost IS NULL OR unit_cost >= 0) AND (sale_price IS NULL OR sale_price >= 0)),
      CONSTRAINT stock_ledger_receipt_check CHECK (kind <> 'receipt' OR quantity > 0),
      CONSTRAINT stock_ledger_adjustment_check
        CHECK (kind <> 'adjustment' OR (quantity <> 0 AND reason IS NOT NULL))
    );
    CREATE INDEX stock_ledger_part_at_idx ON stock_ledger (part_id, at);
    CREATE INDEX stock_ledger_unit_idx ON stock_ledger (unit_id) WHERE unit_id IS NOT NULL;
    CREATE INDEX stock_ledger_job_idx ON stock_ledger (job_id) WHERE job_id IS NOT NULL;
    CREATE INDEX stock_ledger_kind_part_idx ON stock_ledger (kind, part_id);
    CREATE INDEX stock_ledger_at_idx ON stock_ledger (at);

    CREATE FUNCTION stock_ledger_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'stock_ledger is append-only: % refused', TG_OP
          USING ERRCODE = 'restrict_violation';
      END $$;
    CREATE TRIGGER stock_ledger_append_only BEFORE UPDATE OR DELETE ON stock_ledger
      FOR EACH ROW EXECUTE FUNCTION stock_ledger_refuse_change();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TABLE stock_ledger;
    DROP FUNCTION stock_ledger_refuse_change();
    DROP TABLE piston_units;
    DROP FUNCTION next_piston_unit_label();
    DROP SEQUENCE piston_unit_label_seq;
    DROP TRIGGER parts_levels_row ON parts;
    DROP FUNCTION part_levels_for_new_part();
    DROP TABLE part_levels;
    DROP TABLE bins;
  `);
}
