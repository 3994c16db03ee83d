// The one transaction that commits a price-list preview: items inserted or updated from the staged
// rows, price history, dropped items, the mapping kept and the preview closed; imports-repository.ts
// re-exports these.
import type { Knex } from 'knex';
import { db } from '../db/knex';

// Catalog parts by the 14-digit form of their GTIN, for mapping new supplier items automatically.
export const GTIN_PARTS = `SELECT DISTINCT ON (lpad(gtin, 14, '0')) lpad(gtin, 14, '0') AS g14, id
                      FROM parts WHERE gtin IS NOT NULL ORDER BY lpad(gtin, 14, '0'), id`;

// ---- The commit ----------------------------------------------------------------------------------

/**
 * Applies the staged rows in one statement: a history row for every price that changes, an upsert of
 * every item (new ones mapped by GTIN when the catalog knows it), and a first history row for new items.
 */
/** The commit's one statement (named parameters :imp and :sup); exported for the benchmark. */
export const APPLY_STAGED_SQL = `WITH gp AS (${GTIN_PARTS}),
          s AS (SELECT * FROM price_list_import_rows WHERE import_id = :imp AND ok),
          old AS (SELECT si.id, si.sku, si.price, si.currency
                    FROM supplier_items si JOIN s ON s.sku = si.sku
                   WHERE si.supplier_id = :sup),
          changed AS (
            INSERT INTO supplier_item_prices (item_id, price, currency, effective_from, import_id)
            SELECT old.id, s.price, s.currency, now(), :imp
              FROM old JOIN s ON s.sku = old.sku
             WHERE s.price <> old.price OR s.currency <> old.currency),
          up AS (
            INSERT INTO supplier_items AS si (supplier_id, sku, description, size_nm, oversize_nm,
                   part_id, price, currency, available, lead_days, gtin, last_import_id, dropped)
            SELECT :sup, s.sku, s.description, s.size_nm, s.oversize_nm, gp.id, s.price, s.currency,
                   s.available, s.lead_days, s.gtin, :imp, false
              FROM s LEFT JOIN gp ON gp.g14 = lpad(s.gtin, 14, '0')
            ON CONFLICT (supplier_id, sku) DO UPDATE SET
              description = EXCLUDED.description,
              size_nm = EXCLUDED.size_nm,
              oversize_nm = EXCLUDED.oversize_nm,
              part_id = coalesce(si.part_id, EXCLUDED.part_id),
              price = EXCLUDED.price,
              currency = EXCLUDED.currency,
              available = EXCLUDED.available,
              lead_days = EXCLUDED.lead_days,
              gtin = EXCLUDED.gtin,
              last_import_id = EXCLUDED.last_import_id,
              dropped = false,
              updated_at = now()
            RETURNING si.id, si.sku, si.price, si.currency)
     INSERT INTO supplier_item_prices (item_id, price, currency, effective_from, import_id)
     SELECT up.id, up.price, up.currency, now(), :imp
       FROM up WHERE NOT EXISTS (SELECT 1 FROM old WHERE old.sku = up.sku)`;

export async function applyStaged(k: Knex, importId: string, supplierId: string): Promise<number> {
  const result = await k.raw(APPLY_STAGED_SQL, { imp: importId, sup: supplierId });
  return (result as { rowCount: number }).rowCount;
}

/** A full list: the supplier's items it no longer holds (not even as a row with errors) are dropped. */
export async function markDropped(k: Knex, importId: string, supplierId: string): Promise<number> {
  const result = await k.raw(
    `UPDATE supplier_items si SET dropped = true, updated_at = now()
      WHERE si.supplier_id = :sup AND NOT si.dropped
        AND NOT EXISTS (SELECT 1 FROM price_list_import_rows r
                         WHERE r.import_id = :imp AND r.sku = si.sku)`,
    { imp: importId, sup: supplierId },
  );
  return (result as { rowCount: number }).rowCount;
}

export async function rememberedMapping(
  supplierId: string,
  k: Knex = db,
): Promise<{ mapping: Record<string, unknown>; headers: string[] } | undefined> {
  return k('supplier_mappings')
    .select('mapping', 'headers')
    .where('supplier_id', supplierId)
    .first();
}

export async function rememberMapping(
  k: Knex,
  supplierId: string,
  mapping: unknown,
  headers: string[],
  userId: string | null,
): Promise<void> {
  await k.raw(
    `INSERT INTO supplier_mappings (supplier_id, mapping, headers, user_id, updated_at)
     VALUES (?, CAST(? AS jsonb), CAST(? AS jsonb), ?, now())
     ON CONFLICT (supplier_id) DO UPDATE SET
       mapping = EXCLUDED.mapping, headers = EXCLUDED.headers, user_id = EXCLUDED.user_id,
       updated_at = now()`,
    [supplierId, JSON.stringify(mapping), JSON.stringify(headers), userId],
  );
}
