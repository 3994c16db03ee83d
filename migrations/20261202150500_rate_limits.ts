// Counters for rate limits (failed sign-ins per address and per account, and any other route that
// limits how often it is called). One row per limit and key, counted with a single upsert so that
// concurrent attempts cannot all slip under the limit; a row whose window has ended is swept.
// The old log of failed sign-ins is replaced: it was counted with a read-then-write race and never
// pruned.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE rate_limit_buckets (
      bucket text NOT NULL,
      key text NOT NULL CHECK (length(key) <= 400),
      hits integer NOT NULL CHECK (hits >= 0),
      expires_at timestamptz NOT NULL,
      PRIMARY KEY (bucket, key)
    )`);
  await knex.raw('CREATE INDEX rate_limit_buckets_expires_idx ON rate_limit_buckets (expires_at)');
  await knex.schema.dropTable('sign_in_failures');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.createTable('sign_in_failures', (t) => {
    t.bigIncrements('id');
    t.text('email').notNullable();
    t.text('address').notNullable();
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['email', 'address', 'at']);
  });
  await knex.schema.dropTable('rate_limit_buckets');
}
