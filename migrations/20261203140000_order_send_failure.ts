// A purchase order's e-mail can be refused for good after the order was marked sent (the
// supplier's mail server answers 5xx, or every retry failed). The order then goes back to being
// drafted, with the reason kept, so the buyer sees why and can correct the address and send again:
// an order is never "sent out" when its message never left. The link is the outbox row queued by
// the send; a trigger does the step back in the same transaction that gives the message up, so it
// holds whichever process runs the mail worker.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE purchase_orders
      ADD COLUMN send_outbox_id uuid REFERENCES outbox (id) ON DELETE SET NULL,
      ADD COLUMN send_error text;
    CREATE INDEX purchase_orders_send_outbox_idx ON purchase_orders (send_outbox_id)
      WHERE send_outbox_id IS NOT NULL;

    CREATE FUNCTION purchase_order_mail_given_up() RETURNS trigger AS $$
    BEGIN
      UPDATE purchase_orders
         SET state = 'drafting', sent_at = NULL, sent_by = NULL, send_outbox_id = NULL,
             send_error = coalesce(NEW.last_error, 'the e-mail could not be delivered'),
             updated_at = now()
       WHERE send_outbox_id = NEW.id AND state = 'sent_out';
      RETURN NEW;
    END;
    $$ LANGUAGE plpgsql;

    CREATE TRIGGER purchase_order_mail_given_up
      AFTER UPDATE OF status ON outbox
      FOR EACH ROW WHEN (NEW.status = 'failed' AND OLD.status IS DISTINCT FROM 'failed')
      EXECUTE FUNCTION purchase_order_mail_given_up();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TRIGGER IF EXISTS purchase_order_mail_given_up ON outbox;
    DROP FUNCTION IF EXISTS purchase_order_mail_given_up();
    ALTER TABLE purchase_orders DROP COLUMN IF EXISTS send_error,
      DROP COLUMN IF EXISTS send_outbox_id;
  `);
}
