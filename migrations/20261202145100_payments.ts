// Money taken for a job: online through the hosted payment service (a checkout the customer pays
// on its page) or at the counter (cash, card on the shop's terminal, bank transfer). An online
// payment becomes paid only from the service's signed event; each event id is recorded once, in
// the same transaction, so an event delivered twice (or to two servers) counts once.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE payments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      job_id uuid NOT NULL REFERENCES jobs (id) ON DELETE CASCADE,
      purpose text NOT NULL,
      method text NOT NULL,
      amount numeric(12, 2) NOT NULL,
      currency text NOT NULL,
      state text NOT NULL DEFAULT 'open',
      checkout_id text,
      url text,
      provider_payment text,
      created_by uuid REFERENCES users (id),
      created_at timestamptz NOT NULL DEFAULT now(),
      paid_at timestamptz,
      paid_event text,
      refunded_at timestamptz,
      refund_reason text,
      refund_ref text,
      refunded_by uuid REFERENCES users (id),
      CONSTRAINT payments_purpose_check CHECK (purpose IN ('deposit', 'balance')),
      CONSTRAINT payments_method_check CHECK (method IN ('online', 'cash', 'card', 'transfer')),
      CONSTRAINT payments_state_check CHECK (state IN ('open', 'paid', 'refunded')),
      CONSTRAINT payments_amount_check CHECK (amount > 0),
      CONSTRAINT payments_currency_check CHECK (currency ~ '^[A-Z]{3}$'),
      CONSTRAINT payments_online_check CHECK ((method = 'online') = (checkout_id IS NOT NULL)),
      CONSTRAINT payments_paid_check CHECK (state = 'open' OR paid_at IS NOT NULL),
      CONSTRAINT payments_refund_check
        CHECK ((state = 'refunded') = (refunded_at IS NOT NULL AND refund_reason IS NOT NULL))
    );
    CREATE INDEX payments_job_idx ON payments (job_id, created_at);
    CREATE UNIQUE INDEX payments_checkout_unique ON payments (checkout_id) WHERE checkout_id IS NOT NULL;
    CREATE UNIQUE INDEX payments_event_unique ON payments (paid_event) WHERE paid_event IS NOT NULL;

    CREATE TABLE payment_events (
      event_id text PRIMARY KEY,
      type text NOT NULL,
      payment_id uuid REFERENCES payments (id) ON DELETE SET NULL,
      received_at timestamptz NOT NULL DEFAULT now()
    );
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TABLE payment_events; DROP TABLE payments;');
}
