// The invoice a job gets when it is handed back, its lines, and the credit notes that correct it.
// Numbers come from one counter row per series, locked (SELECT … FOR UPDATE) and raised inside the
// hand-back's own transaction: a hand-back that rolls back gives its number back with it, so the
// series has no gaps and no number is used twice (a sequence would lose numbers on rollback).
// An issued invoice, a credit note and their lines are never changed or deleted: triggers refuse it,
// and a correction is a new credit note that names the invoice.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE document_counters (
      series text PRIMARY KEY,
      last_number integer NOT NULL DEFAULT 0,
      CONSTRAINT document_counters_series_check CHECK (series IN ('invoice', 'credit_note')),
      CONSTRAINT document_counters_last_check CHECK (last_number >= 0)
    );
    INSERT INTO document_counters (series) VALUES ('invoice'), ('credit_note');

    CREATE TABLE invoices (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      job_id uuid NOT NULL REFERENCES jobs (id),
      seq integer NOT NULL,
      number text NOT NULL,
      issued_at timestamptz NOT NULL DEFAULT now(),
      issued_by uuid REFERENCES users (id),
      currency text NOT NULL,
      tax_rate numeric(7, 3) NOT NULL,
      prices_include_tax boolean NOT NULL,
      subtotal numeric(12, 2) NOT NULL,
      tax numeric(12, 2) NOT NULL,
      total numeric(12, 2) NOT NULL,
      -- Which estimate the lines came from: the version the customer approved, or the estimate as
      -- it stood when nobody approved one.
      estimate_version integer,
      estimate_approved boolean NOT NULL,
      CONSTRAINT invoices_job_unique UNIQUE (job_id),
      CONSTRAINT invoices_seq_unique UNIQUE (seq),
      CONSTRAINT invoices_number_unique UNIQUE (number),
      CONSTRAINT invoices_seq_check CHECK (seq >= 1),
      CONSTRAINT invoices_currency_check CHECK (currency ~ '^[A-Z]{3}$'),
      CONSTRAINT invoices_tax_check CHECK (tax_rate >= 0 AND tax >= 0)
    );
    CREATE INDEX invoices_issued_idx ON invoices (issued_at);

    CREATE TABLE invoice_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      invoice_id uuid NOT NULL REFERENCES invoices (id),
      position integer NOT NULL,
      kind text NOT NULL,
      description text NOT NULL,
      quantity numeric(10, 3) NOT NULL,
      unit_price numeric(12, 2) NOT NULL,
      total numeric(12, 2) NOT NULL,
      part_id uuid REFERENCES parts (id),
      -- A part issued to the job that the estimate did not have.
      since_estimate boolean NOT NULL DEFAULT false,
      CONSTRAINT invoice_lines_kind_check CHECK (kind IN ('labour', 'part', 'other')),
      CONSTRAINT invoice_lines_quantity_check CHECK (quantity > 0),
      CONSTRAINT invoice_lines_position_unique UNIQUE (invoice_id, position)
    );

    CREATE TABLE credit_notes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      invoice_id uuid NOT NULL REFERENCES invoices (id),
      seq integer NOT NULL,
      number text NOT NULL,
      issued_at timestamptz NOT NULL DEFAULT now(),
      issued_by uuid REFERENCES users (id),
      reason text NOT NULL,
      subtotal numeric(12, 2) NOT NULL,
      tax numeric(12, 2) NOT NULL,
      total numeric(12, 2) NOT NULL,
      CONSTRAINT credit_notes_seq_unique UNIQUE (seq),
      CONSTRAINT credit_notes_number_unique UNIQUE (number),
      CONSTRAINT credit_notes_seq_check CHECK (seq >= 1),
      CONSTRAINT credit_notes_reason_check CHECK (length(trim(reason)) > 0),
      CONSTRAINT credit_notes_total_check CHECK (total > 0 AND tax >= 0)
    );
    CREATE INDEX credit_notes_invoice_idx ON credit_notes (invoice_id);

    CREATE TABLE credit_note_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      credit_note_id uuid NOT NULL REFERENCES credit_notes (id),
      position integer NOT NULL,
      description text NOT NULL,
      quantity numeric(10, 3) NOT NULL,
      unit_price numeric(12, 2) NOT NULL,
      total numeric(12, 2) NOT NULL,
      CONSTRAINT credit_note_lines_quantity_check CHECK (quantity > 0),
      CONSTRAINT credit_note_lines_price_check CHECK (unit_price > 0),
      CONSTRAINT credit_note_lines_position_unique UNIQUE (credit_note_id, position)
    );

    CREATE FUNCTION issued_documents_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'an issued % is never changed; issue a credit note instead', TG_TABLE_NAME
          USING ERRCODE = 'restrict_violation';
      END;
    $$;
    CREATE TRIGGER invoices_never_change BEFORE UPDATE OR DELETE ON invoices
      FOR EACH ROW EXECUTE FUNCTION issued_documents_refuse_change();
    CREATE TRIGGER invoice_lines_never_change BEFORE UPDATE OR DELETE ON invoice_lines
      FOR EACH ROW EXECUTE FUNCTION issued_documents_refuse_change();
    CREATE TRIGGER credit_notes_never_change BEFORE UPDATE OR DELETE ON credit_notes
      FOR EACH ROW EXECUTE FUNCTION issued_documents_refuse_change();
    CREATE TRIGGER credit_note_lines_never_change BEFORE UPDATE OR DELETE ON credit_note_lines
      FOR EACH ROW EXECUTE FUNCTION issued_documents_refuse_change();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TABLE credit_note_lines;
    DROP TABLE credit_notes;
    DROP TABLE invoice_lines;
    DROP TABLE invoices;
    DROP FUNCTION issued_documents_refuse_change();
    DROP TABLE document_counters;
  `);
}
