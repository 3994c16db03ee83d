// The money figures' SQL, one statement each: revenue by month from the issued invoices and credit
// notes, the estimates' answers by the month they were first sent, the balances still owed on
// handed-back jobs, and the deposits held on jobs not invoiced yet.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { PeriodArgs } from './insights-repository';

/** Moments on the calendar days :fromDay … :toDay in the zone :tz. */
const inPeriod = (column: string) => `${column} >= (:fromDay::date)::timestamp AT TIME ZONE :tz
    AND ${column} < (:toDay::date + 1)::timestamp AT TIME ZONE :tz`;

const MONTHS = `SELECT m::date AS month
    FROM generate_series(date_trunc('month', :fromDay::date),
                         date_trunc('month', :toDay::date), interval '1 month') AS m`;

export interface RevenueMonthDb {
  month: string;
  invoices: number;
  labour: string;
  parts: string;
  other: string;
  tax: string;
  invoiced: string;
  credited: string;
}

export async function revenueByMonth(args: PeriodArgs, k: Knex = db): Promise<RevenueMonthDb[]> {
  const result = await k.raw<{ rows: RevenueMonthDb[] }>(
    `
    WITH months AS (${MONTHS}),
    issued AS (
      SELECT date_trunc('month', i.issued_at AT TIME ZONE :tz)::date AS month,
             count(*)::int AS invoices, sum(i.tax) AS tax, sum(i.total) AS invoiced,
             sum(l.labour) AS labour, sum(l.parts) AS parts, sum(l.other) AS other
        FROM invoices i
        CROSS JOIN LATERAL (
          SELECT coalesce(sum(total) FILTER (WHERE kind = 'labour'), 0) AS labour,
                 coalesce(sum(total) FILTER (WHERE kind = 'part'), 0) AS parts,
                 coalesce(sum(total) FILTER (WHERE kind = 'other'), 0) AS other
            FROM invoice_lines WHERE invoice_id = i.id) l
       WHERE ${inPeriod('i.issued_at')}
       GROUP BY 1
    ),
    credits AS (
      SELECT date_trunc('month', c.issued_at AT TIME ZONE :tz)::date AS month,
             sum(c.total) AS credited
        FROM credit_notes c
       WHERE ${inPeriod('c.issued_at')}
       GROUP BY 1
    )
    SELECT to_char(m.month, 'YYYY-MM') AS month,
           coalesce(i.invoices, 0)::int AS invoices,
           coalesce(i.labour, 0)::text AS labour, coalesce(i.parts, 0)::text AS parts,
           coalesce(i.other, 0)::text AS other, coalesce(i.tax, 0)::text AS tax,
           coalesce(i.invoiced, 0)::text AS invoiced, coalesce(c.credited, 0)::text AS credited
      FROM months m
      LEFT JOIN issued i ON i.month = m.month
      LEFT JOIN credits c ON c.month = m.month
     ORDER BY m.month
    `,
    { ...args },
  );
  return result.rows;
}

export interface EstimateMonthDb {
  month: string | null;
  sent: number;
  approved: number;
  declined: number;
  waiting: number;
  median_days: string | null;
  approved_unsent: number;
}

/**
 * Per month of first sending, and the whole period as the row whose month is null (with the
 * approvals taken without sending, which belong to no month of sending).
 */
