// The one transaction that commits a price-list preview: items inserted or updated from the staged
// rows, price history and dropped items in one statement, then the mapping kept; imports-repository.ts
// re-exports these.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { ImportCountsJson } from '../../shared/api/suppliers';

// Catalog parts by the 14-digit form of their GTIN, for mapping new supplier items automatically.
export const GTIN_PARTS = `SELECT DISTINCT ON (lpad(gtin, 14, '0')) lpad(gtin, 14, '0') AS g14, id
                      FROM parts WHERE gtin IS NOT NULL ORDER BY lpad(gtin, 14, '0'), id`;

// ---- The commit ----------------------------------------------------------------------------------

/** How a list compares with what the supplier offers until now (the preview's counts). */
export type Comparison = Omit<ImportCountsJson, 'rows' | 'ok' | 'errors'>;

/** What the commit's statement answers: the staged rows it applied and how they compare. */
export interface Applied extends Comparison {
  staged: number;
}

/**
 * The whole commit in one statement (named parameters :imp, :sup, :drop): an upsert of every staged
 * item (new ones mapped by GTIN when the catalog knows it), a history row for every new item and every
 * price that changes, the supplier's items the list no longer holds (not even as a row with errors)
 * marked dropped when :drop, and the counts the preview showed. Every part of one statement reads
 * the same snapshot, so `old` (supplier_items joined by id) is each item as it was before the upsert,
 * and the counts are those of the list against what the supplier offered until now. Every join has
 * an index on its inner side, so a staging table whose statistics say "empty" cannot lead the planner
 * into comparing every staged row with every item.
 */
export const APPLY_STAGED_SQL = `WITH gp AS (${GTIN_PARTS}),
     up AS (
       INSERT INTO supplier_items AS si (supplier_id, sku, description, size_nm, oversize_nm,
              part_id, price, currency, available, lead_days, gtin, last_import_id, dropped)
       SELECT :sup, s.sku, s.description, s.size_nm, s.oversize_nm, gp.id, s.price, s.currency,
              s.available, s.lead_days, s.gtin, :imp, false
         FROM price_list_import_rows s LEFT JOIN gp ON gp.g14 = lpad(s.gtin, 14, '0')
        WHERE s.import_id = :imp AND s.ok
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
       RETURNING si.id, si.price, si.currency, si.part_id),
     j AS (SELECT up.id, up.price, up.currency, up.part_id,
                  old.price AS old_price, old.currency AS old_currency
             FROM up LEFT JOIN supplier_items old ON old.id = up.id),
     history AS (
       INSERT INTO supplier_item_prices (item_id, price, currency, effective_from, import_id)
       SELECT id, price, currency, now(), :imp FROM j
        WHERE old_price IS NULL OR price <> old_price OR currency <> old_currency),
     gone AS (
       SELECT x.id FROM supplier_items x
        WHERE x.supplier_id = :sup AND NOT x.dropped
          AND NOT EXISTS (SELECT 1 FROM price_list_import_rows r
                           WHERE r.import_id = :imp AND r.sku = x.sku)),
     dropped AS (
       UPDATE supplier_items x SET dropped = true, updated_at = now()
         FROM gone WHERE CAST(:drop AS boolean) AND x.id = gone.id)
     SELECT count(*)::int AS staged,
            count(*) FILTER (WHERE old_price IS NULL)::int AS new,
            count(*) FILTER (WHERE currency <> old_currency OR price > old_price)::int AS up,
            count(*) FILTER (WHERE currency = old_currency AND price < old_price)::int AS down,
            count(*) FILTER (WHERE currency = old_currency AND price = old_price)::int AS unchanged,
            (SELECT count(*) FROM gone)::int AS missing,
            count(*) FILTER (WHERE part_id IS NULL)::int AS unmapped
       FROM j`;

export async function applyStaged(
  k: Knex,
  importId: string,
  supplierId: string,
  dropMissing: boolean,
): Promise<Applied> {
  const result = await k.raw<{ rows: Applied[] }>(APPLY_STAGED_SQL, {
    imp: importId,
    sup: supplierId,
    drop: dropMissing,
  });
  return result.rows[0];
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
