// The bench's own invented shop, built in SQL with generate_series so it takes seconds, not hours:
// 40 engine families with nine steps each, 800 parts, 100,000 measured piston units (6,000 of them
// on one "hot" part), 1,000,000 stock-ledger rows over two years (receipts, sales, ring-set counts,
// holds that came and went) that net exactly to the levels, 10,000 jobs, four users. At `--scale N`
// the units, the ledger, the sales and the jobs are N times as many over the same two years and
// the same 40 families, so each family's shelf is N times as deep too (a shop group's stock).
import bcrypt from 'bcryptjs';
import type pg from 'pg';

export const BENCH_PASSWORD = 'bench-password-long';
export const UNITS = 100_000;
export const HOT_UNITS = 6_000;
export const LEDGER_ROWS = 1_000_000;
const ISSUED_UNITS = 35_000;
const RING_ISSUES_PER_PART = 500;
const RING_RECEIPTS_PER_PART = 11;
const RING_RECEIPT_SIZE = 50;
const FAMILIES = 40;
const STEPS = 9;
const OPEN_JOBS = 6_000;
const CLOSED_JOBS = 4_000;
const HOT_OPEN_JOBS = 1_000;

export interface BenchShop {
  users: Record<'owner' | 'buyer' | 'machinist' | 'staff', { id: string; email: string }>;
  hotFamilyId: string;
  hotPartId: string;
  /** A family of ordinary size (about 2,400 pistons, 1,500 of them on the shelf). */
  typicalFamilyId: string;
  supplierId: string;
  ledgerRows: number;
  units: number;
}

