// The only queries of the CSV exports: the stock list and the price comparison across suppliers.
import type { Knex } from 'knex';
import { db } from '../db/knex';

export interface StockRow {
  sku: string;
  kind: string;
  description: string;
  family_code: string | null;
  step_label: string | null;
  nominal_nm: number | null;
  on_hand: number;
  held: number;
  bin: string | null;
  sale_price: string;
  average_cost: string;
  gtin: string | null;
}

/** Every active counted part (kits are not counted: their free quantity follows their parts). */
export async function stockList(k: Knex = db): Promise<StockRow[]> {
  const result = await k.raw<{ rows: StockRow[] }>(
    `SELECT p.sku, p.kind, p.description, f.code AS family_code, st.label AS step_label,
            f.standard_bore_nm + st.offset_nm AS nominal_nm, l.on_hand, l.held, b.code AS bin,
            p.sale_price, p.average_cost, p.gtin
       FROM parts p
       JOIN part_levels l ON l.part_id = p.id
       LEFT JOIN engine_families f ON f.id = p.family_id
       LEFT JOIN series_steps st ON st.id = p.step_id
       LEFT JOIN bins b ON b.id = l.bin_id
      WHERE p.active AND p.kind <> 'kit'
      ORDER BY f.code NULLS LAST, st.offset_nm NULLS FIRST, p.kind, p.sku`,
  );
  return result.rows;
}

export interface OfferRow {
  part_sku: string;
  part_description: string;
  family_code: string | null;
  step_label: string | null;
  supplier_name: string;
  supplier_sku: string;
  supplier_description: string;
  price: string;
  currency: string;
  available: number | null;
  lead_days: number | null;
  supplier_lead_days: number;
  last_seen_at: Date | null;
  rank_in_currency: number;
}

/**
 * Every supplier offer mapped to a catalog part (dropped ones left out), cheapest first within each
 * part and currency; prices in different currencies are not converted.
 */
export async function offers(familyId: string | undefined, k: Knex = db): Promise<OfferRow[]> {
  const result = await k.raw<{ rows: OfferRow[] }>(
    `SELECT p.sku AS part_sku, p.description AS part_description, f.code AS family_code,
            st.label AS step_label, s.name AS supplier_name, i.sku AS supplier_sku,
            i.description AS supplier_description, i.price, i.currency, i.available, i.lead_days,
            s.lead_days AS supplier_lead_days, m.committed_at AS last_seen_at,
            rank() OVER (PARTITION BY p.id, i.currency ORDER BY i.price)::int AS rank_in_currency
       FROM supplier_items i
       JOIN suppliers s ON s.id = i.supplier_id
       JOIN parts p ON p.id = i.part_id
       LEFT JOIN engine_families f ON f.id = p.family_id
       LEFT JOIN series_steps st ON st.id = p.step_id
       LEFT JOIN price_list_imports m ON m.id = i.last_import_id
      WHERE NOT i.dropped AND s.active AND (CAST(:family AS uuid) IS NULL OR p.family_id = :family)
      ORDER BY f.code NULLS LAST, st.offset_nm NULLS FIRST, p.sku, i.currency, i.price, s.name`,
    { family: familyId ?? null },
  );
  return result.rows;
}
