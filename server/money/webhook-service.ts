// The payment service's events. Each is checked against its signature by the SDK (a bad one is
// refused before anything is read or written) and counted once by its id: the id is recorded in
// the same transaction that marks the payment paid, and a second delivery (or the same event at a
// second server process) finds it recorded and changes nothing.
import type Stripe from 'stripe';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { logger } from '../logger';
import { recordAudit } from '../audit/audit';
import { insertEvent } from '../jobs/jobs-repository';
import { formatMoney } from '../../shared/money';
import { readEvent } from '../payments/payment-client';
import * as repo from './payments-repository';
import { minorUnits, PURPOSE_WORDS } from './payments-json';

const ENDED = 'checkout.session.expired';
const PAID_EVENTS = new Set([
  'checkout.session.completed',
  'checkout.session.async_payment_succeeded',
]);

/**
 * The service ends a checkout nobody paid (after a day, or when asked to): nothing was taken, so
 * the link is withdrawn and staff ask again if the customer still means to pay online.
 */
async function endedUnpaid(trx: Knex, p: repo.PaymentRow): Promise<void> {
  await repo.deleteOpenPayments(trx, [p.id]);
  await insertEvent(trx, {
    jobId: p.job_id,
    userId: null,
    kind: 'system',
    text: `The payment link for ${formatMoney(p.amount, p.currency)} ended unpaid at the payment service; ask again to send a new one.`,
  });
  await recordAudit(trx, {
    userId: null,
    action: 'payment.ended',
    entity: 'job',
    entityId: p.job_id,
    before: { paymentId: p.id, amount: p.amount, state: 'open' },
  });
}

export async function receiveEvent(
  raw: unknown,
  signature: string | undefined,
): Promise<{ received: true; duplicate: boolean }> {
  const event = readEvent(raw, signature);
  const duplicate = await db.transaction(async (trx) => {
    const session =
      PAID_EVENTS.has(event.type) || event.type === ENDED
        ? (event.data.object as Stripe.Checkout.Session)
        : null;
    const p = session?.id ? await repo.lockByCheckout(trx, session.id) : undefined;
    const fresh = await repo.recordEvent(trx, {
      id: event.id,
      type: event.type,
      paymentId: p?.id ?? null,
    });
    if (!fresh) return true;
    if (!session || !p || p.state !== 'open') return false;
    if (event.type === ENDED) {
      await endedUnpaid(trx, p);
      return false;
    }
    if (session.payment_status !== 'paid') return false;
    if (
      session.amount_total !== minorUnits(p.amount, p.currency) ||
      session.currency?.toUpperCase() !== p.currency
    ) {
      logger.warn(
        { paymentId: p.id, event: event.id },
        'payment event does not match the amount asked for; the payment stays open',
      );
      return false;
    }
    const intent =
      typeof session.payment_intent === 'string'
        ? session.payment_intent
        : (session.payment_intent?.id ?? null);
    await repo.updatePayment(trx, p.id, {
      state: 'paid',
      paid_at: trx.fn.now(),
      paid_event: event.id,
      provider_payment: intent,
    });
    await insertEvent(trx, {
      jobId: p.job_id,
      userId: null,
      kind: 'system',
      text: `${PURPOSE_WORDS[p.purpose]} of ${formatMoney(p.amount, p.currency)} paid online.`,
    });
    await recordAudit(trx, {
      userId: null,
      action: 'payment.paid',
      entity: 'job',
      entityId: p.job_id,
      after: { paymentId: p.id, event: event.id, amount: p.amount },
    });
    return false;
  });
  return { received: true, duplicate };
}
