// Writing e-mail: always inside the caller's transaction, so the message exists exactly when the
// event that caused it does. The worker (mail-worker.ts) sends it later.
import type { Knex } from 'knex';

export interface MailAttachment {
  filename: string;
  contentType: string;
  /** Text content (CSV, plain text), or a binary file (a PDF) written in base64. */
  content: string;
  encoding?: 'base64';
}

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: MailAttachment[];
  /** One message per key, ever: a second enqueue with the same key writes nothing. */
  dedupeKey?: string;
}

export interface TemplatedMail {
  to: string;
  template: string;
  data: Record<string, unknown>;
  dedupeKey?: string;
}

const EMAIL = /^[^@\s<>]+@[^@\s<>]+$/;

function checkAddress(to: string): string {
  const address = to.trim().toLowerCase();
  if (!EMAIL.test(address)) throw new Error(`Not an e-mail address: "${to}"`);
  return address;
}

/** Inserts one outbox row unless its dedupe key was already used: its id, or null. */
async function queueOnce(
  trx: Knex.Transaction | Knex,
  row: Record<string, unknown> & { to_address: string; dedupe_key: string | null },
): Promise<string | null> {
  const rows = await trx('outbox')
    .insert(row)
    .onConflict(trx.raw('(dedupe_key) WHERE dedupe_key IS NOT NULL'))
    .ignore()
    .returning('id');
  return (rows[0] as { id: string } | undefined)?.id ?? null;
}

/** Queues one message; returns its outbox id, or null when its dedupe key was already used. */
export async function enqueueMail(
  trx: Knex.Transaction | Knex,
  mail: OutgoingMail,
): Promise<string | null> {
  return queueOnce(trx, {
    to_address: checkAddress(mail.to),
    subject: mail.subject,
    body_text: mail.text,
    body_html: mail.html ?? null,
    attachments: JSON.stringify(mail.attachments ?? []),
    dedupe_key: mail.dedupeKey ?? null,
  });
}

/** Queues a message the worker renders from a named template just before sending. */
export async function enqueueTemplated(
  trx: Knex.Transaction | Knex,
  mail: TemplatedMail,
): Promise<string | null> {
  return queueOnce(trx, {
    to_address: checkAddress(mail.to),
    template: mail.template,
    data: JSON.stringify(mail.data),
    dedupe_key: mail.dedupeKey ?? null,
  });
}

/** Where mail to an erased person is kept pointing: a reserved domain that delivers nowhere. */
export const ERASED_ADDRESS = 'erased@erased.invalid';

/**
 * Forgets an address (a customer's data erased on request): messages still waiting to go to it are
 * never sent, and every copy kept of mail to it loses the address and its text. Returns how many
 * messages were touched.
 */
export async function forgetAddress(trx: Knex, address: string): Promise<number> {
  const rows = await trx('outbox')
    .whereRaw('lower(to_address) = lower(?)', [address])
    .update({
      to_address: ERASED_ADDRESS,
      // Empty, not null: a message without a template must keep a (now blank) text.
      body_text: trx.raw(`CASE WHEN body_text IS NULL THEN NULL ELSE '' END`),
      body_html: null,
      attachments: '[]',
      data: '{}',
      status: trx.raw(`CASE WHEN status = 'pending' THEN 'failed' ELSE status END`),
      last_error: trx.raw(
        `CASE WHEN status = 'pending' THEN 'not sent: the customer''s data was erased' ELSE last_error END`,
      ),
    });
  return rows;
}
