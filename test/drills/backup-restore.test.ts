// Drill: the shop's backup is worth what its restore gives back. `npm run backup` (server/db/cli.ts)
// dumps a filled database; `npm run restore -- FILE` loads it into an empty one; every table, the
// ledger and the numbering sequences must come back exactly, and the restored shop must serve.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, openSync, readSync, closeSync, readdirSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import {
  drillDatabase,
  HttpSession,
  insertUser,
  REPO,
  sqlClient,
  startServer,
  stockFixture,
  type DrillDatabase,
  type DrillUser,
} from './support';

let source: DrillDatabase;
let target: DrillDatabase;
let dir: string;

jest.setTimeout(180_000);

beforeAll(async () => {
  source = await drillDatabase('backup_src');
  target = await drillDatabase('backup_dst', { migrate: false });
  dir = mkdtempSync(path.join(os.tmpdir(), 'stepstock-backup-'));
});

afterAll(async () => {
  await source?.drop();
  await target?.drop();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

/** `npm run backup` / `npm run restore` as a shop runs them: the CLI with DATABASE_URL set. */
function cli(args: string[], url: string) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'server/db/cli.ts', ...args], {
    cwd: REPO,
    env: { ...process.env, DATABASE_URL: url, LOG_LEVEL: 'warn' },
    encoding: 'utf8',
    timeout: 120_000,
  });
  return { code: r.status, out: `${r.stdout}${r.stderr}` };
}

interface Snapshot {
  counts: Record<string, number>;
  ledger: unknown;
  ledgerDigest: string;
  levels: string;
  photos: string;
  sequences: Record<string, number>;
}

async function snapshot(client: pg.Client): Promise<Snapshot> {
  const tables = (
    await client.query(
      `select tablename from pg_tables where schemaname = 'public' order by tablename`,
    )
  ).rows.map((r) => r.tablename as string);
  const counts: Record<string, number> = {};
  for (const t of tables) {
    counts[t] = Number((await client.query(`select count(*) as n from "${t}"`)).rows[0].n);
  }
  const ledger = (
    await client.query(`select count(*)::int as rows, sum(quantity)::bigint::text as quantity,
      sum(held_delta)::bigint::text as held, sum(quantity * coalesce(unit_cost, 0))::text as cost
      from stock_ledger`)
  ).rows[0];
  // Every ledger row, column for column, in id order: a restore that changed any value shows here.
  const ledgerDigest = (
    await client.query(
      `select md5(coalesce(string_agg(l::text, '|' order by l.id), '')) as d from stock_ledger l`,
    )
  ).rows[0].d as string;
  const levels = (
    await client.query(`select md5(coalesce(string_agg(concat_ws(',', part_id, on_hand, held), '|'
      order by part_id), '')) as d from part_levels`)
  ).rows[0].d as string;
  const photos = (
    await client.query(
      `select md5(coalesce(string_agg(md5(data), '' order by id), '')) as d from job_photos`,
    )
  ).rows[0].d as string;
  const sequences: Record<string, number> = {};
  for (const s of (
    await client.query(
      `select sequencename, last_value from pg_sequences where schemaname = 'public'`,
    )
  ).rows) {
    sequences[s.sequencename] = Number(s.last_value ?? 0);
  }
  return { counts, ledger, ledgerDigest, levels, photos, sequences };
}

async function fillShop(client: pg.Client, userId: string): Promise<void> {
  const q = (sql: string, params: unknown[] = []) => client.query(sql, params);
  await insertUser(client, 'buyer');
  await insertUser(client, 'machinist');
  await q(`insert into settings (key, value) values ('shopName', '"Drill Bore Works"')
    on conflict (key) do update set value = excluded.value`);
  await q(
    `insert into audit_events (user_id, action, entity, entity_id, before, after)
    values ($1::uuid, 'user.update', 'user', $1::text, '{"role":"buyer"}', '{"role":"owner"}')`,
    [userId],
  );
  const big = await stockFixture(client, 40);
  await stockFixture(client, 7);
  await q(
    `with p as (
      insert into parts (kind, sku, description, sale_price) values ('other', 'DRL-GASKET', 'Drill gasket', 3.2)
      returning id)
    insert into stock_ledger (part_id, kind, quantity, reason, unit_cost, user_id)
    select id, 'adjustment', q, 'drill count', 1.15, $1 from p, unnest(array[12, -3, 5]) q`,
    [userId],
  );
  await q(
    `update part_levels set on_hand = 14 where part_id = (select id from parts where sku = 'DRL-GASKET')`,
  );
  // A job on that family, one cylinder read and its piston held, as the hold service writes it.
  const job = (
    await q(
      `insert into jobs (customer_name, family_id, cylinders, created_by, state)
      values ('Drill customer', $1, 1, $2, 'parts_set_aside') returning id`,
      [big.familyId, userId],
    )
  ).rows[0].id as string;
  await q(
    `insert into job_cylinders (job_id, n, largest_nm, taper_nm, out_of_round_nm, chosen_step_id)
    values ($1, 1, 54080000, 30000, 10000, $2)`,
    [job, big.stepId],
  );
  await q(
    `insert into bore_readings (job_id, n, depth, axis, diameter_nm, unit)
    select $1, 1, d, a, 54050000 + row_number() over () * 5000, 'mm'
    from unnest(array['top','middle','bottom']) d, unnest(array['pin','thrust']) a`,
    [job],
  );
  const hold = (
    await q(
      `insert into holds (job_id, cylinder, part_id, unit_id, created_by)
      values ($1, 1, $2, $3, $4) returning id`,
      [job, big.partId, big.unitIds[0], userId],
    )
  ).rows[0].id as string;
  await q(
    `update piston_units set status = 'held', held_for_job_id = $1, held_cylinder = 1, hold_id = $2
    where id = $3`,
    [job, hold, big.unitIds[0]],
  );
  await q(
    `insert into stock_ledger (part_id, unit_id, kind, quantity, held_delta, job_id, user_id)
    values ($1, $2, 'reservation', 0, 1, $3, $4)`,
    [big.partId, big.unitIds[0], job, userId],
  );
  await q(`update part_levels set held = 1 where part_id = $1`, [big.partId]);
  await q(
    `insert into job_events (job_id, user_id, kind, text) values ($1, $2, 'note', 'Drill note: cylinder 1 scored')`,
    [job, userId],
  );
  const photo = Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 37) % 256));
  await q(
    `insert into job_photos (job_id, content_type, size_bytes, data, original_name, created_by)
    values ($1, 'image/png', $2, $3, 'intake.png', $4)`,
    [job, photo.length, photo, userId],
  );
}

