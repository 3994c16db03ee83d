// The shop's labour price list: each operation priced per cylinder or per job, and when Stepstock
// proposes it on a new estimate by itself (every bored cylinder, only two-strokes, every job, never).
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE labour_operations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      per text NOT NULL,
      price numeric(12, 2) NOT NULL,
      active boolean NOT NULL DEFAULT true,
      propose_for text NOT NULL DEFAULT 'never',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT labour_operations_name_check CHECK (length(trim(name)) > 0),
      CONSTRAINT labour_operations_per_check CHECK (per IN ('cylinder', 'job')),
      CONSTRAINT labour_operations_price_check CHECK (price >= 0),
      CONSTRAINT labour_operations_propose_check
        CHECK (propose_for IN ('never', 'bored', 'bored_two_stroke', 'every_job'))
    );
    CREATE UNIQUE INDEX labour_operations_name_unique ON labour_operations (lower(name));
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TABLE labour_operations');
}
