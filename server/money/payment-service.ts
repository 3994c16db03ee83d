// Asking for money and taking it: a payment link for a deposit or for what is left (a checkout on
// the hosted payment service, e-mailed to the customer and shown on their page), and payments
// taken at the counter. The link becomes paid only from the service's signed event
// (webhook-service.ts). Amounts are exact decimals in the shop's currency.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { faultPoint } from '../testing-faults';
import { config } from '../config';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import { enqueueMail } from '../mail/outbox';
import { appLink } from '../mail/mail-layout';
import { insertEvent } from '../jobs/jobs-repository';
import { formatMoney, currencyDecimals } from '../../shared/money';
import { compareMoney, minusMoney, percentOf, sumMoney } from '../../shared/estimate-math';
import type {
  CounterPaymentInput,
  PaymentJson,
  PaymentRequestInput,
  PaymentsJson,
} from '../../shared/api/money';
import { getSettings } from '../settings/settings-service';
import { isOpenState } from '../../shared/api/jobs';
import { callPayments } from '../payments/payment-client';
import * as repo from './payments-repository';
import { minorUnits, paymentJson, PURPOSE_WORDS } from './payments-json';
import * as estimates from './estimate-repository';
import { estimateJson } from './estimate-json';
import { syncProposal } from './estimate-service';
import { findInvoiceOfJob } from './invoice-repository';
import { getInvoice } from './invoice-service';
import { customerContact } from './customer-contact';
import { paymentRequestMail } from './payment-mail';
import { newPublicLink, publicPath } from './public-links';
import type { ShopSettings } from '../../shared/settings-schema';

type Conn = Knex;

async function lockedJob(trx: Conn, jobId: string): Promise<repo.PayingJob> {
  const job = await repo.lockPayingJob(trx, jobId);
  if (!job) throw new NotFound('That job');
  if (job.state === 'called_off') {
    throw new Conflict(
      `Job ${job.number} was called off: no payment is taken for it.`,
      'job_closed',
    );
  }
  return job;
}

/**
 * What the job costs: once handed back, its invoice; before, its estimate's total as the job page
 * shows it (an open job's draft first takes in what changed on the job, as reading it does).
 */
async function jobTotal(trx: Conn, job: repo.PayingJob, settings: ShopSettings): Promise<string> {
  if (await findInvoiceOfJob(job.id, trx)) {
    // Handed back: what the invoice asks for, less what credit notes took off it.
    const invoice = await getInvoice(job.id, trx);
    return minusMoney(invoice.total, invoice.credited, invoice.currency);
  }
  if (!isOpenState(job.state)) {
    const est = await estimates.findEstimate(job.id, trx);
    const lines = est ? await estimates.linesOf(job.id, trx) : [];
    return estimateJson(est ?? null, lines, settings).total;
  }
  const est = await estimates.lockEstimate(trx, job.id);
  await syncProposal(trx, job.id, est, settings);
  return estimateJson(est, await estimates.linesOf(job.id, trx), settings).total;
}

/** The job's sums: what it costs, what is paid, and what open links already ask for. */
async function sums(trx: Conn, jobId: string, currency: string, total: string) {
  const rows = await repo.paymentsOf(jobId, trx);
  const paid = sumMoney(
    rows.filter((p) => p.state === 'paid').map((p) => p.amount),
    currency,
  );
  const asked = sumMoney(
    rows.filter((p) => p.state === 'open').map((p) => p.amount),
    currency,
  );
  return { total, paid, asked, owed: minusMoney(total, paid, currency) };
}

/** One transaction on a job that takes money: it locked, its sums, the shop's settings. */
async function payingJob<T>(
  k: Conn,
  jobId: string,
  work: (c: {
    trx: Conn;
    job: repo.PayingJob;
    settings: ShopSettings;
    currency: string;
    s: Awaited<ReturnType<typeof sums>>;
    money: (v: string) => string;
  }) => Promise<T>,
): Promise<T> {
  const settings = await getSettings(k);
  const currency = settings.homeCurrency;
  return k.transaction(async (trx) => {
    const job = await lockedJob(trx, jobId);
    const s = await sums(trx, jobId, currency, await jobTotal(trx, job, settings));
    const money = (v: string) => formatMoney(v, currency);
    return work({ trx, job, settings, currency, s, money });
  });
}

function amountRefused(message: string): BadRequest {
  return new BadRequest(`amount: ${message}`, [{ field: 'amount', message }], 'bad_amount');
}

/** The amount in cents (the currency's minor unit); refused with more decimals than it has. */
function centsOf(amount: string, currency: string): number {
  const minor = minorUnits(amount, currency);
  if (minor === null) {
    throw amountRefused(`has more decimals than ${currency} uses (${currencyDecimals(currency)})`);
  }
  return minor;
}

export async function listPayments(jobId: string, k: Conn = db): Promise<PaymentsJson> {
  const settings = await getSettings(k);
  const currency = settings.homeCurrency;
  return k.transaction(async (trx) => {
    const job = await repo.findPayingJob(jobId, trx);
    if (!job) throw new NotFound('That job');
    const rows = await repo.paymentsOf(jobId, trx);
    const total = await jobTotal(trx, job, settings);
    const paid = sumMoney([await repo.paidTotal(jobId, trx)], currency);
    return {
      items: rows.map(paymentJson),
      paid,
      balance: minusMoney(total, paid, currency),
      currency,
    };
  });
}

