// Purchasing: purchase orders and their lines, deliveries received against them, jobs waiting on
// an order line for a piston, and the exchange rates the owner keeps for landed costs.
//
// An order's state, in our own words:
//   drafting    being put together; nothing sent, nothing on order
//   sent_out    e-mailed to the supplier; its lines count as on order
//   partly_in   some of it received
//   all_in      every line received in full
//   called_off  cancelled; whatever is still open is no longer on order
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE exchange_rates (
      currency text PRIMARY KEY,
      -- One unit of the currency is worth this much of the shop's home currency.
      rate numeric(18, 8) NOT NULL,
      updated_by uuid REFERENCES users (id),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT exchange_rates_currency_check CHECK (currency ~ '^[A-Z]{3}$'),
      CONSTRAINT exchange_rates_rate_check CHECK (rate > 0)
    );

    CREATE SEQUENCE purchase_order_number_seq;
    -- "PO-2612-0007": PO, year and month drafted, a running number that never restarts.
    CREATE FUNCTION next_purchase_order_number() RETURNS text LANGUAGE plpgsql AS $$
      DECLARE n bigint := nextval('purchase_order_number_seq');
      BEGIN
        RETURN 'PO-' || to_char(now() AT TIME ZONE 'UTC', 'YYMM') || '-'
          || lpad(n::text, greatest(4, length(n::text)), '0');
      END $$;

    CREATE TABLE purchase_orders (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      number text NOT NULL DEFAULT next_purchase_order_number(),
      supplier_id uuid NOT NULL REFERENCES suppliers (id),
      -- The supplier's currency when the order was drafted; every line price is in it.
      currency text NOT NULL,
      state text NOT NULL DEFAULT 'drafting',
      expected_on date,
      notes text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users (id),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      sent_at timestamptz,
      sent_by uuid REFERENCES users (id),
      closed_at timestamptz,
      CONSTRAINT purchase_orders_state_check
        CHECK (state IN ('drafting', 'sent_out', 'partly_in', 'all_in', 'called_off')),
      CONSTRAINT purchase_orders_currency_check CHECK (currency ~ '^[A-Z]{3}$'),
      CONSTRAINT purchase_orders_sent_check CHECK (state = 'drafting' OR state = 'called_off'
        OR sent_at IS NOT NULL),
      CONSTRAINT purchase_orders_closed_check
        CHECK ((state IN ('all_in', 'called_off')) = (closed_at IS NOT NULL))
    );
    CREATE UNIQUE INDEX purchase_orders_number_unique ON purchase_orders (number);
    CREATE INDEX purchase_orders_supplier_idx ON purchase_orders (supplier_id, created_at DESC);
    CREATE INDEX purchase_orders_state_idx ON purchase_orders (state, created_at DESC);

    CREATE TABLE purchase_order_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      order_id uuid NOT NULL REFERENCES purchase_orders (id) ON DELETE CASCADE,
      line_no integer NOT NULL,
      part_id uuid NOT NULL REFERENCES parts (id),
      quantity integer NOT NULL,
      unit_price numeric(14, 4) NOT NULL,
      received_quantity integer NOT NULL DEFAULT 0,
      CONSTRAINT purchase_order_lines_quantity_check CHECK (quantity BETWEEN 1 AND 10000),
      CONSTRAINT purchase_order_lines_price_check CHECK (unit_price >= 0),
      -- Never more received against a line than it asked for.
      CONSTRAINT purchase_order_lines_received_check
        CHECK (received_quantity >= 0 AND received_quantity <= quantity),
      CONSTRAINT purchase_order_lines_no_unique UNIQUE (order_id, line_no),
      CONSTRAINT purchase_order_lines_part_unique UNIQUE (order_id, part_id)
    );
    CREATE INDEX purchase_order_lines_part_idx ON purchase_order_lines (part_id);

    -- One row per delivery taken in against an order, and what it brought per line; the stock
    -- ledger rows carry the same receipt id in their ref.
    CREATE TABLE purchase_order_receipts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      order_id uuid NOT NULL REFERENCES purchase_orders (id),
      received_by uuid REFERENCES users (id),
      received_at timestamptz NOT NULL DEFAULT now(),
      note text NOT NULL DEFAULT ''
    );
    CREATE INDEX purchase_order_receipts_order_idx ON purchase_order_receipts (order_id);
    CREATE TABLE purchase_order_receipt_lines (
      receipt_id uuid NOT NULL REFERENCES purchase_order_receipts (id) ON DELETE CASCADE,
      line_id uuid NOT NULL REFERENCES purchase_order_lines (id),
      quantity integer NOT NULL,
      stock_receipt_id uuid NOT NULL,
      PRIMARY KEY (receipt_id, line_id),
      CONSTRAINT purchase_order_receipt_lines_quantity_check CHECK (quantity >= 1)
    );

    -- A job's cylinder waiting for a piston on order. When the line is received, the piston goes
    -- to the oldest waiting job first (fulfilled_at, hold_id); a wait can be called off.
    CREATE TABLE order_line_waits (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      line_id uuid NOT NULL REFERENCES purchase_order_lines (id) ON DELETE CASCADE,
      job_id uuid NOT NULL REFERENCES jobs (id),
      cylinder integer NOT NULL,
      created_by uuid REFERENCES users (id),
      created_at timestamptz NOT NULL DEFAULT now(),
      fulfilled_at timestamptz,
      hold_id uuid REFERENCES holds (id),
      cancelled_at timestamptz,
      FOREIGN KEY (job_id, cylinder) REFERENCES job_cylinders (job_id, n),
      CONSTRAINT order_line_waits_done_check CHECK (
        (fulfilled_at IS NULL OR cancelled_at IS NULL)
        AND ((fulfilled_at IS NULL) = (hold_id IS NULL)))
    );
    -- A cylinder waits on one line at a time.
    CREATE UNIQUE INDEX order_line_waits_active_unique ON order_line_waits (job_id, cylinder)
      WHERE fulfilled_at IS NULL AND cancelled_at IS NULL;
    CREATE INDEX order_line_waits_line_idx ON order_line_waits (line_id, created_at)
      WHERE fulfilled_at IS NULL AND cancelled_at IS NULL;

    -- What is on order per part: the open quantity of lines on orders sent out and not closed.
    CREATE OR REPLACE FUNCTION parts_on_order() RETURNS TABLE (part_id uuid, quantity bigint)
      LANGUAGE sql STABLE AS $$
        SELECT l.part_id, sum(l.quantity - l.received_quantity)::bigint
          FROM purchase_order_lines l
          JOIN purchase_orders o ON o.id = l.order_id
         WHERE o.state IN ('sent_out', 'partly_in') AND l.received_quantity < l.quantity
         GROUP BY l.part_id
      $$;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE FUNCTION parts_on_order() RETURNS TABLE (part_id uuid, quantity bigint)
      LANGUAGE sql STABLE AS $$ SELECT NULL::uuid, 0::bigint WHERE false $$;
    DROP TABLE order_line_waits;
    DROP TABLE purchase_order_receipt_lines;
    DROP TABLE purchase_order_receipts;
    DROP TABLE purchase_order_lines;
    DROP TABLE purchase_orders;
    DROP FUNCTION next_purchase_order_number();
    DROP SEQUENCE purchase_order_number_seq;
    DROP TABLE exchange_rates;
  `);
}
