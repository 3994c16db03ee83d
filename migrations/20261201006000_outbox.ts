// E-mail leaves the shop through an outbox: a row written in the same transaction as the event that
// caused it, sent later by a worker that retries with backoff. A row either carries its finished
// subject and bodies, or names a template and its data (rows written by database triggers, which
// cannot render mail); the worker renders those just before sending and stores the result.
//
// mailbox_messages keeps what the local SMTP server (demo and tests) receives, for the Mailbox page.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE outbox (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      to_address text NOT NULL,
      subject text,
      body_text text,
      body_html text,
      -- [{ "filename": "...", "contentType": "text/csv", "content": "..." }]: text attachments only.
      attachments jsonb NOT NULL DEFAULT '[]'::jsonb,
      template text,
      data jsonb NOT NULL DEFAULT '{}'::jsonb,
      -- A sender that may run twice for one event (a daily digest) names the event here.
      dedupe_key text,
      status text NOT NULL DEFAULT 'pending',
      attempts integer NOT NULL DEFAULT 0,
      next_attempt_at timestamptz NOT NULL DEFAULT now(),
      last_error text,
      sent_at timestamptz,
      message_id text,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT outbox_status_check CHECK (status IN ('pending', 'sent', 'failed')),
      CONSTRAINT outbox_to_check CHECK (to_address ~ '^[^@\\s<>]+@[^@\\s<>]+$'),
      CONSTRAINT outbox_content_check CHECK (
        template IS NOT NULL OR (subject IS NOT NULL AND body_text IS NOT NULL)),
      CONSTRAINT outbox_attempts_check CHECK (attempts >= 0),
      CONSTRAINT outbox_sent_check CHECK ((status = 'sent') = (sent_at IS NOT NULL)),
      CONSTRAINT outbox_attachments_check CHECK (jsonb_typeof(attachments) = 'array')
    );
    CREATE UNIQUE INDEX outbox_dedupe_unique ON outbox (dedupe_key) WHERE dedupe_key IS NOT NULL;
    -- The worker's question: which pending rows are due, oldest first.
    CREATE INDEX outbox_due_idx ON outbox (next_attempt_at) WHERE status = 'pending';
    CREATE INDEX outbox_created_idx ON outbox (created_at);

    CREATE TABLE mailbox_messages (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      to_address text NOT NULL,
      from_address text NOT NULL,
      subject text NOT NULL,
      body_text text NOT NULL,
      body_html text,
      message_id text,
      received_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX mailbox_messages_received_idx ON mailbox_messages (received_at DESC);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TABLE mailbox_messages;
    DROP TABLE outbox;
  `);
}
