// The only place insights builds SQL. Each figure is one statement: PostgreSQL aggregates the ledger
// and hands back a few dozen rows, never the ledger itself.
//
// Sales are the ledger's 'issue' rows: quantity is the signed effect on on-hand (negative for an
// issue), sale_price the price charged per unit and unit_cost the moving average cost per unit at
// the moment of issue. An issue written without a price charged nothing; one written without a cost
// is valued at the part's average cost now, the best estimate left.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { ISSUED_CTE, ISSUED_MARGIN, issuedBindings, type PeriodArgs } from './sales-sums';
import { movedCte } from './moves-sums';

export type { PeriodArgs } from './sales-sums';

/** What was sold in a period: units issued, their revenue and margin (NUMERIC text). */
export interface SalesSumsDb {
  units: number;
  revenue: string;
  margin: string;
}

/** The part a report's row names, with its family and step. */
export interface PartNamesDb {
  sku: string;
  description: string;
  kind: string;
  family_id: string | null;
  family_code: string | null;
  step_id: string | null;
  step_label: string | null;
}

export interface SalesRowDb extends SalesSumsDb {
  family_id: string | null;
  step_id: string | null;
  grand: number;
  family_code: string | null;
  family_name: string | null;
  step_label: string | null;
  step_position: number | null;
}

/** Sales grouped by family and/or step, with the grand total as the row where grand = 1. */
export async function salesBy(
  args: PeriodArgs & { byFamily: boolean; byStep: boolean },
  k: Knex = db,
): Promise<SalesRowDb[]> {
  const result = await k.raw<{ rows: SalesRowDb[] }>(
    `
    WITH ${ISSUED_CTE}, sold AS (
      SELECT CASE WHEN :byFamily THEN p.family_id END AS family_id,
             CASE WHEN :byStep THEN p.step_id END AS step_id,
             i.units, i.revenue, ${ISSUED_MARGIN} AS margin
        FROM issued i
        JOIN parts p ON p.id = i.part_id
    ), grouped AS (
      SELECT family_id, step_id,
             (GROUPING(family_id, step_id) > 0)::int AS grand,
             coalesce(sum(units), 0)::bigint AS units,
             coalesce(sum(revenue), 0) AS revenue,
             coalesce(sum(margin), 0) AS margin
        FROM sold
       GROUP BY GROUPING SETS ((family_id, step_id), ())
    )
    SELECT g.*, ef.code AS family_code, ef.name AS family_name,
           ss.label AS step_label, ss.position AS step_position
      FROM grouped g
      LEFT JOIN engine_families ef ON ef.id = g.family_id
      LEFT JOIN series_steps ss ON ss.id = g.step_id
     ORDER BY g.grand, g.revenue DESC, ef.code NULLS LAST, ss.position NULLS LAST
    `,
    { ...issuedBindings(args), byFamily: args.byFamily, byStep: args.byStep },
  );
  return result.rows;
}

export interface MonthRowDb extends SalesSumsDb {
  month: string;
}

/** Every month of the period (months with no sales too), in the shop's time zone. */
export async function salesByMonth(args: PeriodArgs, k: Knex = db): Promise<MonthRowDb[]> {
  const result = await k.raw<{ rows: MonthRowDb[] }>(
    `
    WITH months AS (
      SELECT m::date AS month
        FROM generate_series(date_trunc('month', :fromDay::date),
                             date_trunc('month', :toDay::date), interval '1 month') AS m
    ), ${ISSUED_CTE}, sold AS (
      SELECT i.month, sum(i.units)::bigint AS units, sum(i.revenue) AS revenue,
             sum(${ISSUED_MARGIN}) AS margin
        FROM issued i
        JOIN parts p ON p.id = i.part_id
       GROUP BY 1
    )
    SELECT to_char(m.month, 'YYYY-MM') AS month,
           coalesce(s.units, 0)::bigint AS units,
           coalesce(s.revenue, 0) AS revenue,
           coalesce(s.margin, 0) AS margin
      FROM months m
      LEFT JOIN sold s ON s.month = m.month
     ORDER BY m.month
    `,
    issuedBindings(args),
  );
  return result.rows;
}

export interface TopSellerDb extends PartNamesDb, SalesSumsDb {
  part_id: string;
}

const RANK_COLUMNS = { units: 's.units', revenue: 's.revenue', margin: 's.margin' } as const;

