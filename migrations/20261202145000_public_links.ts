// The customer's link to a job's public page: only the SHA-256 of the token is kept (the token
// itself is in the e-mail and nowhere else), and each link ends after a fixed time; the page also
// refuses a link once the job is closed.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE public_links (
      token_hash text PRIMARY KEY,
      job_id uuid NOT NULL REFERENCES jobs (id) ON DELETE CASCADE,
      created_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz NOT NULL,
      CONSTRAINT public_links_hash_check CHECK (token_hash ~ '^[0-9a-f]{64}$'),
      CONSTRAINT public_links_expiry_check CHECK (expires_at > created_at)
    );
    CREATE INDEX public_links_job_idx ON public_links (job_id);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TABLE public_links');
}
