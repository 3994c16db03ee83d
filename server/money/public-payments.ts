// The payments the customer sees on the public page: what was asked for, whether it is paid, and
// the hosted pay page's address while it is open.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { PublicPaymentJson } from '../../shared/api/money';
import { fixedMoney } from '../../shared/estimate-math';
import { paymentsOf } from './payments-repository';

export async function publicPayments(
  jobId: string,
  currency: string,
  k: Knex = db,
): Promise<PublicPaymentJson[]> {
  return (await paymentsOf(jobId, k)).map((p) => ({
    purpose: p.purpose,
    amount: fixedMoney(p.amount, p.currency || currency),
    state: p.state,
    url: p.state === 'open' ? p.url : null,
  }));
}
