// The only database code of the price-list import: the import log, the staging rows (written with
// COPY, the fastest way into PostgreSQL), the comparison with what the supplier offered so far, and
// the set-based commit.
import { once } from 'node:events';
import { finished } from 'node:stream/promises';
import type { Knex } from 'knex';
import type { PoolClient } from 'pg';
import { from as copyFrom, type CopyStreamQuery } from 'pg-copy-streams';
import { db } from '../db/knex';
import type { PriceListRow } from './parse-price-list';
export * from './commit-repository';
import { GTIN_PARTS, type Comparison } from './commit-repository';

export interface ImportRow {
  id: string;
  supplier_id: string;
  supplier_name: string;
  user_id: string | null;
  user_name: string | null;
  file_name: string;
  file_bytes: string | number;
  sha256: string;
  status: 'previewed' | 'committed' | 'duplicate' | 'failed';
  detected: Record<string, unknown>;
  headers: string[];
  mapping: Record<string, unknown>;
  counts: Record<string, number>;
  errors: unknown[];
  warnings: unknown[];
  sample: unknown[];
  price_changes: Record<string, unknown>;
  failure: string | null;
  duplicate_of: string | null;
  created_at: Date;
  committed_by: string | null;
  committed_by_name: string | null;
  committed_at: Date | null;
}

export type ImportColumns = Partial<
  Omit<ImportRow, 'id' | 'supplier_name' | 'user_name' | 'committed_by_name' | 'committed_at'>
> & { committed_at?: Date | Knex.Raw };

/** Marks the transaction's connection so the progress endpoint can find it (application_name). */
export async function markProgress(
  k: Knex,
  token: string | undefined,
  phase: string,
): Promise<void> {
  if (!token) return;
  await k.raw(`SELECT set_config('application_name', ?, true)`, [`ssi:${token}:${phase}`]);
}

/** Imports of large lists run longer than the default statement timeout of a request. */
export async function allowLongStatements(k: Knex): Promise<void> {
  await k.raw(`SET LOCAL statement_timeout = '15min'`);
}

export interface ProgressRow {
  application_name: string;
  rows: number;
  bytes: number;
  /** The staging COPY has ended on that connection; the next phase has not been marked yet. */
  copy_done: boolean;
}

export async function progress(token: string, k: Knex = db): Promise<ProgressRow | undefined> {
  const result = await k.raw<{ rows: ProgressRow[] }>(
    `SELECT a.application_name,
            coalesce(p.tuples_processed, 0)::bigint AS rows,
            coalesce(p.bytes_processed, 0)::bigint AS bytes,
            (p.pid IS NULL AND a.query ILIKE 'COPY %') AS copy_done
       FROM pg_stat_activity a
       LEFT JOIN pg_stat_progress_copy p ON p.pid = a.pid
      WHERE a.application_name LIKE ?
      LIMIT 1`,
    [`ssi:${token}:%`],
  );
  return result.rows[0];
}

function importBase(k: Knex) {
  return k('price_list_imports as m')
    .join('suppliers as s', 's.id', 'm.supplier_id')
    .leftJoin('users as u', 'u.id', 'm.user_id')
    .leftJoin('users as c', 'c.id', 'm.committed_by');
}

const IMPORT_COLUMNS = [
  'm.*',
  's.name as supplier_name',
  'u.name as user_name',
  'c.name as committed_by_name',
];

export async function findImport(id: string, k: Knex = db): Promise<ImportRow | undefined> {
  return (await importBase(k).select(IMPORT_COLUMNS).where('m.id', id).first()) as
    ImportRow | undefined;
}

export async function listImports(
  opts: { supplierId?: string; status?: string; page: number; pageSize: number },
  k: Knex = db,
): Promise<{ rows: ImportRow[]; total: number }> {
  const base = importBase(k);
  if (opts.supplierId) base.where('m.supplier_id', opts.supplierId);
  if (opts.status) base.where('m.status', opts.status);
  const [{ count }] = await base.clone().count<{ count: number }[]>('* as count');
  const rows = (await base
    .clone()
    .select([
      'm.id',
      'm.supplier_id',
      'm.user_id',
      'm.file_name',
      'm.status',
      'm.counts',
      'm.created_at',
      'm.committed_by',
      'm.committed_at',
      's.name as supplier_name',
      'u.name as user_name',
      'c.name as committed_by_name',
    ])
    .orderBy('m.created_at', 'desc')
    .orderBy('m.id', 'desc')
    .limit(opts.pageSize)
    .offset((opts.page - 1) * opts.pageSize)) as ImportRow[];
  return { rows, total: Number(count) };
}

