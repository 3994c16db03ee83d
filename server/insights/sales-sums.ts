// Issue rows of a period, summed per part and month, for the sales figures. Read from the sums kept
// beside the ledger (sales_months for the whole months inside the period, sales_days for the odd
// days at its ends) while those were made in the zone asked for; otherwise from the ledger itself,
// with the same columns, so each figure reads the same either way.
import { splitPeriod } from './period-split';

export interface PeriodArgs {
  fromDay: string;
  toDay: string;
  tz: string;
}

/** Named bindings for ISSUED_CTE from a period. */
export function issuedBindings(args: PeriodArgs): Record<string, string | null> {
  const split = splitPeriod(args.fromDay, args.toDay);
  const [first, second] = split.days;
  return {
    fromDay: args.fromDay,
    toDay: args.toDay,
    tz: args.tz,
    monthsFrom: split.months?.from ?? null,
    monthsTo: split.months?.toExclusive ?? null,
    days1From: first?.from ?? null,
    days1To: first?.to ?? null,
    days2From: second?.from ?? null,
    days2To: second?.to ?? null,
  };
}

/**
 * `issued(part_id, month, units, revenue, cost_known, units_cost_unknown)`: units and revenue as
 * sold (an issue's quantity is negative), cost_known at the cost recorded with each issue, and the
 * units issued with no cost recorded, which the figures value at the part's average cost.
 */
export const ISSUED_CTE = `
  sums_zone AS (SELECT zone FROM sales_rollup_zone),
  issued AS (
    SELECT m.part_id, m.month, m.units, m.revenue, m.cost_known, m.units_cost_unknown
      FROM sales_months m
     WHERE (SELECT zone FROM sums_zone) = :tz
       AND m.month >= :monthsFrom::date AND m.month < :monthsTo::date
    UNION ALL
    SELECT d.part_id, date_trunc('month', d.day)::date, d.units, d.revenue, d.cost_known,
           d.units_cost_unknown
      FROM sales_days d
     WHERE (SELECT zone FROM sums_zone) = :tz
       AND (d.day BETWEEN :days1From::date AND :days1To::date
            OR d.day BETWEEN :days2From::date AND :days2To::date)
    UNION ALL
    SELECT l.part_id, date_trunc('month', l.at AT TIME ZONE :tz)::date, -l.quantity,
           -l.quantity * coalesce(l.sale_price, 0),
           CASE WHEN l.unit_cost IS NOT NULL THEN -l.quantity * l.unit_cost ELSE 0 END,
           CASE WHEN l.unit_cost IS NULL THEN -l.quantity ELSE 0 END
      FROM stock_ledger l
     WHERE (SELECT zone FROM sums_zone) IS DISTINCT FROM :tz
       AND l.kind = 'issue'
       AND l.at >= (:fromDay::date)::timestamp AT TIME ZONE :tz
       AND l.at < (:toDay::date + 1)::timestamp AT TIME ZONE :tz
  )`;

/** Margin of issued rows joined to their part p: revenue less cost, unknown costs at average. */
export const ISSUED_MARGIN = `(i.revenue - i.cost_known - i.units_cost_unknown * p.average_cost)`;
