// What the supplier charges to ship an order, in the order's currency, so that it can be spread
// over what the order brings in (by value, by count, or not at all: a shop setting) as part of
// each unit's cost. An open order takes the supplier's usual shipping; closed orders were costed
// without it and keep 0.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE purchase_orders
      ADD COLUMN shipping_cost numeric(14, 4) NOT NULL DEFAULT 0,
      ADD CONSTRAINT purchase_orders_shipping_check CHECK (shipping_cost >= 0);
    UPDATE purchase_orders o SET shipping_cost = s.shipping_cost
      FROM suppliers s
     WHERE s.id = o.supplier_id AND o.state IN ('drafting', 'sent_out')
       AND o.currency = s.currency;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE purchase_orders DROP CONSTRAINT purchase_orders_shipping_check,
      DROP COLUMN shipping_cost;
  `);
}
