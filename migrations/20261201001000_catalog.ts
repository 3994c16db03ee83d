// The catalog: step series (the oversizes a piston maker offers), engine families (what a cylinder
// needs) and parts (pistons, ring sets, kits, small parts). Lengths are integer nanometres, money is
// NUMERIC; every rule that can live in the database does.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE step_series (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      code text NOT NULL,
      name text NOT NULL,
      -- The unit the steps are named in; offsets are stored exactly in nm either way.
      unit text NOT NULL,
      custom boolean NOT NULL DEFAULT false,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT step_series_unit_check CHECK (unit IN ('mm', 'in')),
      CONSTRAINT step_series_code_check CHECK (length(trim(code)) > 0),
      CONSTRAINT step_series_name_check CHECK (length(trim(name)) > 0)
    );
    CREATE UNIQUE INDEX step_series_code_unique ON step_series (lower(code));

    CREATE TABLE series_steps (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      series_id uuid NOT NULL REFERENCES step_series (id) ON DELETE CASCADE,
      position integer NOT NULL,
      label text NOT NULL,
      -- Oversize over the standard bore (0 for STD). The nominal bore of a step is the family's
      -- standard bore plus this offset.
      offset_nm integer NOT NULL,
      CONSTRAINT series_steps_position_check CHECK (position >= 0),
      CONSTRAINT series_steps_offset_check CHECK (offset_nm >= 0 AND offset_nm <= 10000000),
      CONSTRAINT series_steps_label_check CHECK (length(trim(label)) > 0),
      CONSTRAINT series_steps_position_unique UNIQUE (series_id, position),
      CONSTRAINT series_steps_offset_unique UNIQUE (series_id, offset_nm)
    );

    CREATE TABLE engine_families (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      code text NOT NULL,
      name text NOT NULL,
      stroke_type text NOT NULL,
      cylinders integer NOT NULL,
      cooling text NOT NULL,
      standard_bore_nm integer NOT NULL,
      stroke_nm integer NOT NULL,
      -- Piston-to-wall clearance for a new piston, the maker's range.
      clearance_min_nm integer NOT NULL,
      clearance_max_nm integer NOT NULL,
      hone_allowance_nm integer NOT NULL,
      -- Metal the shop removes beyond the worst wear so the bore cleans up (on the diameter).
      cleanup_nm integer NOT NULL,
      -- Largest oversize the cylinder wall allows; past it the cylinder needs a sleeve or replacing.
      max_oversize_nm integer NOT NULL,
      step_series_id uuid NOT NULL REFERENCES step_series (id),
      -- Wear limits and ring end gap, the maker's figures; null when the shop has not recorded them.
      max_taper_nm integer,
      max_out_of_round_nm integer,
      ring_gap_min_nm integer,
      ring_gap_max_nm integer,
      notes text NOT NULL DEFAULT '',
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT engine_families_code_check CHECK (length(trim(code)) > 0),
      CONSTRAINT engine_families_name_check CHECK (length(trim(name)) > 0),
      CONSTRAINT engine_families_stroke_type_check CHECK (stroke_type IN ('two', 'four')),
      CONSTRAINT engine_families_cooling_check CHECK (cooling IN ('air', 'liquid')),
      CONSTRAINT engine_families_cylinders_check CHECK (cylinders BETWEEN 1 AND 24),
      CONSTRAINT engine_families_bore_check CHECK (standard_bore_nm > 0),
      CONSTRAINT engine_families_stroke_check CHECK (stroke_nm > 0),
      CONSTRAINT engine_families_clearance_check
        CHECK (clearance_min_nm >= 0 AND clearance_max_nm >= clearance_min_nm),
      CONSTRAINT engine_families_hone_check CHECK (hone_allowance_nm >= 0),
      CONSTRAINT engine_families_cleanup_check CHECK (cleanup_nm >= 0),
      CONSTRAINT engine_families_max_oversize_check CHECK (max_oversize_nm >= 0),
      CONSTRAINT engine_families_taper_check CHECK (max_taper_nm IS NULL OR max_taper_nm >= 0),
      CONSTRAINT engine_families_oor_check
        CHECK (max_out_of_round_nm IS NULL OR max_out_of_round_nm >= 0),
      CONSTRAINT engine_families_ring_gap_check CHECK (
        (ring_gap_min_nm IS NULL OR ring_gap_min_nm >= 0)
        AND (ring_gap_max_nm IS NULL OR ring_gap_max_nm >= 0)
        AND (ring_gap_min_nm IS NULL OR ring_gap_max_nm IS NULL OR ring_gap_max_nm >= ring_gap_min_nm))
    );
    CREATE UNIQUE INDEX engine_families_code_unique ON engine_families (lower(code));
    CREATE INDEX engine_families_series_idx ON engine_families (step_series_id);

    CREATE TABLE parts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      kind text NOT NULL,
      sku text NOT NULL,
      family_id uuid REFERENCES engine_families (id),
      step_id uuid REFERENCES series_steps (id),
      description text NOT NULL,
      material text,
      ring_count integer,
      pin_diameter_nm integer,
      -- Stored as the digits scanned or typed (8, 12, 13 or 14 of them), check digit validated.
      gtin text,
      sale_price numeric(14, 4) NOT NULL DEFAULT 0,
      -- Moving (weighted) average cost of what is on hand, updated by every receipt.
      average_cost numeric(14, 4) NOT NULL DEFAULT 0,
      reorder_point integer,
      order_up_to integer,
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT parts_kind_check CHECK (kind IN ('piston', 'rings', 'kit', 'other')),
      CONSTRAINT parts_sku_check CHECK (length(trim(sku)) > 0),
      CONSTRAINT parts_description_check CHECK (length(trim(description)) > 0),
      -- A piston or a ring set is always for one family at one step.
      CONSTRAINT parts_sized_check
        CHECK (kind NOT IN ('piston', 'rings') OR (family_id IS NOT NULL AND step_id IS NOT NULL)),
      CONSTRAINT parts_step_needs_family_check CHECK (step_id IS NULL OR family_id IS NOT NULL),
      CONSTRAINT parts_material_check CHECK (
        (kind = 'piston' AND material IN ('cast', 'forged')) OR (kind <> 'piston' AND material IS NULL)),
      CONSTRAINT parts_ring_count_check
        CHECK (ring_count IS NULL OR (kind = 'piston' AND ring_count BETWEEN 1 AND 6)),
      CONSTRAINT parts_pin_check CHECK (pin_diameter_nm IS NULL OR pin_diameter_nm > 0),
      CONSTRAINT parts_gtin_check CHECK (gtin IS NULL OR gtin ~ '^([0-9]{8}|[0-9]{12,14})$'),
      CONSTRAINT parts_money_check CHECK (sale_price >= 0 AND average_cost >= 0),
      CONSTRAINT parts_reorder_check CHECK (
        (reorder_point IS NULL OR reorder_point >= 0)
        AND (order_up_to IS NULL OR order_up_to >= 0)
        AND (reorder_point IS NULL OR order_up_to IS NULL OR order_up_to >= reorder_point))
    );
    CREATE UNIQUE INDEX parts_sku_unique ON parts (lower(sku));
    CREATE UNIQUE INDEX parts_gtin_unique ON parts (gtin) WHERE gtin IS NOT NULL;
    CREATE INDEX parts_family_step_idx ON parts (family_id, step_id, kind);
    CREATE INDEX parts_kind_idx ON parts (kind, sku);

    -- A kit is a box of other parts; it is never counted itself, its free quantity follows its parts.
    CREATE TABLE kit_components (
      kit_part_id uuid NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
      component_part_id uuid NOT NULL REFERENCES parts (id),
      quantity integer NOT NULL,
      PRIMARY KEY (kit_part_id, component_part_id),
      CONSTRAINT kit_components_quantity_check CHECK (quantity BETWEEN 1 AND 1000),
      CONSTRAINT kit_components_not_self_check CHECK (kit_part_id <> component_part_id)
    );
    CREATE INDEX kit_components_component_idx ON kit_components (component_part_id);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TABLE kit_components;
    DROP TABLE parts;
    DROP TABLE engine_families;
    DROP TABLE series_steps;
    DROP TABLE step_series;
  `);
}
