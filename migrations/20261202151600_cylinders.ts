// A customer's cylinder as a thing with a history. The shop marks it at intake (its own tag,
// unique in the shop, compared without regard to case) and may note the number cast or stamped on
// it. Each cylinder of a job may link to one; the cylinder's bores are the cut job cylinders
// linked to it, so its history is never a second copy of the bench record.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE cylinders (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      customer_id uuid NOT NULL REFERENCES customers (id),
      family_id uuid NOT NULL REFERENCES engine_families (id),
      mark text NOT NULL,
      cast_number text,
      created_by uuid REFERENCES users (id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT cylinders_mark_check CHECK (length(trim(mark)) > 0 AND length(mark) <= 40),
      CONSTRAINT cylinders_cast_check CHECK (cast_number IS NULL OR length(cast_number) <= 60)
    );
    CREATE UNIQUE INDEX cylinders_mark_unique ON cylinders (lower(mark));
    CREATE INDEX cylinders_customer_idx ON cylinders (customer_id);

    ALTER TABLE job_cylinders ADD COLUMN cylinder_id uuid REFERENCES cylinders (id);
    -- One physical cylinder is one place in a job, not two.
    CREATE UNIQUE INDEX job_cylinders_cylinder_once ON job_cylinders (job_id, cylinder_id)
      WHERE cylinder_id IS NOT NULL;
    CREATE INDEX job_cylinders_cylinder_idx ON job_cylinders (cylinder_id)
      WHERE cylinder_id IS NOT NULL;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE job_cylinders DROP COLUMN cylinder_id;
    DROP TABLE cylinders;
  `);
}
