// Giving money back: one payment refunded by staff with a reason, or every paid deposit when the job
// is called off. A payment taken online is refunded through the payment service (one refund per
// payment: a retry after a failure asks the service with the same key, so it never pays out twice);
// one taken at the counter is recorded as handed back at the counter.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { Conflict, NotFound } from '../errors';
import { insertEvent } from '../jobs/jobs-repository';
import { formatMoney } from '../../shared/money';
import type { PaymentJson, RefundInput } from '../../shared/api/money';
import { callPayments } from '../payments/payment-client';
import * as repo from './payments-repository';
import { paymentJson, PURPOSE_WORDS } from './payments-json';

type Conn = Knex;

/** Refunds one paid payment inside the caller's transaction; returns the job event's sentence. */
async function refundRow(
  trx: Conn,
  actorId: string,
  p: repo.PaymentRow,
  reason: string,
): Promise<string> {
  let refundRef: string | null = null;
  if (p.method === 'online') {
    let intent = p.provider_payment;
    if (!intent && p.checkout_id) {
      const checkout = p.checkout_id;
      const session = await callPayments('look up the payment', (sdk) =>
        sdk.checkout.sessions.retrieve(checkout),
      );
      intent =
        typeof session.payment_intent === 'string'
          ? session.payment_intent
          : (session.payment_intent?.id ?? null);
    }
    if (!intent) {
      throw new Conflict(
        'The payment service has no record of this payment being paid; nothing was refunded.',
        'not_paid',
      );
    }
    const paymentIntent = intent;
    const refund = await callPayments('refund the payment', (sdk) =>
      sdk.refunds.create(
        {
          payment_intent: paymentIntent,
          reason: 'requested_by_customer',
          metadata: { paymentId: p.id, jobId: p.job_id },
        },
        { idempotencyKey: `stepstock-refund-${p.id}` },
      ),
    );
    refundRef = refund.id;
  }
  await repo.updatePayment(trx, p.id, {
    state: 'refunded',
    refunded_at: trx.fn.now(),
    refund_reason: reason,
    refund_ref: refundRef,
    refunded_by: actorId,
  });
  await recordAudit(trx, {
    userId: actorId,
    action: 'payment.refund',
    entity: 'job',
    entityId: p.job_id,
    before: { paymentId: p.id, state: p.state },
    after: { state: 'refunded', reason, amount: p.amount, method: p.method },
  });
  const money = formatMoney(p.amount, p.currency);
  return p.method === 'online'
    ? `${PURPOSE_WORDS[p.purpose]} of ${money} refunded through the payment service: ${reason}`
    : `${PURPOSE_WORDS[p.purpose]} of ${money} recorded as handed back at the counter: ${reason}`;
}

export async function refundPayment(
  actorId: string,
  jobId: string,
  paymentId: string,
  input: RefundInput,
  k: Conn = db,
): Promise<PaymentJson> {
  return k.transaction(async (trx) => {
    const job = await repo.lockPayingJob(trx, jobId);
    if (!job) throw new NotFound('That job');
    const p = await repo.lockPayment(trx, jobId, paymentId);
    if (!p) throw new NotFound('That payment');
    if (p.state === 'refunded') {
      throw new Conflict(
        `This payment was already refunded: ${p.refund_reason}`,
        'already_refunded',
      );
    }
    if (p.state === 'open') {
      throw new Conflict(
        'Nothing was paid on this payment link yet, so there is nothing to refund.',
        'not_paid',
      );
    }
    const text = await refundRow(trx, actorId, p, input.reason);
    await insertEvent(trx, { jobId, userId: actorId, kind: 'system', text: `${text}.` });
    return paymentJson((await repo.lockPayment(trx, jobId, paymentId)) as repo.PaymentRow);
  });
}

/**
 * A job being called off (inside its transaction, the job locked): every paid deposit goes back,
 * and payment links nobody paid are ended at the service and withdrawn. Returns what was done, in
 * sentences for the job's history.
 */
export async function settleCalledOff(
  trx: Conn,
  actorId: string,
  job: { id: string; number: string },
): Promise<string[]> {
  const done: string[] = [];
  for (const p of await repo.paymentsOf(job.id, trx)) {
    if (p.state === 'paid' && p.purpose === 'deposit') {
      const locked = (await repo.lockPayment(trx, job.id, p.id)) as repo.PaymentRow;
      done.push(await refundRow(trx, actorId, locked, `job ${job.number} was called off`));
    } else if (p.state === 'open' && p.checkout_id) {
      // Locked first: the service's "ended" event for this link waits for this transaction.
      await repo.lockPayment(trx, job.id, p.id);
      const checkout = p.checkout_id;
      const session = await callPayments('end an unpaid payment link', (sdk) =>
        sdk.checkout.sessions.retrieve(checkout),
      );
      if (session.status === 'open') {
        await callPayments('end an unpaid payment link', (sdk) =>
          sdk.checkout.sessions.expire(checkout),
        );
      }
      if (session.status !== 'complete') {
        await repo.deleteOpenPayments(trx, [p.id]);
        done.push(`Unpaid payment link for ${formatMoney(p.amount, p.currency)} withdrawn`);
      }
    }
  }
  return done;
}
