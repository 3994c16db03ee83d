// Customers as records of their own. A job used to carry three free-text fields typed again at
// every visit; each job now points at one customer. The job keeps its customer_name, _phone and
// _email columns as a copy the database maintains from the customer (a trigger on both tables), so
// every reader of a job, and the ready notice, sees the customer's current details, and erasing a
// customer's contact details reaches every one of their jobs in the same statement.
//
// Existing jobs move over: one customer per distinct name (ignoring case and spaces at the ends),
// phone and e-mail as they were typed. Down puts the copies back as plain text and drops the table.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE customers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      phone text,
      email text,
      accepts_email boolean NOT NULL DEFAULT true,
      notes text NOT NULL DEFAULT '',
      -- Set when the customer's personal data was erased on request; the row stays so their jobs,
      -- the stock ledger and any invoices keep pointing at something.
      erased_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT customers_name_check CHECK (length(trim(name)) > 0 AND length(name) <= 120),
      CONSTRAINT customers_phone_check CHECK (phone IS NULL OR length(phone) <= 40),
      CONSTRAINT customers_email_check CHECK (email IS NULL OR length(email) <= 254),
      CONSTRAINT customers_notes_check CHECK (length(notes) <= 2000),
      CONSTRAINT customers_erased_check
        CHECK (erased_at IS NULL OR (phone IS NULL AND email IS NULL AND notes = ''))
    );
    CREATE INDEX customers_name_idx ON customers (lower(name));

    ALTER TABLE jobs ADD COLUMN customer_id uuid REFERENCES customers (id);

    INSERT INTO customers (name, phone, email, created_at, updated_at)
    SELECT left(min(trim(customer_name)), 120), nullif(trim(customer_phone), ''),
           nullif(lower(trim(customer_email)), ''), min(created_at), max(updated_at)
    FROM jobs
    GROUP BY lower(trim(customer_name)), nullif(trim(customer_phone), ''),
             nullif(lower(trim(customer_email)), '');

    UPDATE jobs j SET customer_id = c.id
    FROM customers c
    WHERE lower(c.name) = lower(left(trim(j.customer_name), 120))
      AND c.phone IS NOT DISTINCT FROM nullif(trim(j.customer_phone), '')
      AND c.email IS NOT DISTINCT FROM nullif(lower(trim(j.customer_email)), '');

    ALTER TABLE jobs ALTER COLUMN customer_id SET NOT NULL;
    CREATE INDEX jobs_customer_idx ON jobs (customer_id);

    -- A job's customer fields are the customer's. A job written the old way (a name and no
    -- customer) gets a customer of its own; the service finds an existing one before that.
    CREATE FUNCTION jobs_customer_copy() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE c customers%ROWTYPE;
      BEGIN
        IF TG_OP = 'INSERT' AND NEW.customer_id IS NULL THEN
          INSERT INTO customers (name, phone, email)
          VALUES (left(trim(NEW.customer_name), 120), nullif(trim(NEW.customer_phone), ''),
                  nullif(trim(NEW.customer_email), ''))
          RETURNING id INTO NEW.customer_id;
        END IF;
        SELECT * INTO c FROM customers WHERE id = NEW.customer_id;
        IF FOUND THEN
          NEW.customer_name := c.name;
          NEW.customer_phone := c.phone;
          NEW.customer_email := c.email;
        END IF;
        RETURN NEW;
      END $$;
    CREATE TRIGGER jobs_customer_copy
      BEFORE INSERT OR UPDATE OF customer_id, customer_name, customer_phone, customer_email ON jobs
      FOR EACH ROW EXECUTE FUNCTION jobs_customer_copy();

    CREATE FUNCTION customers_copy_to_jobs() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        UPDATE jobs SET customer_name = NEW.name, customer_phone = NEW.phone,
                        customer_email = NEW.email
        WHERE customer_id = NEW.id;
        RETURN NULL;
      END $$;
    CREATE TRIGGER customers_copy_to_jobs AFTER UPDATE OF name, phone, email ON customers
      FOR EACH ROW
      WHEN (OLD.name IS DISTINCT FROM NEW.name OR OLD.phone IS DISTINCT FROM NEW.phone
            OR OLD.email IS DISTINCT FROM NEW.email)
      EXECUTE FUNCTION customers_copy_to_jobs();

    -- The ready notice also respects the customer's own wish not to get e-mail.
    CREATE OR REPLACE FUNCTION jobs_ready_notice() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE v_to text := lower(trim(NEW.customer_email));
      BEGIN
        IF NEW.state = 'ready_to_go' AND OLD.state <> 'ready_to_go' AND NEW.notify_customer
           AND v_to ~ '^[^@\\s<>]+@[^@\\s<>]+$'
           AND EXISTS (SELECT 1 FROM customers c WHERE c.id = NEW.customer_id AND c.accepts_email) THEN
          INSERT INTO outbox (to_address, template, data, dedupe_key)
          VALUES (v_to, 'job-ready', jsonb_build_object('jobId', NEW.id), 'job-ready:' || NEW.id)
          ON CONFLICT (dedupe_key) WHERE dedupe_key IS NOT NULL DO NOTHING;
        END IF;
        RETURN NULL;
      END $$;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE FUNCTION jobs_ready_notice() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE v_to text := lower(trim(NEW.customer_email));
      BEGIN
        IF NEW.state = 'ready_to_go' AND OLD.state <> 'ready_to_go' AND NEW.notify_customer
           AND v_to ~ '^[^@\\s<>]+@[^@\\s<>]+$' THEN
          INSERT INTO outbox (to_address, template, data, dedupe_key)
          VALUES (v_to, 'job-ready', jsonb_build_object('jobId', NEW.id), 'job-ready:' || NEW.id)
          ON CONFLICT (dedupe_key) WHERE dedupe_key IS NOT NULL DO NOTHING;
        END IF;
        RETURN NULL;
      END $$;
    DROP TRIGGER customers_copy_to_jobs ON customers;
    DROP FUNCTION customers_copy_to_jobs();
    DROP TRIGGER jobs_customer_copy ON jobs;
    DROP FUNCTION jobs_customer_copy();
    ALTER TABLE jobs DROP COLUMN customer_id;
    DROP TABLE customers;
  `);
}