export async function generateShop(client: pg.Client, scale = 1): Promise<BenchShop> {
  const q = async (sql: string, params: unknown[] = []) => (await client.query(sql, params)).rows;
  const units = UNITS * scale;
  const ledgerTarget = LEDGER_ROWS * scale;
  const ringIssues = RING_ISSUES_PER_PART * scale;
  const ringReceiptSize = RING_RECEIPT_SIZE * scale;
  await q('begin');
  const hash = bcrypt.hashSync(BENCH_PASSWORD, 10);
  const users = {} as BenchShop['users'];
  for (const role of ['owner', 'buyer', 'machinist', 'staff'] as const) {
    const [row] = await q(
      `insert into users (email, name, role, password_hash) values ($1, $2, $3, $4) returning id`,
      [`${role}@bench.test`, `Bench ${role}`, role, hash],
    );
    users[role] = { id: row.id, email: `${role}@bench.test` };
  }

  const [series] = await q(
    `insert into step_series (code, name, unit) values ('BENCH-MM', 'Bench steps', 'mm') returning id`,
  );
  await q(
    `insert into series_steps (series_id, position, label, offset_nm)
     select $1, g, case when g = 0 then 'STD' else '+' || to_char(g * 0.25, 'FM0.00') end, g * 250000
       from generate_series(0, $2::int - 1) g`,
    [series.id, STEPS],
  );
  // Bores from 40 mm up in 1.5 mm strides; eight cylinders each, so a job can take eight pistons.
  await q(
    `insert into engine_families (code, name, stroke_type, cylinders, cooling, standard_bore_nm, stroke_nm,
       clearance_min_nm, clearance_max_nm, hone_allowance_nm, cleanup_nm, max_oversize_nm, step_series_id)
     select 'BF-' || lpad(g::text, 3, '0'), 'Bench family ' || g, case when g % 2 = 0 then 'two' else 'four' end,
            8, case when g % 3 = 0 then 'liquid' else 'air' end, 40000000 + g * 1500000, 50000000 + g * 1000000,
            30000, 60000, 20000, 50000, 2000000, $1
       from generate_series(1, $2::int) g`,
    [series.id, FAMILIES],
  );
  await q(
    `insert into bins (code, name) select 'BB-' || lpad(g::text, 3, '0'), 'Bench shelf ' || g
       from generate_series(1, 200) g`,
  );
  // A piston part and a ring-set part per family and step; 80 small parts besides.
  await q(
    `insert into parts (kind, sku, family_id, step_id, description, material, ring_count, sale_price, average_cost)
     select k.kind, ef.code || '-' || upper(left(k.kind, 1)) || ss.position, ef.id, ss.id,
            'Bench ' || k.kind || ' ' || ef.code || ' ' || ss.label,
            case when k.kind = 'piston' then 'cast' end, case when k.kind = 'piston' then 2 end,
            case when k.kind = 'piston' then 48.50 else 19.80 end,
            case when k.kind = 'piston' then 21.25 else 8.40 end
       from engine_families ef
       join series_steps ss on ss.series_id = ef.step_series_id
      cross join (values ('piston'), ('rings')) k(kind)
      where ef.code like 'BF-%'`,
  );
  await q(
    `insert into parts (kind, sku, description, sale_price, average_cost)
     select 'other', 'BX-' || lpad(g::text, 3, '0'), 'Bench small part ' || g, 3.20, 1.10
       from generate_series(1, 80) g`,
  );
  const [hot] = await q(
    `select p.id, p.family_id from parts p join series_steps ss on ss.id = p.step_id
      where p.sku = 'BF-001-P2'`,
  );

  // Piston units: the hot part first, then the rest spread evenly over every piston part. Each is
  // measured a few microns under its step's nominal bore minus the clearance.
  await q(`create temp table bench_piston_parts as
    select p.id, p.family_id, ef.standard_bore_nm + ss.offset_nm - 45000 as skirt, row_number() over (order by p.sku) - 1 as i
      from parts p join engine_families ef on ef.id = p.family_id join series_steps ss on ss.id = p.step_id
     where p.kind = 'piston' and p.sku like 'BF-%'`);
  const [{ n: pistonParts }] = await q(`select count(*)::int as n from bench_piston_parts`);
  await q(
    `insert into piston_units (part_id, skirt_nm, bin_id, status, received_at, measured_at, unit_cost)
     select $1, bp.skirt - (g % 9) * 1000, (select id from bins where code = 'BB-001'), 'free',
            now() - interval '300 days' + (g % 280) * interval '1 day', now() - interval '20 days', 21.25
       from generate_series(1, $2::int) g join bench_piston_parts bp on bp.id = $1`,
    [hot.id, HOT_UNITS],
  );
  await q(
    `insert into piston_units (part_id, skirt_nm, bin_id, status, received_at, measured_at, unit_cost)
     select bp.id, bp.skirt - (g % 9) * 1000,
            (select id from bins where code = 'BB-' || lpad((1 + g % 200)::text, 3, '0')),
            case when g % 100 < 37 then 'issued' else 'free' end,
            now() - interval '730 days' + (g % 700) * interval '1 day', now() - interval '10 days', 21.25
       from generate_series(1, $1::int) g join bench_piston_parts bp on bp.i = g % $2`,
    [units - HOT_UNITS, pistonParts],
  );
  const [{ issued }] = await q(
    `select count(*)::int as issued from piston_units where status = 'issued'`,
  );

  // The ledger. Receipts of every piston, sales of the issued ones (some weeks after receipt).
  await q(`insert into stock_ledger (at, part_id, unit_id, kind, quantity, unit_cost, to_bin_id, ref)
    select received_at, part_id, id, 'receipt', 1, unit_cost, bin_id, 'bench' from piston_units`);
  await q(`insert into stock_ledger (at, part_id, unit_id, kind, quantity, unit_cost, sale_price, reason)
    select least(now(), u.received_at + (1 + abs(hashtext(u.id::text)) % 60) * interval '1 day'),
           u.part_id, u.id, 'issue', -1, u.unit_cost, 48.50, 'sold'
      from piston_units u where u.status = 'issued'`);
  // Ring sets: deliveries of fifty, sold one at a time across two years.
  await q(
    `insert into stock_ledger (at, part_id, kind, quantity, unit_cost, ref)
     select now() - interval '730 days' + g * interval '60 days', p.id, 'receipt', $1, 8.40, 'bench'
       from parts p cross join generate_series(1, $2::int) g where p.kind = 'rings' and p.sku like 'BF-%'`,
    [ringReceiptSize, RING_RECEIPTS_PER_PART],
  );
  await q(
    `insert into stock_ledger (at, part_id, kind, quantity, unit_cost, sale_price, reason)
     select now() - interval '720 days' + g * ($2::float / $1) * interval '1 day', p.id, 'issue', -1,
            8.40, 19.80, 'sold'
       from parts p cross join generate_series(1, $1::int) g where p.kind = 'rings' and p.sku like 'BF-%'`,
    [ringIssues, RING_ISSUES_PER_PART * 1.4],
  );
  // Holds that came and went: a reservation and its release, net zero, filling up to a million rows.
  const [{ n: sofar }] = await q(`select count(*)::int as n from stock_ledger`);
  const pairs = Math.floor((ledgerTarget - sofar) / 2);
  await q(
    `create temp table bench_units as select id, part_id, row_number() over (order by id) as rn from piston_units`,
  );
  await q(
    `insert into stock_ledger (at, part_id, unit_id, kind, quantity, held_delta, reason)
     select now() - interval '700 days' + (g % 690) * interval '1 day' + k.shift * interval '3 days',
            u.part_id, u.id, k.kind, 0, k.delta, 'bench hold'
       from generate_series(1, $1::int) g
       join bench_units u on u.rn = 1 + g % ${units}
      cross join (values ('reservation', 1, 0), ('release', -1, 1)) k(kind, delta, shift)`,
    [pairs],
  );
  // An odd remainder: one more delivery of small parts makes the count exact.
  const remainder = ledgerTarget - sofar - 2 * pairs;
  if (remainder > 0) {
    await q(
      `insert into stock_ledger (part_id, kind, quantity, unit_cost, ref)
       select p.id, 'receipt', 10, 1.10, 'bench' from parts p cross join generate_series(1, $1::int)
        where p.sku = 'BX-001'`,
      [remainder],
    );
  }
  const [{ n: ledgerRows }] = await q(`select count(*)::int as n from stock_ledger`);
  // Levels are the ledger's sums, as every service keeps them.
  await q(`update part_levels l set on_hand = s.on_hand, held = s.held
    from (select part_id, sum(quantity)::int as on_hand, sum(held_delta)::int as held from stock_ledger group by part_id) s
   where s.part_id = l.part_id`);
  await q(
    `update parts p set average_cost = case when p.kind = 'piston' then 21.25 else 8.40 end where p.kind <> 'other'`,
  );

  // Jobs: closed ones over two years, open ones waiting for their pistons; a thousand of the open
  // ones are on the hot part's family so the hot-part bench has cylinders to hold for.
  await q(
    `insert into jobs (customer_name, family_id, cylinders, state, created_at, state_changed_at, closed_at)
     select 'Bench customer ' || g, ef.id, 8, 'handed_back', now() - (g % 700) * interval '1 day',
            now() - (g % 700) * interval '1 day', now() - (g % 700) * interval '1 day' + interval '5 days'
       from generate_series(1, $1::int) g
       join engine_families ef on ef.code = 'BF-' || lpad((1 + g % ${FAMILIES})::text, 3, '0')`,
    [CLOSED_JOBS * scale],
  );
  await q(
    `insert into jobs (customer_name, family_id, cylinders, state, created_at, due_date)
     select 'Bench customer open ' || g,
            case when g <= $2 then $3::uuid
                 else (select id from engine_families where code = 'BF-' || lpad((1 + g % ${FAMILIES})::text, 3, '0')) end,
            8, 'booked_in', now() - (g % 30) * interval '1 day', current_date + (g % 40)
       from generate_series(1, $1::int) g`,
    [OPEN_JOBS * scale, HOT_OPEN_JOBS, hot.family_id],
  );
  await q(
    `insert into job_cylinders (job_id, n) select j.id, c from jobs j cross join generate_series(1, 8) c`,
  );
  const [typical] = await q(`select id from engine_families where code = 'BF-010'`);
  const [supplier] = await q(
    `insert into suppliers (name, email, currency, lead_days) values ('Bench Pistons Ltd', 'orders@bench.test', 'EUR', 7)
     returning id`,
  );
  await q('commit');
  // A shop's tables are vacuumed by autovacuum as they grow; right after a bulk load they are not
  // yet, and autovacuum would do it in the middle of the figures. Doing it here measures the shop
  // as it runs (index-only scans can skip the table once its pages are marked all-visible).
  await q('vacuum (analyze)');
  if (issued < ISSUED_UNITS * scale * 0.9)
    throw new Error(`expected about ${ISSUED_UNITS * scale} issued units, made ${issued}`);
  return {
    users,
    hotFamilyId: hot.family_id,
    hotPartId: hot.id,
    typicalFamilyId: typical.id,
    supplierId: supplier.id,
    ledgerRows,
    units,
  };
}
