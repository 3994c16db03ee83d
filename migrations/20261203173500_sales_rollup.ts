// Sales kept summed beside the ledger, per part and calendar day and per part and calendar month in
// the shop's time zone, so a year of sales is a few thousand rows to add up instead of every issue
// row. The ledger stays the truth: a statement trigger adds each insert's issue rows to both sums in
// the same transaction (holds write no issue rows and skip it at once), and insights read the sums
// only while they were made in the zone asked for; otherwise they read the ledger itself.
//
// Margin needs the cost of each issue; an issue written without one is valued at the part's average
// cost at the time of reading, so the sums keep those units apart (units_cost_unknown).
//
// When the shop's time zone changes, the sums are rebuilt in the settings' own transaction. The
// zone row is the rebuild's lock: each insert reads it FOR SHARE before adding to the sums, so an
// insert waits for a rebuild under way and then adds in the new zone.
import type { Knex } from 'knex';

const SUMS = `
  sum(-n.quantity)::bigint,
  sum(-n.quantity * coalesce(n.sale_price, 0)),
  coalesce(sum(-n.quantity * n.unit_cost) FILTER (WHERE n.unit_cost IS NOT NULL), 0),
  coalesce(sum(-n.quantity) FILTER (WHERE n.unit_cost IS NULL), 0)::bigint`;

const ADD = `
  units = s.units + excluded.units,
  revenue = s.revenue + excluded.revenue,
  cost_known = s.cost_known + excluded.cost_known,
  units_cost_unknown = s.units_cost_unknown + excluded.units_cost_unknown`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE sales_days (
      day date NOT NULL,
      part_id uuid NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
      units bigint NOT NULL,
      revenue numeric NOT NULL,
      cost_known numeric NOT NULL,
      units_cost_unknown bigint NOT NULL,
      PRIMARY KEY (day, part_id)
    );
    CREATE TABLE sales_months (
      month date NOT NULL,
      part_id uuid NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
      units bigint NOT NULL,
      revenue numeric NOT NULL,
      cost_known numeric NOT NULL,
      units_cost_unknown bigint NOT NULL,
      PRIMARY KEY (month, part_id),
      CONSTRAINT sales_months_first_day CHECK (extract(day FROM month) = 1)
    );
    CREATE TABLE sales_rollup_zone (
      only_row boolean PRIMARY KEY DEFAULT true CHECK (only_row),
      zone text NOT NULL
    );

    -- The shop's zone as PostgreSQL knows it; UTC when it does not (insights then read the ledger).
    CREATE FUNCTION shop_zone_for_sums(wanted text) RETURNS text LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM now() AT TIME ZONE wanted;
        RETURN wanted;
      EXCEPTION WHEN OTHERS THEN
        RETURN 'UTC';
      END $$;

    CREATE FUNCTION sales_rollup_rebuild(zone_wanted text) RETURNS void LANGUAGE plpgsql AS $$
      DECLARE tz text := shop_zone_for_sums(zone_wanted);
      BEGIN
        INSERT INTO sales_rollup_zone (zone) VALUES (tz)
          ON CONFLICT (only_row) DO UPDATE SET zone = excluded.zone;
        DELETE FROM sales_days;
        DELETE FROM sales_months;
        INSERT INTO sales_days (day, part_id, units, revenue, cost_known, units_cost_unknown)
          SELECT (n.at AT TIME ZONE tz)::date, n.part_id, ${SUMS}
            FROM stock_ledger n WHERE n.kind = 'issue' GROUP BY 1, 2;
        INSERT INTO sales_months (month, part_id, units, revenue, cost_known, units_cost_unknown)
          SELECT date_trunc('month', day)::date, part_id, sum(units), sum(revenue), sum(cost_known),
                 sum(units_cost_unknown)
            FROM sales_days GROUP BY 1, 2;
      END $$;

    CREATE FUNCTION sales_rollup_add() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE tz text;
      BEGIN
        IF NOT EXISTS (SELECT 1 FROM new_rows WHERE kind = 'issue') THEN
          RETURN NULL;
        END IF;
        SELECT zone INTO tz FROM sales_rollup_zone FOR SHARE;
        IF tz IS NULL THEN
          RETURN NULL;
        END IF;
        -- In key order, so two inserts adding to the same days lock them in the same order.
        INSERT INTO sales_days AS s (day, part_id, units, revenue, cost_known, units_cost_unknown)
          SELECT (n.at AT TIME ZONE tz)::date, n.part_id, ${SUMS}
            FROM new_rows n WHERE n.kind = 'issue' GROUP BY 1, 2 ORDER BY 1, 2
          ON CONFLICT (day, part_id) DO UPDATE SET ${ADD};
        INSERT INTO sales_months AS s (month, part_id, units, revenue, cost_known, units_cost_unknown)
          SELECT date_trunc('month', n.at AT TIME ZONE tz)::date, n.part_id, ${SUMS}
            FROM new_rows n WHERE n.kind = 'issue' GROUP BY 1, 2 ORDER BY 1, 2
          ON CONFLICT (month, part_id) DO UPDATE SET ${ADD};
        RETURN NULL;
      END $$;
    CREATE TRIGGER stock_ledger_sales_rollup AFTER INSERT ON stock_ledger
      REFERENCING NEW TABLE AS new_rows
      FOR EACH STATEMENT EXECUTE FUNCTION sales_rollup_add();

    CREATE FUNCTION sales_rollup_follow_zone() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE wanted text := coalesce(NEW.value ->> 'timeZone', 'UTC');
      BEGIN
        IF NEW.key <> 'shop' THEN
          RETURN NULL;
        END IF;
        IF (SELECT zone FROM sales_rollup_zone) IS DISTINCT FROM shop_zone_for_sums(wanted) THEN
          PERFORM sales_rollup_rebuild(wanted);
        END IF;
        RETURN NULL;
      END $$;
    CREATE TRIGGER settings_sales_rollup_zone AFTER INSERT OR UPDATE ON settings
      FOR EACH ROW EXECUTE FUNCTION sales_rollup_follow_zone();

    SELECT sales_rollup_rebuild(
      coalesce((SELECT value ->> 'timeZone' FROM settings WHERE key = 'shop'), 'UTC'));
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TRIGGER settings_sales_rollup_zone ON settings;
    DROP TRIGGER stock_ledger_sales_rollup ON stock_ledger;
    DROP FUNCTION sales_rollup_follow_zone();
    DROP FUNCTION sales_rollup_add();
    DROP FUNCTION sales_rollup_rebuild(text);
    DROP FUNCTION shop_zone_for_sums(text);
    DROP TABLE sales_rollup_zone;
    DROP TABLE sales_months;
    DROP TABLE sales_days;
  `);
}