/** A payment link for a deposit (default: the shop's percent of the total) or for what is left. */
export async function requestPayment(
  actorId: string,
  jobId: string,
  input: PaymentRequestInput,
  k: Conn = db,
): Promise<PaymentJson> {
  let opened: string | null = null;
  try {
    return await askFor(k, jobId, actorId, input, (id) => (opened = id));
  } catch (e) {
    // The link was opened but nothing here was kept: end it, so it cannot be paid.
    const checkout = opened as string | null;
    if (checkout) {
      await callPayments('end a payment link', (sdk) =>
        sdk.checkout.sessions.expire(checkout),
      ).catch(() => undefined);
    }
    throw e;
  }
}

async function askFor(
  k: Conn,
  jobId: string,
  actorId: string,
  input: PaymentRequestInput,
  opened: (checkoutId: string) => void,
): Promise<PaymentJson> {
  return payingJob(k, jobId, async ({ trx, job, settings, currency, s, money }) => {
    if (compareMoney(s.total, '0') <= 0) {
      throw new Conflict(
        `The estimate of job ${job.number} comes to nothing yet: price the job before asking for money.`,
        'nothing_to_pay',
      );
    }
    const left = minusMoney(s.owed, s.asked, currency);
    let amount: string;
    if (input.purpose === 'deposit') {
      amount = input.amount ?? percentOf(s.total, settings.depositPercent, currency);
      if (compareMoney(amount, s.total) > 0) {
        throw amountRefused(
          `a deposit of ${money(amount)} is larger than the estimate's total of ${money(s.total)}`,
        );
      }
    } else {
      amount = input.amount ?? left;
    }
    if (compareMoney(left, '0') <= 0 && input.amount === undefined) {
      throw new Conflict(
        `Nothing is left to ask for on job ${job.number}: ${money(s.paid)} is paid and ${money(s.asked)} is asked for in open payment links, of ${money(s.total)}.`,
        'nothing_to_pay',
      );
    }
    if (compareMoney(amount, left) > 0) {
      throw amountRefused(
        `${money(amount)} is more than the ${money(left)} still to ask for on job ${job.number} (total ${money(s.total)}, paid ${money(s.paid)}, in open links ${money(s.asked)})`,
      );
    }
    if (compareMoney(amount, '0') <= 0) throw amountRefused('must be more than 0');
    const unitAmount = centsOf(amount, currency);
    const token = await newPublicLink(trx, jobId);
    const pagePath = publicPath(token);
    const session = await callPayments('open a payment link', (sdk) =>
      sdk.checkout.sessions.create({
        mode: 'payment',
        success_url: appLink(config.appUrl, pagePath),
        client_reference_id: jobId,
        metadata: { jobId, purpose: input.purpose },
        line_items: [
          {
            quantity: 1,
            price_data: {
              currency: currency.toLowerCase(),
              unit_amount: unitAmount,
              product_data: {
                name: `${PURPOSE_WORDS[input.purpose]}, job ${job.number}`,
                description: settings.shopName,
              },
            },
          },
        ],
      }),
    );
    opened(session.id);
    faultPoint('payments.request.after-checkout');
    if (!session.url) {
      throw new Conflict('The payment service opened no payment page.', 'payment_service');
    }
    const row = await repo.insertPayment(trx, {
      job_id: jobId,
      purpose: input.purpose,
      method: 'online',
      amount,
      currency,
      state: 'open',
      checkout_id: session.id,
      url: session.url,
      created_by: actorId,
    });
    const contact = await customerContact(jobId, trx);
    if (contact?.email) {
      const mail = paymentRequestMail({
        shopName: settings.shopName,
        shopHours: settings.shopHours,
        customerName: contact.name,
        jobNumber: job.number,
        purpose: input.purpose,
        amount,
        currency,
        payUrl: session.url,
        pagePath,
      });
      await enqueueMail(trx, { to: contact.email, ...mail });
    }
    await insertEvent(trx, {
      jobId,
      userId: actorId,
      kind: 'system',
      text: `${PURPOSE_WORDS[input.purpose]} of ${money(amount)} asked for online${contact?.email ? `; the link went to ${contact.email}` : ' (no customer e-mail: the link shows on the job page)'}.`,
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'payment.request',
      entity: 'job',
      entityId: jobId,
      after: { paymentId: row.id, purpose: input.purpose, amount, currency },
    });
    return paymentJson(row);
  });
}

/** Money taken at the counter: cash, card on the shop's own terminal, or a bank transfer seen. */
export async function recordCounterPayment(
  actorId: string,
  jobId: string,
  input: CounterPaymentInput,
  k: Conn = db,
): Promise<PaymentJson> {
  return payingJob(k, jobId, async ({ trx, job, currency, s, money }) => {
    centsOf(input.amount, currency);
    if (compareMoney(input.amount, s.owed) > 0) {
      throw amountRefused(
        `${money(input.amount)} is more than the ${money(s.owed)} still owed on job ${job.number} (total ${money(s.total)}, paid ${money(s.paid)})`,
      );
    }
    const finished = job.state === 'ready_to_go' || job.state === 'handed_back';
    const purpose =
      input.purpose ??
      (finished || compareMoney(input.amount, s.owed) === 0 ? 'balance' : 'deposit');
    const row = await repo.insertPayment(trx, {
      job_id: jobId,
      purpose,
      method: input.method,
      amount: input.amount,
      currency,
      state: 'paid',
      paid_at: new Date(),
      created_by: actorId,
    });
    await insertEvent(trx, {
      jobId,
      userId: actorId,
      kind: 'system',
      text: `${PURPOSE_WORDS[purpose]} of ${money(input.amount)} taken at the counter (${input.method === 'card' ? 'card' : input.method === 'cash' ? 'cash' : 'bank transfer'}).`,
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'payment.counter',
      entity: 'job',
      entityId: jobId,
      after: { paymentId: row.id, purpose, method: input.method, amount: input.amount, currency },
    });
    return paymentJson(row);
  });
}
