// The only Knex queries of the suppliers feature: suppliers, their items, price history and the
// mapping queue with its suggestions.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { insertRow, updateRow } from '../db/rows';
import { pageOf } from '../db/paging';
import { containsPattern } from '../db/like-pattern';

export interface SupplierRow {
  id: string;
  name: string;
  contacts: string;
  email: string | null;
  currency: string;
  lead_days: number;
  min_order: string;
  shipping_cost: string;
  notes: string;
  active: boolean;
  created_at: Date;
  updated_at: Date;
  items: number;
  unmapped: number;
  last_import_at: Date | null;
}

export type SupplierColumns = Partial<
  Pick<
    SupplierRow,
    | 'name'
    | 'contacts'
    | 'email'
    | 'currency'
    | 'lead_days'
    | 'min_order'
    | 'shipping_cost'
    | 'notes'
    | 'active'
  >
>;

export interface ItemRow {
  id: string;
  supplier_id: string;
  sku: string;
  description: string;
  size_nm: number | null;
  oversize_nm: number | null;
  part_id: string | null;
  part_sku: string | null;
  part_description: string | null;
  part_kind: string | null;
  family_code: string | null;
  step_label: string | null;
  price: string;
  currency: string;
  available: number | null;
  lead_days: number | null;
  gtin: string | null;
  last_import_id: string | null;
  last_seen_at: Date | null;
  dropped: boolean;
  updated_at: Date;
  supplier_name?: string;
}

const SUPPLIER_SORTS: Record<string, string> = {
  name: 'lower(s.name)',
  currency: 's.currency',
  leadDays: 's.lead_days',
  items: 'items',
  lastImport: 'last_import_at',
};

const ITEM_SORTS: Record<string, string> = {
  sku: 'i.sku',
  description: 'lower(i.description)',
  size: 'i.size_nm',
  price: 'i.price',
  available: 'i.available',
  updated: 'i.updated_at',
};

function supplierBase(k: Knex) {
  return k('suppliers as s');
}

function supplierColumns(k: Knex) {
  return [
    's.*',
    k.raw(
      `(SELECT count(*) FROM supplier_items i WHERE i.supplier_id = s.id AND NOT i.dropped)::int AS items`,
    ),
    k.raw(
      `(SELECT count(*) FROM supplier_items i
         WHERE i.supplier_id = s.id AND NOT i.dropped AND i.part_id IS NULL)::int AS unmapped`,
    ),
    k.raw(
      `(SELECT max(committed_at) FROM price_list_imports m
         WHERE m.supplier_id = s.id AND m.status = 'committed') AS last_import_at`,
    ),
  ];
}

export async function listSuppliers(
  opts: { q?: string; sort?: string; dir?: 'asc' | 'desc'; page: number; pageSize: number },
  k: Knex = db,
): Promise<{ rows: SupplierRow[]; total: number }> {
  const base = supplierBase(k);
  if (opts.q) {
    const like = containsPattern(opts.q.trim());
    base.where((w) => w.whereILike('s.name', like).orWhereILike('s.email', like));
  }
  const order = opts.dir === 'desc' ? 'DESC' : 'ASC';
  const column = SUPPLIER_SORTS[opts.sort ?? 'name'] ?? 'lower(s.name)';
  return pageOf<SupplierRow>(base, opts, (list) =>
    list.select(supplierColumns(k)).orderByRaw(`${column} ${order} NULLS LAST, lower(s.name) ASC`),
  );
}

export async function findSupplier(id: string, k: Knex = db): Promise<SupplierRow | undefined> {
  return (await supplierBase(k).select(supplierColumns(k)).where('s.id', id).first()) as
    SupplierRow | undefined;
}

/** Locks the supplier row, so two commits of lists for one supplier run one after the other. */
export async function lockSupplier(k: Knex, id: string): Promise<SupplierRow | undefined> {
  return (await k('suppliers').where('id', id).forUpdate().first()) as SupplierRow | undefined;
}

export function insertSupplier(k: Knex, columns: SupplierColumns): Promise<string> {
  return insertRow(k, 'suppliers', columns);
}

export function updateSupplier(k: Knex, id: string, columns: SupplierColumns): Promise<void> {
  return updateRow(k, 'suppliers', id, columns);
}

// ---- Items --------------------------------------------------------------------------------------

