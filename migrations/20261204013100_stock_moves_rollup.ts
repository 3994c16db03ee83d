// Movements that changed on hand, kept summed beside the ledger per part and UTC day and per part
// and UTC month, so that stock value's turnover over a window adds up a few thousand rows instead
// of every receipt and issue of the last months (five million at a shop group's size). The ledger
// stays the truth: a statement trigger adds each insert's rows to both sums in the same
// transaction (holds write quantity 0 and skip it at once), and the reader takes whole months and
// whole days from the sums and only the window's first part-day from the ledger itself.
//
// A movement written without a unit cost is valued at the part's average cost at the time of
// reading, so the sums keep the quantities of those apart (quantity_cost_unknown) to be valued
// then, exactly as the ledger would be read.
import type { Knex } from 'knex';

/** Sums of ledger rows `n` with quantity <> 0: the value they brought in, and their issues' cost. */
const SUMS = `
  coalesce(sum(n.quantity * n.unit_cost) FILTER (WHERE n.unit_cost IS NOT NULL), 0),
  coalesce(sum(n.quantity) FILTER (WHERE n.unit_cost IS NULL), 0)::bigint,
  coalesce(sum(-n.quantity * n.unit_cost) FILTER (WHERE n.kind = 'issue' AND n.unit_cost IS NOT NULL), 0),
  coalesce(sum(-n.quantity) FILTER (WHERE n.kind = 'issue' AND n.unit_cost IS NULL), 0)::bigint`;

const COLUMNS = `value_known, quantity_cost_unknown, issue_cost_known, issue_quantity_cost_unknown`;

const ADD = `
  value_known = s.value_known + excluded.value_known,
  quantity_cost_unknown = s.quantity_cost_unknown + excluded.quantity_cost_unknown,
  issue_cost_known = s.issue_cost_known + excluded.issue_cost_known,
  issue_quantity_cost_unknown = s.issue_quantity_cost_unknown + excluded.issue_quantity_cost_unknown`;

const TABLE = (name: string, key: string) => `
  CREATE TABLE ${name} (
    ${key} date NOT NULL,
    part_id uuid NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
    value_known numeric NOT NULL,
    quantity_cost_unknown bigint NOT NULL,
    issue_cost_known numeric NOT NULL,
    issue_quantity_cost_unknown bigint NOT NULL,
    PRIMARY KEY (${key}, part_id)
  );`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    ${TABLE('stock_moves_days', 'day')}
    ${TABLE('stock_moves_months', 'month')}
    ALTER TABLE stock_moves_months
      ADD CONSTRAINT stock_moves_months_first_day CHECK (extract(day FROM month) = 1);

    CREATE FUNCTION stock_moves_rollup_add() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NOT EXISTS (SELECT 1 FROM new_rows WHERE quantity <> 0) THEN
          RETURN NULL;
        END IF;
        -- In key order, so two inserts adding to the same days lock them in the same order.
        INSERT INTO stock_moves_days AS s (day, part_id, ${COLUMNS})
          SELECT (n.at AT TIME ZONE 'UTC')::date, n.part_id, ${SUMS}
            FROM new_rows n WHERE n.quantity <> 0 GROUP BY 1, 2 ORDER BY 1, 2
          ON CONFLICT (day, part_id) DO UPDATE SET ${ADD};
        INSERT INTO stock_moves_months AS s (month, part_id, ${COLUMNS})
          SELECT date_trunc('month', n.at AT TIME ZONE 'UTC')::date, n.part_id, ${SUMS}
            FROM new_rows n WHERE n.quantity <> 0 GROUP BY 1, 2 ORDER BY 1, 2
          ON CONFLICT (month, part_id) DO UPDATE SET ${ADD};
        RETURN NULL;
      END $$;
    CREATE TRIGGER stock_ledger_moves_rollup AFTER INSERT ON stock_ledger
      REFERENCING NEW TABLE AS new_rows
      FOR EACH STATEMENT EXECUTE FUNCTION stock_moves_rollup_add();

    INSERT INTO stock_moves_days (day, part_id, ${COLUMNS})
      SELECT (n.at AT TIME ZONE 'UTC')::date, n.part_id, ${SUMS}
        FROM stock_ledger n WHERE n.quantity <> 0 GROUP BY 1, 2;
    INSERT INTO stock_moves_months (month, part_id, ${COLUMNS})
      SELECT date_trunc('month', day::timestamp)::date, part_id, sum(value_known),
             sum(quantity_cost_unknown), sum(issue_cost_known), sum(issue_quantity_cost_unknown)
        FROM stock_moves_days GROUP BY 1, 2;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TRIGGER stock_ledger_moves_rollup ON stock_ledger;
    DROP FUNCTION stock_moves_rollup_add();
    DROP TABLE stock_moves_months;
    DROP TABLE stock_moves_days;
  `);
}
