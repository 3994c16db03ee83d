// What a family needs to check the work after honing and to guide the hone: a clearance range of
// its own for forged pistons (null: forged pistons use the family's one range), the ring end gap
// per unit of bore, and the hone's crosshatch angle and grits for the bore sheet.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE engine_families
      ADD COLUMN forged_clearance_min_nm integer,
      ADD COLUMN forged_clearance_max_nm integer,
      ADD COLUMN ring_gap_per_bore numeric(6, 5) NOT NULL DEFAULT 0.004,
      ADD COLUMN hone_crosshatch_deg numeric(4, 1) NOT NULL DEFAULT 45,
      ADD COLUMN hone_grits text NOT NULL DEFAULT '',
      ADD CONSTRAINT engine_families_forged_clearance_check CHECK (
        (forged_clearance_min_nm IS NULL AND forged_clearance_max_nm IS NULL)
        OR (forged_clearance_min_nm >= 0 AND forged_clearance_max_nm >= forged_clearance_min_nm)),
      ADD CONSTRAINT engine_families_ring_gap_per_bore_check
        CHECK (ring_gap_per_bore > 0 AND ring_gap_per_bore < 0.02),
      ADD CONSTRAINT engine_families_hone_crosshatch_check
        CHECK (hone_crosshatch_deg BETWEEN 10 AND 90),
      ADD CONSTRAINT engine_families_hone_grits_check CHECK (length(hone_grits) <= 120);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE engine_families
      DROP CONSTRAINT engine_families_hone_grits_check,
      DROP CONSTRAINT engine_families_hone_crosshatch_check,
      DROP CONSTRAINT engine_families_ring_gap_per_bore_check,
      DROP CONSTRAINT engine_families_forged_clearance_check,
      DROP COLUMN hone_grits,
      DROP COLUMN hone_crosshatch_deg,
      DROP COLUMN ring_gap_per_bore,
      DROP COLUMN forged_clearance_max_nm,
      DROP COLUMN forged_clearance_min_nm;
  `);
}
