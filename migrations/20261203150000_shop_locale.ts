// The shop's locale, which sets how every date is written (31/12/2026, 12/31/2026, 2026-12-31).
// A shop that already keeps settings gets the way dates were mostly written before, day first, so
// its pages read as they did; a later change of the default does not move it.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    UPDATE settings SET value = value || '{"locale": "en-GB"}'::jsonb
     WHERE key = 'shop' AND value -> 'locale' IS NULL
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`UPDATE settings SET value = value - 'locale' WHERE key = 'shop'`);
}
