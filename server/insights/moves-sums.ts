// Movements that changed on hand since a moment, for stock value's turnover: whole UTC months and
// whole UTC days from the sums kept beside the ledger (stock_moves_months, stock_moves_days), and
// only the hours between the moment and the next UTC midnight from the ledger itself. The three
// parts do not overlap and between them cover every row at or after the moment (later-dated rows
// included), so the sums add up to what the ledger would.

/**
 * SQL of CTEs ending in `moved(part_id, value_known, quantity_cost_unknown, issue_cost_known,
 * issue_quantity_cost_unknown)`, for the ledger rows with quantity <> 0 and at or after `start`
 * (an SQL expression of a timestamptz): the value brought in at the costs recorded (signed: stock leaving takes
 * value out), and the quantities with no cost recorded, which the figure values at the part's
 * average cost; then the same for the issues alone (positive).
 */
export function movedCte(start: string): string {
  return `
  moved_from AS (
    SELECT (${start} AT TIME ZONE 'UTC')::date + 1 AS first_day
  ),
  moved_bounds AS (
    SELECT first_day, (date_trunc('month', (first_day - 1)::timestamp) + interval '1 month')::date
             AS first_month,
           first_day::timestamp AT TIME ZONE 'UTC' AS first_day_at
      FROM moved_from
  ),
  moved AS (
    SELECT m.part_id, m.value_known, m.quantity_cost_unknown, m.issue_cost_known,
           m.issue_quantity_cost_unknown
      FROM stock_moves_months m
     WHERE m.month >= (SELECT first_month FROM moved_bounds)
    UNION ALL
    SELECT d.part_id, d.value_known, d.quantity_cost_unknown, d.issue_cost_known,
           d.issue_quantity_cost_unknown
      FROM stock_moves_days d
     WHERE d.day >= (SELECT first_day FROM moved_bounds)
       AND d.day < (SELECT first_month FROM moved_bounds)
    UNION ALL
    SELECT l.part_id,
           CASE WHEN l.unit_cost IS NOT NULL THEN l.quantity * l.unit_cost ELSE 0 END,
           CASE WHEN l.unit_cost IS NULL THEN l.quantity ELSE 0 END,
           CASE WHEN l.kind = 'issue' AND l.unit_cost IS NOT NULL THEN -l.quantity * l.unit_cost
                ELSE 0 END,
           CASE WHEN l.kind = 'issue' AND l.unit_cost IS NULL THEN -l.quantity ELSE 0 END
      FROM stock_ledger l
     WHERE l.quantity <> 0
       AND l.at >= ${start}
       AND l.at < (SELECT first_day_at FROM moved_bounds)
  )`;
}
