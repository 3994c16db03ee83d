// When an estimate first went to the customer and when it was first approved, kept for the owner's
// figures (approval rate, days to approve). The estimate's own sent_at and approval are cleared
// when it changes and needs a new answer; these two are set once, by the database, the first time
// either is written, so no path that sends or approves can forget them. Existing estimates take
// them from the audit trail (the first send and approval recorded there), else from their columns.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    ALTER TABLE estimates
      ADD COLUMN first_sent_at timestamptz,
      ADD COLUMN first_approved_at timestamptz;

    UPDATE estimates e SET
      first_sent_at = coalesce(
        (SELECT min(a.at) FROM audit_events a
          WHERE a.entity = 'job' AND a.entity_id = e.job_id::text AND a.action = 'estimate.send'),
        e.sent_at),
      first_approved_at = coalesce(
        (SELECT min(a.at) FROM audit_events a
          WHERE a.entity = 'job' AND a.entity_id = e.job_id::text AND a.action = 'estimate.approve'),
        e.approved_at);

    CREATE FUNCTION estimates_first_milestones() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW.first_sent_at IS NULL AND NEW.sent_at IS NOT NULL THEN
          NEW.first_sent_at := NEW.sent_at;
        END IF;
        IF NEW.first_approved_at IS NULL AND NEW.approved_at IS NOT NULL THEN
          NEW.first_approved_at := NEW.approved_at;
        END IF;
        RETURN NEW;
      END;
    $$;
    CREATE TRIGGER estimates_first_milestones BEFORE INSERT OR UPDATE ON estimates
      FOR EACH ROW EXECUTE FUNCTION estimates_first_milestones();
    CREATE INDEX estimates_first_sent_idx ON estimates (first_sent_at)
      WHERE first_sent_at IS NOT NULL;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TRIGGER estimates_first_milestones ON estimates;
    DROP FUNCTION estimates_first_milestones();
    ALTER TABLE estimates DROP COLUMN first_sent_at, DROP COLUMN first_approved_at;
  `);
}
