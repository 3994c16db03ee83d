// The customer's notice that a job is ready for collection: queued in the outbox by the database in
// the same transaction that moves the job to ready_to_go, whichever code moves it, unless the
// machinist turned the job's customer notices off or the job has no e-mail address. One notice per
// job (dedupe key). The worker writes the message from the job (mail template 'job-ready').
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE FUNCTION jobs_ready_notice() RETURNS trigger LANGUAGE plpgsql AS $$
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
    CREATE TRIGGER jobs_ready_notice AFTER UPDATE OF state ON jobs
      FOR EACH ROW EXECUTE FUNCTION jobs_ready_notice();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TRIGGER jobs_ready_notice ON jobs;
    DROP FUNCTION jobs_ready_notice();
  `);
}