describe('backup and restore', () => {
  it('when a filled shop is backed up and restored into an empty database, then every table, the ledger sums and the sequences match and the restored shop serves', async () => {
    // A filled shop, built row by row so the drill does not depend on the demo seed: users, audit,
    // settings, catalog, pistons, receipts, counted stock with adjustments, a job with readings, a
    // held piston, a note and an intake photo (binary data).
    const client = await sqlClient(source.url);
    let owner: DrillUser;
    let before: Snapshot;
    try {
      owner = await insertUser(client, 'owner');
      await fillShop(client, owner.id);
      before = await snapshot(client);
    } finally {
      await client.end();
    }
    expect(before.counts.stock_ledger).toBeGreaterThanOrEqual(50);
    expect(before.counts.users).toBe(3);
    expect(before.counts.job_photos).toBe(1);

    const backup = cli(['backup', dir], source.url);
    expect({ code: backup.code, out: backup.out }).toEqual({ code: 0, out: expect.any(String) });
    const files = readdirSync(dir);
    expect(files).toHaveLength(1);
    // A name that sorts by time and says when it was taken (UTC).
    expect(files[0]).toMatch(/^stepstock-\d{8}T\d{6}Z\.dump$/);
    const file = path.join(dir, files[0]);
    expect(backup.out).toContain(file);
    expect(statSync(file).size).toBeGreaterThan(1000);
    // pg_dump's custom format starts with the magic bytes "PGDMP" (PostgreSQL docs, pg_dump -Fc).
    const fd = openSync(file, 'r');
    const magic = Buffer.alloc(5);
    readSync(fd, magic, 0, 5, 0);
    closeSync(fd);
    expect(magic.toString('latin1')).toBe('PGDMP');

    // The restore refuses a database that already has tables, and leaves it as it was.
    const refused = cli(['restore', file], source.url);
    expect(refused.code).not.toBe(0);
    expect(refused.out).toMatch(/empty database/);

    const restore = cli(['restore', file], target.url);
    expect({ code: restore.code, out: restore.out }).toEqual({
      code: 0,
      out: expect.stringContaining('restored'),
    });

    const check = await sqlClient(target.url);
    const after = await snapshot(check).finally(() => check.end());
    expect(after.counts).toEqual(before.counts);
    expect(after.ledger).toEqual(before.ledger);
    expect(after.ledgerDigest).toBe(before.ledgerDigest);
    expect(after.levels).toBe(before.levels);
    expect(after.photos).toBe(before.photos);
    // Numbering carries on where it stopped: no piston label or job number is handed out twice.
    expect(after.sequences).toEqual(before.sequences);

    // The restored database is a working shop: a server on it signs the owner in.
    const server = await startServer(target.url, { STEPSTOCK_NO_BACKGROUND: '1' });
    try {
      const session = new HttpSession(server.url);
      await session.signIn(owner);
      const parts = await session.get('/api/parts?q=DRL-GASKET');
      expect(parts.status).toBe(200);
    } finally {
      await server.stop();
    }

    process.stdout.write(
      `${JSON.stringify({
        drill: 'backup-restore',
        tables: Object.keys(before.counts).length,
        rows: Object.values(before.counts).reduce((a, b) => a + b, 0),
        ledgerRows: before.counts.stock_ledger,
        dumpBytes: statSync(file).size,
      })}\n`,
    );
  });
});
