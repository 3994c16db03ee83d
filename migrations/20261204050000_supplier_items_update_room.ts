// A price list that comes again rewrites every item of the supplier (its price, the import that last
// held it). Each page of supplier_items keeps half its space free, so the new version of a row fits on
// the row's own page: PostgreSQL then updates it in place of the index entries (a heap-only update)
// as long as no indexed column changes, instead of adding an entry to each of the table's seven
// indexes, two of them trigram indexes. A full page could take none of the new versions. The room is
// what a full re-import needs anyway: without it the old versions fill the same amount of space
// elsewhere until vacuum. Existing pages keep their rows; new and moved rows are written this way.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE supplier_items SET (fillfactor = 50);');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE supplier_items RESET (fillfactor);');
}
