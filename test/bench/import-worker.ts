// One price-list import in a process of its own, so its peak memory (maxRSS) is its own:
//   service  the product's import: preview (read, check, stage) then commit, as the upload does
//   raw      the physical limit: COPY the same file into a staging table, then one
//            INSERT … SELECT … ON CONFLICT DO UPDATE into a bare items table
//   idle     nothing: the memory of node and tsx alone, to read the others against
// Prints one JSON line: { rows, ms, maxRssMb }. DATABASE_URL names the bench database.
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { pipeline } from 'node:stream/promises';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

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
  const preview = await previewPriceList({
    user,
    supplierId,
    file: { path: file, originalName: 'bench-list.csv', size: (await stat(file)).size },
    mapping: {
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
    },
  });
  if (!('importId' in preview) || preview.status !== 'previewed') {
    throw new Error(`preview did not stage the list: ${JSON.stringify(preview).slice(0, 300)}`);
  }
  const previewMs = performance.now() - started;
  const committed = await commitImport(user, preview.importId, { dropMissing: true });
  const ms = performance.now() - started;
  if (committed.status !== 'committed') throw new Error(`commit answered ${committed.status}`);
  await db.destroy();
  return { rows: Number(preview.counts.ok), ms, previewMs, commitMs: ms - previewMs };
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
  let result: { rows: number; ms: number; previewMs?: number; commitMs?: number } = {
    rows: 0,
    ms: 0,
  };
  if (mode === 'service') result = await service(file, supplierId, userId);
  else if (mode === 'raw') result = await raw(file);
  else if (mode !== 'idle')
    throw new Error('usage: import-worker.ts service|raw|idle FILE [SUPPLIER USER]');
  // resourceUsage().maxRSS is in kilobytes.
  const maxRssMb = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(`${JSON.stringify({ ...result, maxRssMb })}\n`);
}

main().catch((e: Error) => {
  process.stderr.write(`${e.stack ?? e.message}\n`);
  process.exit(1);
});