export async function topSellers(
  args: PeriodArgs & { rank: keyof typeof RANK_COLUMNS; limit: number },
  k: Knex = db,
): Promise<TopSellerDb[]> {
  const order = RANK_COLUMNS[args.rank];
  const result = await k.raw<{ rows: TopSellerDb[] }>(
    `
    WITH ${ISSUED_CTE}, s AS (
      SELECT i.part_id, sum(i.units)::bigint AS units,
             sum(i.revenue) AS revenue, sum(${ISSUED_MARGIN}) AS margin
        FROM issued i
        JOIN parts p ON p.id = i.part_id
       GROUP BY i.part_id
    )
    SELECT p.id AS part_id, p.sku, p.description, p.kind, p.family_id, ef.code AS family_code,
           p.step_id, ss.label AS step_label, s.units, s.revenue, s.margin
      FROM s
      JOIN parts p ON p.id = s.part_id
      LEFT JOIN engine_families ef ON ef.id = p.family_id
      LEFT JOIN series_steps ss ON ss.id = p.step_id
     ORDER BY ${order} DESC, p.sku
     LIMIT :limit
    `,
    { ...issuedBindings(args), limit: args.limit },
  );
  return result.rows;
}

export interface StockValueDb {
  family_id: string | null;
  grand: number;
  on_hand: number;
  value: string;
  cost_of_issues: string;
  opening_value: string;
  turnover: string | null;
  days_of_cover: number | null;
  family_code: string | null;
  family_name: string | null;
}

/**
 * Stock at its value (kept exactly beside its count) per family, and turnover over the last
 * :months months.
 * Inventory turnover = cost of goods issued ÷ average inventory at cost, the average being
 * (opening + closing) ÷ 2. The opening value is rebuilt from the ledger by the cost-flow identity
 * closing = opening + Σ(signed quantity × unit cost) over the window's movements, read from the
 * sums kept beside the ledger (moves-sums.ts).
 */
export async function stockValue(months: number, k: Knex = db): Promise<StockValueDb[]> {
  const result = await k.raw<{ rows: StockValueDb[] }>(
    `
    WITH win AS (
      SELECT now() - make_interval(months => :months) AS start,
             extract(epoch FROM now() - (now() - make_interval(months => :months))) / 86400 AS days
    ), closing AS (
      SELECT p.family_id, sum(pl.on_hand)::bigint AS on_hand, sum(pl.stock_value) AS value
        FROM part_levels pl
        JOIN parts p ON p.id = pl.part_id
       GROUP BY p.family_id
    ), ${movedCte('(SELECT start FROM win)')}, moves AS (
      SELECT p.family_id,
             sum(m.value_known + m.quantity_cost_unknown * p.average_cost) AS net_in,
             sum(m.issue_cost_known + m.issue_quantity_cost_unknown * p.average_cost)
               AS cost_of_issues
        FROM moved m
        JOIN parts p ON p.id = m.part_id
       GROUP BY p.family_id
    ), fam AS (
      SELECT k.family_id, coalesce(c.on_hand, 0) AS on_hand, coalesce(c.value, 0) AS value,
             coalesce(m.net_in, 0) AS net_in, coalesce(m.cost_of_issues, 0) AS cost_of_issues
        FROM (SELECT family_id FROM closing UNION SELECT family_id FROM moves) k
        LEFT JOIN closing c ON c.family_id IS NOT DISTINCT FROM k.family_id
        LEFT JOIN moves m ON m.family_id IS NOT DISTINCT FROM k.family_id
    ), rolled AS (
      SELECT family_id, (GROUPING(family_id) > 0)::int AS grand,
             coalesce(sum(on_hand), 0)::bigint AS on_hand, coalesce(sum(value), 0) AS value,
             coalesce(sum(net_in), 0) AS net_in, coalesce(sum(cost_of_issues), 0) AS cost_of_issues
        FROM fam
       GROUP BY GROUPING SETS ((family_id), ())
    ), figures AS (
      SELECT r.*, greatest(r.value - r.net_in, 0) AS opening_value FROM rolled r
    )
    SELECT f.family_id, f.grand, f.on_hand, round(f.value, 4) AS value,
           round(f.cost_of_issues, 4) AS cost_of_issues, round(f.opening_value, 4) AS opening_value,
           CASE WHEN f.opening_value + f.value > 0
                THEN round(f.cost_of_issues / ((f.opening_value + f.value) / 2), 2) END AS turnover,
           CASE WHEN f.cost_of_issues > 0
                THEN round(f.value / (f.cost_of_issues / (SELECT days FROM win)))::int END
             AS days_of_cover,
           ef.code AS family_code, ef.name AS family_name
      FROM figures f
      LEFT JOIN engine_families ef ON ef.id = f.family_id
     ORDER BY f.grand, f.value DESC, ef.code NULLS LAST
    `,
    { months },
  );
  return result.rows;
}