function itemBase(k: Knex) {
  return k('supplier_items as i')
    .leftJoin('parts as p', 'p.id', 'i.part_id')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as st', 'st.id', 'p.step_id')
    .leftJoin('price_list_imports as m', 'm.id', 'i.last_import_id');
}

const ITEM_COLUMNS = [
  'i.id',
  'i.supplier_id',
  'i.sku',
  'i.description',
  'i.size_nm',
  'i.oversize_nm',
  'i.part_id',
  'p.sku as part_sku',
  'p.description as part_description',
  'p.kind as part_kind',
  'f.code as family_code',
  'st.label as step_label',
  'i.price',
  'i.currency',
  'i.available',
  'i.lead_days',
  'i.gtin',
  'i.last_import_id',
  'm.committed_at as last_seen_at',
  'i.dropped',
  'i.updated_at',
];

export interface ItemFilter {
  supplierId?: string;
  mapped?: boolean;
  dropped?: boolean;
  q?: string;
  sort?: string;
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export async function listItems(
  opts: ItemFilter,
  k: Knex = db,
): Promise<{ rows: ItemRow[]; total: number }> {
  const base = itemBase(k).join('suppliers as s', 's.id', 'i.supplier_id');
  if (opts.supplierId) base.where('i.supplier_id', opts.supplierId);
  if (opts.mapped !== undefined) {
    if (opts.mapped) base.whereNotNull('i.part_id');
    else base.whereNull('i.part_id');
  }
  if (opts.dropped !== undefined) base.where('i.dropped', opts.dropped);
  if (opts.q) {
    // Every test on supplier_items itself (the part's SKU through a sub-select), so each one can
    // use its trigram index and the planner combines them instead of reading every item.
    const like = containsPattern(opts.q.trim());
    base.where((w) =>
      w
        .whereILike('i.sku', like)
        .orWhereILike('i.description', like)
        .orWhereIn('i.part_id', k('parts').select('id').whereILike('sku', like)),
    );
  }
  const order = opts.dir === 'desc' ? 'DESC' : 'ASC';
  const column = ITEM_SORTS[opts.sort ?? 'sku'] ?? 'i.sku';
  return pageOf<ItemRow>(base, opts, (list) =>
    list
      .select([...ITEM_COLUMNS, 's.name as supplier_name'])
      .orderByRaw(`${column} ${order} NULLS LAST, i.sku ASC, i.id ASC`),
  );
}

export async function findItem(
  supplierId: string,
  itemId: string,
  k: Knex = db,
): Promise<ItemRow | undefined> {
  return (await itemBase(k)
    .select(ITEM_COLUMNS)
    .where({ 'i.id': itemId, 'i.supplier_id': supplierId })
    .first()) as ItemRow | undefined;
}

export async function findItemById(itemId: string, k: Knex = db): Promise<ItemRow | undefined> {
  return (await itemBase(k)
    .join('suppliers as s', 's.id', 'i.supplier_id')
    .select([...ITEM_COLUMNS, 's.name as supplier_name'])
    .where('i.id', itemId)
    .first()) as ItemRow | undefined;
}

export async function lockItem(
  k: Knex,
  itemId: string,
): Promise<{ id: string; part_id: string | null } | undefined> {
  return k('supplier_items').select('id', 'part_id').where('id', itemId).forUpdate().first();
}

export async function setItemPart(k: Knex, itemId: string, partId: string | null): Promise<void> {
  await k('supplier_items').where('id', itemId).update({ part_id: partId, updated_at: k.fn.now() });
}

export interface PriceRow {
  price: string;
  currency: string;
  effective_from: Date;
  import_id: string | null;
  file_name: string | null;
}

export async function priceHistory(
  itemId: string,
  page: number,
  pageSize: number,
  k: Knex = db,
): Promise<{ rows: PriceRow[]; total: number }> {
  const base = k('supplier_item_prices as h').where('h.item_id', itemId);
  return pageOf<PriceRow>(base, { page, pageSize }, (list) =>
    list
      .leftJoin('price_list_imports as m', 'm.id', 'h.import_id')
      .select('h.price', 'h.currency', 'h.effective_from', 'h.import_id', 'm.file_name')
      .orderBy('h.effective_from', 'desc'),
  );
}

// ---- Mapping suggestions -------------------------------------------------------------------------

export interface CandidateRow {
  item_id: string;
  part_id: string;
  sku: string;
  description: string;
  kind: string;
  family_code: string | null;
  family_name: string | null;
  step_label: string | null;
  /** |nominal bore of the part's step − the item's size| in nm; null when either is unknown. */
  size_gap: number | null;
  same_sku: boolean;
  same_gtin: boolean;
  family_named: boolean;
}

/** Size within this of a step's nominal bore counts as the same size (0.005 mm: rounding in lists). */
export const SIZE_MATCH_NM = 5000;

/**
 * Catalog parts that could be the given supplier items: parts of a family step whose nominal bore is
 * the item's size, parts whose family code the description names, and parts with the same SKU or GTIN.
 */
/** Why a part could be a supplier item (i and p and their family f and step st in scope). */
const COULD_BE = `(
          (i.size_nm IS NOT NULL AND f.id IS NOT NULL AND st.id IS NOT NULL
            AND abs(f.standard_bore_nm + st.offset_nm - i.size_nm) <= :gap)
          OR lower(p.sku) = lower(i.sku)
          OR (i.gtin IS NOT NULL AND p.gtin IS NOT NULL
              AND lpad(p.gtin, 14, '0') = lpad(i.gtin, 14, '0'))
          OR (f.id IS NOT NULL AND strpos(lower(i.description), lower(f.code)) > 0)
        )`;

export async function candidateParts(itemIds: string[], k: Knex = db): Promise<CandidateRow[]> {
  if (itemIds.length === 0) return [];
  const result = await k.raw<{ rows: CandidateRow[] }>(
    `SELECT i.id AS item_id, p.id AS part_id, p.sku, p.description, p.kind,
            f.code AS family_code, f.name AS family_name, st.label AS step_label,
            CASE WHEN i.size_nm IS NULL OR f.id IS NULL OR st.id IS NULL THEN NULL
                 ELSE abs(f.standard_bore_nm + st.offset_nm - i.size_nm) END AS size_gap,
            lower(p.sku) = lower(i.sku) AS same_sku,
            (i.gtin IS NOT NULL AND p.gtin IS NOT NULL
              AND lpad(p.gtin, 14, '0') = lpad(i.gtin, 14, '0')) AS same_gtin,
            (f.id IS NOT NULL AND strpos(lower(i.description), lower(f.code)) > 0) AS family_named
       FROM supplier_items i
       JOIN parts p ON p.active
       LEFT JOIN engine_families f ON f.id = p.family_id
       LEFT JOIN series_steps st ON st.id = p.step_id
      WHERE i.id = ANY(CAST(:ids AS uuid[]))
        AND ${COULD_BE}`,
    { ids: itemIds, gap: SIZE_MATCH_NM },
  );
  return result.rows;
}

/**
 * Items waiting in the mapping queue (unmapped, not dropped, at an active supplier) that could be
 * one of these parts by the same tests the queue's suggestions use; the caller ranks them.
 */
export async function waitingItemsNear(partIds: string[], k: Knex = db): Promise<ItemRow[]> {
  if (partIds.length === 0) return [];
  const result = await k.raw<{ rows: { id: string }[] }>(
    `SELECT DISTINCT i.id
       FROM supplier_items i
       JOIN suppliers s ON s.id = i.supplier_id AND s.active
       JOIN parts p ON p.id = ANY(CAST(:ids AS uuid[]))
       LEFT JOIN engine_families f ON f.id = p.family_id
       LEFT JOIN series_steps st ON st.id = p.step_id
      WHERE i.part_id IS NULL AND NOT i.dropped
        AND ${COULD_BE}
      LIMIT 200`,
    { ids: partIds, gap: SIZE_MATCH_NM },
  );
  const ids = result.rows.map((r) => r.id);
  if (ids.length === 0) return [];
  return (await itemBase(k)
    .join('suppliers as s', 's.id', 'i.supplier_id')
    .select([...ITEM_COLUMNS, 's.name as supplier_name'])
    .whereIn('i.id', ids)
    .orderBy('i.sku')) as ItemRow[];
}

export async function partExists(k: Knex, partId: string): Promise<boolean> {
  const row = await k('parts').select('id').where('id', partId).first();
  return row !== undefined;
}
