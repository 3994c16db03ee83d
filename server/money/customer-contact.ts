// The one place the money side reads whom to write to about a job: the customer's name and e-mail
// address, or null for no address. Everything else (estimate, payment, invoice mail) asks here.
import type { Knex } from 'knex';
import { db } from '../db/knex';

export interface CustomerContact {
  name: string;
  email: string | null;
}

export async function customerContact(
  jobId: string,
  k: Knex = db,
): Promise<CustomerContact | null> {
  // The job's customer record: its current name, and its address only while they accept e-mail.
  const row = await k('jobs as j')
    .join('customers as c', 'c.id', 'j.customer_id')
    .where('j.id', jobId)
    .first('c.name', 'c.email', 'c.accepts_email');
  if (!row) return null;
  const email = typeof row.email === 'string' && row.accepts_email ? row.email.trim() : '';
  return { name: row.name as string, email: email === '' ? null : email };
}
