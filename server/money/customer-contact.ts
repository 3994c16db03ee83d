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
  const row = await k('jobs').where({ id: jobId }).first('customer_name', 'customer_email');
  if (!row) return null;
  const email = typeof row.customer_email === 'string' ? row.customer_email.trim() : '';
  return { name: row.customer_name as string, email: email === '' ? null : email };
}
