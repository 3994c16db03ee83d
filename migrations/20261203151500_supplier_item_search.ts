// Heavy supplier-item lists at the size of a large price list (hundreds of thousands of items):
// a search by part number or description uses trigram indexes instead of reading every item, and
// the mapping queue across all suppliers reads its first page in SKU order from an index instead
// of sorting the whole queue. pg_trgm ships with PostgreSQL and is a trusted extension, so the
// database's owner may create it.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE EXTENSION IF NOT EXISTS pg_trgm;
    CREATE INDEX supplier_items_sku_trgm_idx ON supplier_items USING gin (sku gin_trgm_ops);
    CREATE INDEX supplier_items_description_trgm_idx
      ON supplier_items USING gin (description gin_trgm_ops);
    CREATE INDEX supplier_items_queue_sku_idx ON supplier_items (sku, id)
      WHERE part_id IS NULL AND NOT dropped;
    CREATE INDEX parts_sku_trgm_idx ON parts USING gin (sku gin_trgm_ops);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP INDEX IF EXISTS parts_sku_trgm_idx;
    DROP INDEX IF EXISTS supplier_items_queue_sku_idx;
    DROP INDEX IF EXISTS supplier_items_description_trgm_idx;
    DROP INDEX IF EXISTS supplier_items_sku_trgm_idx;
  `);
}
