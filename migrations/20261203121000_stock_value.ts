// What the stock on hand is worth, kept exactly beside its count, so that the moving average cost
// is derived from value ÷ quantity instead of drifting with every rounding of the average (three
// receipts of one unit at 1, 1 and 2 are worth 4, not 3 × 1.3333 = 3.9999).
//   Stock coming in sets the new value itself: a receipt adds quantity × unit cost, a count that
//   finds more adds them at the average cost. Stock going out (an issue, a count that finds fewer,
//   scrap, a return to the supplier) leaves it to the trigger below, wherever the change is made:
//   it takes its share of the value, rounded to the ledger's 4 decimals, and the last unit takes
//   all that is left.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE part_levels
      ADD COLUMN stock_value numeric NOT NULL DEFAULT 0,
      ADD CONSTRAINT part_levels_stock_value_check CHECK (stock_value >= 0);
    UPDATE part_levels pl SET stock_value = pl.on_hand * p.average_cost
      FROM parts p WHERE p.id = pl.part_id AND pl.on_hand > 0;

    CREATE FUNCTION part_levels_keep_value() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW.on_hand >= OLD.on_hand OR NEW.stock_value IS DISTINCT FROM OLD.stock_value THEN
          RETURN NEW;
        END IF;
        IF NEW.on_hand = 0 THEN
          NEW.stock_value := 0;
        ELSE
          NEW.stock_value := OLD.stock_value
            - round(OLD.stock_value * (OLD.on_hand - NEW.on_hand) / OLD.on_hand, 4);
        END IF;
        RETURN NEW;
      END $$;
    CREATE TRIGGER part_levels_keep_value BEFORE UPDATE OF on_hand ON part_levels
      FOR EACH ROW EXECUTE FUNCTION part_levels_keep_value();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TRIGGER part_levels_keep_value ON part_levels;
    DROP FUNCTION part_levels_keep_value();
    ALTER TABLE part_levels DROP CONSTRAINT part_levels_stock_value_check, DROP COLUMN stock_value;
  `);
}
