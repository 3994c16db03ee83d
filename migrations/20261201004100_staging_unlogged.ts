// The staging rows of a previewed price list are a copy of the uploaded file, kept only until the
// commit. Unlogged, they skip the write-ahead log (a 100,000-row list writes them twice: COPY, then the
// delete after the commit). After a crash PostgreSQL empties unlogged tables; the commit counts the
// staged rows against the preview and then asks for the file again instead of applying a partial list.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE price_list_import_rows SET UNLOGGED');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE price_list_import_rows SET LOGGED');
}