export interface DeadStockDb extends PartNamesDb {
  since: Date;
  part_id: string | null;
  on_hand: number;
  held: number;
  value: string;
  last_issued_at: Date | null;
  last_received_at: Date | null;
  total_value: string | null;
}

/**
 * Parts with free stock (on hand less what is held for jobs) and neither an issue nor a receipt in
 * the last :months months, valued at their free units, most money first. A part received lately is
 * new stock, not dead, and units held for a job are spoken for. Always at least
 * one row: the cut-off moment, with part_id null when nothing is dead.
 */
export async function deadStock(months: number, k: Knex = db): Promise<DeadStockDb[]> {
  const result = await k.raw<{ rows: DeadStockDb[] }>(
    `
    WITH cut AS (SELECT now() - make_interval(months => :months) AS since),
    dead AS (
      SELECT p.id AS part_id, pl.on_hand, pl.held,
             (pl.on_hand - pl.held) * p.average_cost AS value,
             li.at AS last_issued_at, lr.at AS last_received_at,
             p.sku, p.description, p.kind, p.family_id, ef.code AS family_code,
             p.step_id, ss.label AS step_label
        FROM part_levels pl
        JOIN parts p ON p.id = pl.part_id
        LEFT JOIN LATERAL (
          SELECT l.at FROM stock_ledger l
           WHERE l.part_id = p.id AND l.kind = 'issue' ORDER BY l.at DESC LIMIT 1) li ON true
        LEFT JOIN LATERAL (
          SELECT l.at FROM stock_ledger l
           WHERE l.part_id = p.id AND l.kind = 'receipt' ORDER BY l.at DESC LIMIT 1) lr ON true
        LEFT JOIN engine_families ef ON ef.id = p.family_id
        LEFT JOIN series_steps ss ON ss.id = p.step_id
       WHERE pl.on_hand - pl.held > 0
         AND (li.at IS NULL OR li.at < (SELECT since FROM cut))
         AND (lr.at IS NULL OR lr.at < (SELECT since FROM cut))
    )
    SELECT cut.since, d.*, sum(d.value) OVER () AS total_value
      FROM cut
      LEFT JOIN dead d ON true
     ORDER BY d.value DESC NULLS LAST, d.sku
    `,
    { months },
  );
  return result.rows;
}

export interface AbcDb {
  part_id: string;
  value: string;
  share: string;
  cumulative: string;
  class: 'A' | 'B' | 'C';
  sku: string;
  description: string;
  family_code: string | null;
  step_label: string | null;
  on_hand: number;
  class_parts: number;
  class_value: string;
  class_share: string;
  total_value: string;
}

/**
 * ABC classes by issue value at cost over the period's days (Pareto convention 80/15/5), the
 * same rule as shared/abc.ts: largest value first (ties by id); a part is A while the cumulative
 * share before it is below 80 %, B while below 95 %, else C. Comparisons are exact (no division).
 * Parts on the shelf that did not move are listed too, as C with value 0.
 */
