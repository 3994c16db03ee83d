// The owner's money figures: what was invoiced each month (labour and parts apart), how estimates
// are answered, who still owes for a job handed back, and the deposits held for jobs not invoiced
// yet. PostgreSQL adds up (money-insights-repository.ts); this file picks the period in the shop's
// time zone and writes the answers' amounts in the currency's decimals.
import Decimal from 'decimal.js';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { fixedMoney, sumMoney } from '../../shared/estimate-math';
import type {
  DepositsHeldAnswer,
  EstimateMonth,
  EstimatesAnswer,
  OutstandingAnswer,
  RevenueAnswer,
  RevenueMonth,
} from '../../shared/api/insights';
import { periodArgs, shopContext } from './insights-service';
import * as repo from './money-insights-repository';

type RevenueAmount = 'labour' | 'parts' | 'other' | 'tax' | 'invoiced' | 'credited';

export async function revenue(
  query: { from?: string; to?: string },
  k: Knex = db,
): Promise<RevenueAnswer> {
  const { period, currency, args } = await periodArgs(query, k);
  const rows = await repo.revenueByMonth(args, k);
  const months: RevenueMonth[] = rows.map((r) => ({
    month: r.month,
    invoices: r.invoices,
    labour: fixedMoney(r.labour, currency),
    parts: fixedMoney(r.parts, currency),
    other: fixedMoney(r.other, currency),
    tax: fixedMoney(r.tax, currency),
    invoiced: fixedMoney(r.invoiced, currency),
    credited: fixedMoney(r.credited, currency),
  }));
  const sum = (f: RevenueAmount) =>
    sumMoney(
      months.map((m) => m[f]),
      currency,
    );
  return {
    months,
    totals: {
      invoices: months.reduce((n, m) => n + m.invoices, 0),
      labour: sum('labour'),
      parts: sum('parts'),
      other: sum('other'),
      tax: sum('tax'),
      invoiced: sum('invoiced'),
      credited: sum('credited'),
    },
    period,
    currency,
  };
}

function rate(approved: number, sent: number): string | null {
  return sent === 0 ? null : new Decimal(approved).dividedBy(sent).toFixed(4);
}

function estimateMonth(r: repo.EstimateMonthDb): Omit<EstimateMonth, 'month'> {
  return {
    sent: r.sent,
    approved: r.approved,
    declined: r.declined,
    waiting: r.waiting,
    approvalRate: rate(r.approved, r.sent),
    medianDaysToApprove: r.median_days,
  };
}

export async function estimates(
  query: { from?: string; to?: string },
  k: Knex = db,
): Promise<EstimatesAnswer> {
  const { period, args } = await periodArgs(query, k);
  const rows = await repo.estimatesByMonth(args, k);
  const whole = rows.find((r) => r.month === null);
  if (!whole) throw new Error('insights: the estimates total row is missing');
  return {
    months: rows
      .filter((r) => r.month !== null)
      .map((r) => ({ month: r.month as string, ...estimateMonth(r) })),
    totals: { ...estimateMonth(whole), approvedWithoutSending: whole.approved_unsent },
    period,
  };
}

function jobNames(r: repo.JobNamesDb) {
  return { jobId: r.job_id, jobNumber: r.job_number, customerName: r.customer_name };
}

export async function outstanding(k: Knex = db): Promise<OutstandingAnswer> {
  const { currency } = await shopContext(k);
  const items = (await repo.outstanding(k)).map((r) => ({
    ...jobNames(r),
    invoiceNumber: r.invoice_number,
    issuedAt: r.issued_at.toISOString(),
    total: fixedMoney(r.total, currency),
    credited: fixedMoney(r.credited, currency),
    paid: fixedMoney(r.paid, currency),
    balance: fixedMoney(r.balance, currency),
    daysOwed: r.days_owed,
  }));
  return {
    items,
    totalBalance: sumMoney(
      items.map((i) => i.balance),
      currency,
    ),
    currency,
  };
}

export async function depositsHeld(k: Knex = db): Promise<DepositsHeldAnswer> {
  const { currency } = await shopContext(k);
  const items = (await repo.depositsHeld(k)).map((r) => ({
    ...jobNames(r),
    jobState: r.job_state,
    amount: fixedMoney(r.amount, currency),
    paidAt: r.paid_at ? r.paid_at.toISOString() : null,
    toGiveBack: r.job_state === 'called_off',
  }));
  return {
    items,
    totalHeld: sumMoney(
      items.map((i) => i.amount),
      currency,
    ),
    currency,
  };
}