export async function estimatesByMonth(args: PeriodArgs, k: Knex = db): Promise<EstimateMonthDb[]> {
  const result = await k.raw<{ rows: EstimateMonthDb[] }>(
    `
    WITH months AS (${MONTHS}),
    sent AS (
      SELECT date_trunc('month', e.first_sent_at AT TIME ZONE :tz)::date AS month,
             e.first_approved_at IS NOT NULL AS approved,
             e.first_approved_at IS NULL AND e.state = 'declined' AS declined,
             CASE WHEN e.first_approved_at >= e.first_sent_at
                  THEN extract(epoch FROM e.first_approved_at - e.first_sent_at) / 86400 END AS days
        FROM estimates e
       WHERE e.first_sent_at IS NOT NULL AND ${inPeriod('e.first_sent_at')}
    ),
    grouped AS (
      SELECT month, count(*)::int AS sent,
             count(*) FILTER (WHERE approved)::int AS approved,
             count(*) FILTER (WHERE declined)::int AS declined,
             percentile_cont(0.5) WITHIN GROUP (ORDER BY days) AS median_days
        FROM sent GROUP BY GROUPING SETS ((month), ())
    )
    SELECT to_char(m.month, 'YYYY-MM') AS month, coalesce(g.sent, 0) AS sent,
           coalesce(g.approved, 0) AS approved, coalesce(g.declined, 0) AS declined,
           coalesce(g.sent - g.approved - g.declined, 0) AS waiting,
           round(g.median_days::numeric, 1)::text AS median_days, 0 AS approved_unsent
      FROM months m LEFT JOIN grouped g ON g.month = m.month
    UNION ALL
    SELECT NULL, coalesce(g.sent, 0), coalesce(g.approved, 0), coalesce(g.declined, 0),
           coalesce(g.sent - g.approved - g.declined, 0),
           round(g.median_days::numeric, 1)::text,
           (SELECT count(*)::int FROM estimates e
             WHERE e.first_sent_at IS NULL AND e.first_approved_at IS NOT NULL
               AND ${inPeriod('e.first_approved_at')})
      FROM (SELECT 1) one
      LEFT JOIN grouped g ON g.month IS NULL AND g.sent IS NOT NULL
     ORDER BY 1 NULLS LAST
    `,
    { ...args },
  );
  return result.rows;
}

/** The job a money row is about, as the owner knows it. */
export interface JobNamesDb {
  job_id: string;
  job_number: string;
  customer_name: string | null;
}

export interface OutstandingDb extends JobNamesDb {
  invoice_number: string;
  issued_at: Date;
  total: string;
  credited: string;
  paid: string;
  balance: string;
  days_owed: number;
}

/** Handed-back jobs whose invoice is not paid off: total − credit notes − payments kept > 0. */
export async function outstanding(k: Knex = db): Promise<OutstandingDb[]> {
  const result = await k.raw<{ rows: OutstandingDb[] }>(
    `
    SELECT j.id AS job_id, j.number AS job_number, j.customer_name,
           i.number AS invoice_number, i.issued_at, i.total::text AS total,
           c.credited::text AS credited, p.paid::text AS paid,
           (i.total - c.credited - p.paid)::text AS balance,
           floor(extract(epoch FROM now() - i.issued_at) / 86400)::int AS days_owed
      FROM invoices i
      JOIN jobs j ON j.id = i.job_id
      CROSS JOIN LATERAL (SELECT coalesce(sum(total), 0) AS credited
                            FROM credit_notes WHERE invoice_id = i.id) c
      CROSS JOIN LATERAL (SELECT coalesce(sum(amount), 0) AS paid
                            FROM payments WHERE job_id = i.job_id AND state = 'paid') p
     WHERE j.state = 'handed_back' AND i.total - c.credited - p.paid > 0
     ORDER BY i.issued_at, i.seq
    `,
  );
  return result.rows;
}

export interface DepositHeldDb extends JobNamesDb {
  job_state: string;
  amount: string;
  paid_at: Date | null;
}

/** Deposits paid and not given back on jobs without an invoice yet (open, or called off). */
export async function depositsHeld(k: Knex = db): Promise<DepositHeldDb[]> {
  const result = await k.raw<{ rows: DepositHeldDb[] }>(
    `
    SELECT j.id AS job_id, j.number AS job_number, j.customer_name, j.state AS job_state,
           p.amount::text AS amount, p.paid_at
      FROM payments p
      JOIN jobs j ON j.id = p.job_id
     WHERE p.purpose = 'deposit' AND p.state = 'paid'
       AND NOT EXISTS (SELECT 1 FROM invoices i WHERE i.job_id = j.id)
     ORDER BY p.paid_at NULLS LAST, p.created_at, p.id
    `,
  );
  return result.rows;
}