export async function abc(args: PeriodArgs, k: Knex = db): Promise<AbcDb[]> {
  const result = await k.raw<{ rows: AbcDb[] }>(
    `
    WITH ${ISSUED_CTE}, used AS (
      SELECT i.part_id,
             greatest(sum(i.cost_known + i.units_cost_unknown * p.average_cost), 0) AS value
        FROM issued i
        JOIN parts p ON p.id = i.part_id
       GROUP BY i.part_id
    ), items AS (
      SELECT p.id AS part_id, coalesce(u.value, 0) AS value, pl.on_hand
        FROM parts p
        JOIN part_levels pl ON pl.part_id = p.id
        LEFT JOIN used u ON u.part_id = p.id
       WHERE u.part_id IS NOT NULL OR (pl.on_hand > 0 AND p.kind <> 'kit')
    ), ranked AS (
      SELECT i.*, sum(i.value) OVER () AS total,
             sum(i.value) OVER (ORDER BY i.value DESC, i.part_id
                                ROWS BETWEEN UNBOUNDED PRECEDING AND CURRENT ROW) AS running
        FROM items i
    ), classed AS (
      SELECT r.*,
             CASE WHEN r.total = 0 THEN 'C'
                  WHEN r.running - r.value < 0.80 * r.total THEN 'A'
                  WHEN r.running - r.value < 0.95 * r.total THEN 'B'
                  ELSE 'C' END AS class
        FROM ranked r
    )
    SELECT c.part_id, round(c.value, 4) AS value,
           CASE WHEN c.total = 0 THEN 0.0000 ELSE round(c.value / c.total, 4) END AS share,
           CASE WHEN c.total = 0 THEN 0.0000 ELSE round(c.running / c.total, 4) END AS cumulative,
           c.class, p.sku, p.description, ef.code AS family_code, ss.label AS step_label, c.on_hand,
           count(*) OVER (PARTITION BY c.class)::int AS class_parts,
           round(sum(c.value) OVER (PARTITION BY c.class), 4) AS class_value,
           CASE WHEN c.total = 0 THEN 0.0000
                ELSE round(sum(c.value) OVER (PARTITION BY c.class) / c.total, 4) END AS class_share,
           round(c.total, 4) AS total_value
      FROM classed c
      JOIN parts p ON p.id = c.part_id
      LEFT JOIN engine_families ef ON ef.id = p.family_id
      LEFT JOIN series_steps ss ON ss.id = p.step_id
     ORDER BY c.value DESC, c.part_id
    `,
    issuedBindings(args),
  );
  return result.rows;
}

export interface SupplierReliabilityDb {
  supplier_id: string;
  supplier_name: string;
  orders_received: number;
  lines_received: number;
  promised_days: string | null;
  actual_days: string | null;
  average_days_late: string | null;
  on_time_share: string | null;
}

/**
 * Promised against actual lead time per supplier, over order lines received in the last :months
 * months. Days run from the day the order was sent to the day promised (the order's expected date,
 * or the supplier's usual lead time when the order named none) and to the day each delivery came
 * in, as calendar days in the shop's time zone. A delivery in two parts counts each part.
 */
export async function supplierReliability(
  args: { months: number; tz: string },
  k: Knex = db,
): Promise<{ rows: SupplierReliabilityDb[]; anyEver: boolean }> {
  // A database from before purchasing existed has no orders to compare: say so, do not fail.
  const present = await k.raw<{ rows: { present: boolean }[] }>(
    `SELECT to_regclass('purchase_order_receipt_lines') IS NOT NULL AS present`,
  );
  if (!present.rows[0].present) return { rows: [], anyEver: false };
  const result = await k.raw<{ rows: (SupplierReliabilityDb & { any_ever: boolean })[] }>(
    `
    WITH ever AS (
      SELECT EXISTS (SELECT 1 FROM purchase_order_receipt_lines) AS any_ever
    ), lines AS (
      SELECT o.supplier_id, o.id AS order_id,
             (r.received_at AT TIME ZONE :tz)::date - (o.sent_at AT TIME ZONE :tz)::date AS actual,
             coalesce(o.expected_on, (o.sent_at AT TIME ZONE :tz)::date + s.lead_days)
               - (o.sent_at AT TIME ZONE :tz)::date AS promised
        FROM purchase_order_receipt_lines rl
        JOIN purchase_order_receipts r ON r.id = rl.receipt_id
        JOIN purchase_orders o ON o.id = r.order_id
        JOIN suppliers s ON s.id = o.supplier_id
       WHERE o.sent_at IS NOT NULL
         AND r.received_at >= now() - make_interval(months => :months)
    ), per_supplier AS (
      SELECT l.supplier_id, count(DISTINCT l.order_id)::int AS orders_received,
             count(*)::int AS lines_received,
             round(avg(l.promised), 1) AS promised_days,
             round(avg(l.actual), 1) AS actual_days,
             round(avg(l.actual - l.promised), 1) AS average_days_late,
             round(avg(CASE WHEN l.actual <= l.promised THEN 1 ELSE 0 END), 4) AS on_time_share
        FROM lines l
       GROUP BY l.supplier_id
    )
    SELECT ever.any_ever, p.*, s.id AS supplier_id, s.name AS supplier_name
      FROM ever
      LEFT JOIN per_supplier p ON true
      LEFT JOIN suppliers s ON s.id = p.supplier_id
     ORDER BY p.average_days_late DESC NULLS LAST, s.name
    `,
    { months: args.months, tz: args.tz },
  );
  const rows = result.rows;
  return {
    anyEver: rows[0]?.any_ever ?? false,
    rows: rows.filter((r) => r.supplier_id !== null),
  };
}
