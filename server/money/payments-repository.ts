// The payments' queries.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { PaymentMethod, PaymentPurpose, PaymentState } from '../../shared/api/money';

export interface PaymentRow {
  id: string;
  job_id: string;
  purpose: PaymentPurpose;
  method: PaymentMethod;
  amount: string;
  currency: string;
  state: PaymentState;
  checkout_id: string | null;
  url: string | null;
  provider_payment: string | null;
  created_at: Date;
  paid_at: Date | null;
  refunded_at: Date | null;
  refund_reason: string | null;
}

export async function paymentsOf(jobId: string, k: Knex = db): Promise<PaymentRow[]> {
  return (await k('payments')
    .where({ job_id: jobId })
    .orderBy([{ column: 'created_at' }, { column: 'id' }])) as PaymentRow[];
}

export async function lockPayment(
  trx: Knex,
  jobId: string,
  id: string,
): Promise<PaymentRow | undefined> {
  return (await trx('payments').where({ job_id: jobId, id }).forUpdate().first()) as
    PaymentRow | undefined;
}

export async function lockByCheckout(
  trx: Knex,
  checkoutId: string,
): Promise<PaymentRow | undefined> {
  return (await trx('payments').where({ checkout_id: checkoutId }).forUpdate().first()) as
    PaymentRow | undefined;
}

export async function insertPayment(
  trx: Knex,
  row: Partial<PaymentRow> &
    Pick<PaymentRow, 'job_id' | 'purpose' | 'method' | 'amount'> & {
      currency: string;
      created_by: string | null;
    },
): Promise<PaymentRow> {
  const [created] = await trx('payments').insert(row).returning('*');
  return created as PaymentRow;
}

export async function updatePayment(
  trx: Knex,
  id: string,
  changes: Record<string, unknown>,
): Promise<PaymentRow> {
  const [row] = await trx('payments').update(changes).where({ id }).returning('*');
  return row as PaymentRow;
}

/** Records an event id; false when it was recorded before (by this or another server). */
export async function recordEvent(
  trx: Knex,
  e: { id: string; type: string; paymentId: string | null },
): Promise<boolean> {
  const rows = await trx('payment_events')
    .insert({ event_id: e.id, type: e.type, payment_id: e.paymentId })
    .onConflict('event_id')
    .ignore()
    .returning('event_id');
  return rows.length === 1;
}

/**
 * What the customer has paid on the job and not had back: the sum of its paid payments (online and
 * at the counter), exact decimal text ("0" when nothing). The invoice and the payments list use it.
 */
export async function paidTotal(jobId: string, k: Knex = db): Promise<string> {
  const row = await k('payments')
    .where({ job_id: jobId, state: 'paid' })
    .first(k.raw('coalesce(sum(amount), 0)::text as paid'));
  return (row?.paid as string | undefined) ?? '0';
}

export interface PayingJob {
  id: string;
  number: string;
  state: string;
}

/** The job, locked the way closing it locks it, so no payment is asked for while it is called off. */
export async function lockPayingJob(trx: Knex, jobId: string): Promise<PayingJob | undefined> {
  return (await trx('jobs')
    .where({ id: jobId })
    .forNoKeyUpdate()
    .first('id', 'number', 'state')) as PayingJob | undefined;
}

export async function findPayingJob(jobId: string, k: Knex = db): Promise<PayingJob | undefined> {
  return (await k('jobs').where({ id: jobId }).first('id', 'number', 'state')) as
    PayingJob | undefined;
}

/** Payment links nobody paid, withdrawn (a called-off job): nothing was taken, so nothing is kept. */
export async function deleteOpenPayments(trx: Knex, ids: string[]): Promise<void> {
  if (ids.length) await trx('payments').whereIn('id', ids).where({ state: 'open' }).delete();
}