export async function lockImport(k: Knex, id: string): Promise<ImportRow | undefined> {
  return (await k('price_list_imports').where('id', id).forUpdate().first()) as
    ImportRow | undefined;
}

export async function findCommittedBySha(
  supplierId: string,
  sha256: string,
  k: Knex = db,
): Promise<{ id: string; committed_at: Date } | undefined> {
  return k('price_list_imports')
    .select('id', 'committed_at')
    .where({ supplier_id: supplierId, sha256, status: 'committed' })
    .first();
}

function jsonColumns(columns: ImportColumns): Record<string, unknown> {
  const out: Record<string, unknown> = { ...columns };
  for (const key of [
    'detected',
    'headers',
    'mapping',
    'counts',
    'errors',
    'warnings',
    'sample',
    'price_changes',
  ]) {
    if (key in out) out[key] = JSON.stringify(out[key]);
  }
  return out;
}

export async function insertImport(k: Knex, columns: ImportColumns): Promise<string> {
  const [row] = await k('price_list_imports').insert(jsonColumns(columns)).returning('id');
  return row.id as string;
}

export async function updateImport(k: Knex, id: string, columns: ImportColumns): Promise<void> {
  await k('price_list_imports').where('id', id).update(jsonColumns(columns));
}

// ---- Staging -----------------------------------------------------------------------------------

const COPY_SPECIAL = /[\\\t\n\r]/;

/** COPY text format: backslash, tab and line breaks escaped; \N is NULL. */
function copyText(value: string | number | null): string {
  if (value === null) return '\\N';
  if (typeof value === 'number') return String(value);
  // Almost no cell needs escaping: testing first spares building a copy of every text.
  if (!COPY_SPECIAL.test(value)) return value;
  return value.replace(/[\\\t\n\r]/g, (c) =>
    c === '\\' ? '\\\\' : c === '\t' ? '\\t' : c === '\n' ? '\\n' : '\\r',
  );
}

export interface StagingWriter {
  write(rows: PriceListRow[]): Promise<void>;
  end(): Promise<void>;
  abort(error: Error): Promise<void>;
}

/**
 * Opens one COPY … FROM STDIN on the transaction's own connection and streams the rows of a list into
 * the staging table, batch by batch, waiting whenever PostgreSQL asks the writer to slow down.
 */
export async function openStagingWriter(
  trx: Knex.Transaction,
  importId: string,
): Promise<StagingWriter> {
  const connection = (await trx.client.acquireConnection()) as PoolClient;
  const stream: CopyStreamQuery = connection.query(
    copyFrom(
      `COPY price_list_import_rows (import_id, sku, ok, line, description, size_nm, oversize_nm,
         price, currency, available, lead_days, gtin) FROM STDIN`,
    ),
  );
  let failure: Error | null = null;
  stream.on('error', (e: Error) => {
    failure ??= e;
  });
  const id = copyText(importId);
  return {
    async write(rows) {
      if (failure) throw failure;
      let chunk = '';
      // One template per row: no array of its columns to build and join.
      for (const r of rows) {
        chunk +=
          `${id}\t${copyText(r.sku)}\tt\t${r.line}\t${copyText(r.description)}\t` +
          `${copyText(r.sizeNm)}\t${copyText(r.oversizeNm)}\t${r.price}\t${r.currency}\t` +
          `${copyText(r.available)}\t${copyText(r.leadDays)}\t${copyText(r.gtin)}\n`;
      }
      if (!stream.write(chunk)) await Promise.race([once(stream, 'drain'), once(stream, 'error')]);
      if (failure) throw failure;
    },
    async end() {
      stream.end();
      await finished(stream);
      if (failure) throw failure;
    },
    async abort(error) {
      stream.destroy(error);
      await finished(stream).catch(() => undefined);
    },
  };
}

export async function deleteStaged(k: Knex, importId: string, skus: string[]): Promise<void> {
  if (skus.length === 0) return;
  await k('price_list_import_rows').where('import_id', importId).whereIn('sku', skus).delete();
}

/** SKUs of rows with errors: kept so the comparison does not count them as missing from the list. */
export async function stageSkipped(k: Knex, importId: string, skus: string[]): Promise<void> {
  for (let i = 0; i < skus.length; i += 5000) {
    await k.raw(
      `INSERT INTO price_list_import_rows (import_id, sku, ok, line)
       SELECT ?, sku, false, 0 FROM unnest(CAST(? AS text[])) AS sku
       ON CONFLICT (import_id, sku) DO NOTHING`,
      [importId, skus.slice(i, i + 5000)],
    );
  }
}

