// One live preview per supplier and file. Concurrent uploads of the same bytes used to leave one
// preview each (every transaction cleared the earlier ones before any had committed); now the upload
// takes a lock per supplier and file, and this index makes a second live preview impossible. Live
// means previewed, or failed at commit (which can be committed again). Older duplicates left by the
// race are removed first, keeping the newest.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    DELETE FROM price_list_imports p
     WHERE p.status IN ('previewed', 'failed')
       AND EXISTS (
         SELECT 1 FROM price_list_imports q
          WHERE q.supplier_id = p.supplier_id AND q.sha256 = p.sha256
            AND q.status IN ('previewed', 'failed')
            AND (q.created_at, q.id) > (p.created_at, p.id));
    CREATE UNIQUE INDEX price_list_imports_live_preview_unique
      ON price_list_imports (supplier_id, sha256) WHERE status IN ('previewed', 'failed');
    -- The expiry sweep's question: which live previews are older than the limit.
    CREATE INDEX price_list_imports_live_created_idx
      ON price_list_imports (created_at) WHERE status IN ('previewed', 'failed');
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP INDEX IF EXISTS price_list_imports_live_created_idx;
    DROP INDEX IF EXISTS price_list_imports_live_preview_unique;
  `);
}
