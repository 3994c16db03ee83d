// A cylinder cut for a piston whose finished bore does not clean up the wear: refused unless the
// machinist overrides it, and then the reason is kept with the cylinder (who, when, why).
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE job_cylinders
      ADD COLUMN cleanup_override_reason text,
      ADD COLUMN cleanup_override_by uuid REFERENCES users (id),
      ADD COLUMN cleanup_override_at timestamptz,
      ADD CONSTRAINT job_cylinders_cleanup_override_check CHECK (
        (cleanup_override_reason IS NULL AND cleanup_override_at IS NULL)
        OR (length(trim(cleanup_override_reason)) > 0 AND cleanup_override_at IS NOT NULL));
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE job_cylinders
      DROP CONSTRAINT job_cylinders_cleanup_override_check,
      DROP COLUMN cleanup_override_at,
      DROP COLUMN cleanup_override_by,
      DROP COLUMN cleanup_override_reason;
  `);
}