/**
 * Fresh statistics for the staging table once a list is in. Left to autovacuum, they are usually
 * those of the table emptied by the last commit: the planner then takes 100,000 staged rows for one
 * and compares the list with the supplier's items in nested loops (minutes instead of a second).
 */
export async function analyzeStaging(k: Knex): Promise<void> {
  await k.raw('ANALYZE price_list_import_rows');
}

export async function clearStaging(k: Knex, importId: string): Promise<void> {
  await k('price_list_import_rows').where('import_id', importId).delete();
}

export interface StagedRow {
  line: number;
  sku: string;
  description: string;
  size_nm: number | null;
  oversize_nm: number | null;
  price: string;
  currency: string;
  available: number | null;
  lead_days: number | null;
  gtin: string | null;
}

export async function firstStaged(k: Knex, importId: string, limit: number): Promise<StagedRow[]> {
  return (await k('price_list_import_rows')
    .select(
      'line',
      'sku',
      'description',
      'size_nm',
      'oversize_nm',
      'price',
      'currency',
      'available',
      'lead_days',
      'gtin',
    )
    .where({ import_id: importId, ok: true })
    .orderBy('line')
    .limit(limit)) as StagedRow[];
}

// ---- Comparison with what the supplier offers now -------------------------------------------------

export interface PriceChangeRow {
  line: number;
  sku: string;
  description: string;
  old_price: string;
  new_price: string;
  currency: string;
  percent: string;
}

export interface PriceChanges {
  upAverage: string | null;
  downAverage: string | null;
  largest: PriceChangeRow[];
}

/**
 * The staged list beside what the supplier offers now: the preview's counts, the average price rise
 * and fall, and the largest changes. The staged rows are joined with the supplier's items once and
 * every figure is read from that join.
 */
export async function compare(
  k: Knex,
  importId: string,
  supplierId: string,
  limit: number,
): Promise<{ comparison: Comparison; changes: PriceChanges }> {
  const result = await k.raw<{
    rows: (Comparison & { up_average: string | null; down_average: string | null } & {
      largest: PriceChangeRow[];
    })[];
  }>(
    `WITH gp AS (${GTIN_PARTS}),
          j AS MATERIALIZED (
            SELECT s.line, s.sku, s.description, s.price, s.currency, s.gtin,
                   si.id AS item_id, si.part_id, si.price AS old_price, si.currency AS old_currency
              FROM price_list_import_rows s
              LEFT JOIN supplier_items si ON si.supplier_id = :sup AND si.sku = s.sku
             WHERE s.import_id = :imp AND s.ok),
          changed AS (
            SELECT * FROM j
             WHERE item_id IS NOT NULL AND currency = old_currency AND price <> old_price)
     SELECT
       count(*) FILTER (WHERE item_id IS NULL)::int AS new,
       count(*) FILTER (WHERE item_id IS NOT NULL
                          AND (currency <> old_currency OR price > old_price))::int AS up,
       count(*) FILTER (WHERE item_id IS NOT NULL AND currency = old_currency
                          AND price < old_price)::int AS down,
       count(*) FILTER (WHERE item_id IS NOT NULL AND currency = old_currency
                          AND price = old_price)::int AS unchanged,
       (SELECT count(*) FROM supplier_items x
         WHERE x.supplier_id = :sup AND NOT x.dropped
           AND NOT EXISTS (SELECT 1 FROM price_list_import_rows r
                            WHERE r.import_id = :imp AND r.sku = x.sku))::int AS missing,
       count(*) FILTER (WHERE part_id IS NULL AND gp.id IS NULL)::int AS unmapped,
       (SELECT round(avg((price - old_price) / old_price * 100) FILTER (WHERE price > old_price), 1)::text
          FROM changed) AS up_average,
       (SELECT round(avg((price - old_price) / old_price * 100) FILTER (WHERE price < old_price), 1)::text
          FROM changed) AS down_average,
       (SELECT coalesce(json_agg(json_build_object(
                 'line', line, 'sku', sku, 'description', description,
                 'old_price', old_price::text, 'new_price', price::text, 'currency', currency,
                 'percent', round((price - old_price) / old_price * 100, 1)::text)
               ORDER BY ratio DESC, line), '[]')
          FROM (SELECT *, abs(price - old_price) / old_price AS ratio FROM changed
                 ORDER BY ratio DESC, line LIMIT :limit) top) AS largest
       FROM j
       LEFT JOIN gp ON gp.g14 = lpad(j.gtin, 14, '0')`,
    { imp: importId, sup: supplierId, limit },
  );
  const { up_average, down_average, largest, ...comparison } = result.rows[0];
  return {
    comparison,
    changes: { upAverage: up_average ?? null, downAverage: down_average ?? null, largest },
  };
}
