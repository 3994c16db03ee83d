// One price-list import in a process of its own, so its peak memory (maxRSS) is its own:
//   service  the product's import: preview (read, check, stage) then commit, as the upload does
//   raw      the physical limit: COPY the same file into a staging table, then one
//            INSERT … SELECT … ON CONFLICT DO UPDATE into a bare items table
//   idle     nothing: the memory of node and tsx alone, to read the others against
//   parse    the product's reading and checking of the file alone, nothing written (where the
//            preview's own JavaScript time goes; run it under node --cpu-prof for a profile)
// Prints one JSON line: { rows, ms, maxRssMb, statements? }. DATABASE_URL names the bench database.
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { pipeline } from 'node:stream/promises';
import type { Knex } from 'knex';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

const MAPPING = {
  sku: 'sku',
  description: 'description',
  size: 'size_mm',
  oversize: 'oversize_mm',
  price: 'price',
  available: 'available',
  leadDays: null,
  gtin: null,
  currency: 'currency',
  sizeUnit: 'mm',
} as const;

export interface StatementTime {
  /** The statement's first words, collapsed. */
  sql: string;
  /** Milliseconds from the start of the import to the statement being sent. */
  at: number;
  ms: number;
}

/** Every statement the import sends through Knex, with when it was sent and how long it took. */
function clockStatements(knex: Knex, started: number): StatementTime[] {
  const open = new Map<string, { sql: string; at: number }>();
  const done: StatementTime[] = [];
  type Query = { __knexQueryUid: string; sql: string };
  knex.on('query', (q: Query) => {
    open.set(q.__knexQueryUid, { sql: q.sql, at: performance.now() - started });
  });
  knex.on('query-response', (_response: unknown, q: Query) => {
    const o = open.get(q.__knexQueryUid);
    if (!o) return;
    open.delete(q.__knexQueryUid);
    const sql = o.sql.replace(/\s+/g, ' ').trim().slice(0, 110);
    done.push({ sql, at: Math.round(o.at), ms: Math.round(performance.now() - started - o.at) });
  });
  return done;
}

async function service(file: string, supplierId: string, userId: string) {
  const { previewPriceList, commitImport } = await import('../../server/imports/imports-service');
  const { db } = await import('../../server/db/knex');
  const user = {
    id: userId,
    email: 'buyer@bench.test',
    name: 'Bench buyer',
    role: 'buyer' as const,
    unit: 'mm' as const,
  };
  const started = performance.now();
  const statements = clockStatements(db, started);
  const preview = await previewPriceList({
    user,
    supplierId,
    file: { path: file, originalName: 'bench-list.csv', size: (await stat(file)).size },
    mapping: { ...MAPPING },
  });
  if (!('importId' in preview) || preview.status !== 'previewed') {
    throw new Error(`preview did not stage the list: ${JSON.stringify(preview).slice(0, 300)}`);
  }
  const previewMs = performance.now() - started;
  const committed = await commitImport(user, preview.importId, { dropMissing: true });
  const ms = performance.now() - started;
  if (committed.status !== 'committed') throw new Error(`commit answered ${committed.status}`);
  await db.destroy();
  return { rows: Number(preview.counts.ok), ms, previewMs, commitMs: ms - previewMs, statements };
}

async function parseOnly(file: string) {
  const { detectFileFormat } = await import('../../server/imports/detect-format');
  const { readPriceListBatches } = await import('../../server/imports/parse-price-list');
  const started = performance.now();
  const { format } = await detectFileFormat(file);
  const counts = { rows: 0, ok: 0, errors: 0, warnings: 0 };
  const options = { format, mapping: { ...MAPPING }, defaultCurrency: 'EUR' };
  for await (const batch of readPriceListBatches(file, options, counts)) void batch;
  return { rows: counts.ok, ms: performance.now() - started };
}

async function raw(file: string) {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  const started = performance.now();
  await client.query('begin');
  await client.query(`create table if not exists bench_raw_items (
    sku text primary key, description text not null, size_mm numeric, oversize_mm numeric,
    price numeric(14, 4) not null, currency text not null, available integer, updated_at timestamptz not null)`);
  await client.query(`create temp table bench_raw_staging (
    sku text, description text, size_mm text, oversize_mm text, price text, currency text, available text)
    on commit drop`);
  await pipeline(
    createReadStream(file),
    client.query(copyFrom(`copy bench_raw_staging from stdin with (format csv, header true)`)),
  );
  const result = await client.query(`insert into bench_raw_items
      select sku, description, size_mm::numeric, oversize_mm::numeric, price::numeric, currency,
             available::integer, now() from bench_raw_staging
      on conflict (sku) do update set description = excluded.description, price = excluded.price,
        currency = excluded.currency, available = excluded.available, updated_at = excluded.updated_at`);
  await client.query('commit');
  const ms = performance.now() - started;
  await client.end();
  return { rows: result.rowCount ?? 0, ms };
}

async function main() {
  const [mode, file, supplierId, userId] = process.argv.slice(2);
  let result: object = { rows: 0, ms: 0 };
  if (mode === 'service') result = await service(file, supplierId, userId);
  else if (mode === 'raw') result = await raw(file);
  else if (mode === 'parse') result = await parseOnly(file);
  else if (mode !== 'idle')
    throw new Error('usage: import-worker.ts service|raw|parse|idle FILE [SUPPLIER USER]');
  // resourceUsage().maxRSS is in kilobytes.
  const maxRssMb = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(`${JSON.stringify({ ...result, maxRssMb })}\n`);
}

main().catch((e: Error) => {
  process.stderr.write(`${e.stack ?? e.message}\n`);
  process.exit(1);
});
