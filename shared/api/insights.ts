// What the insights API accepts and answers: sales by engine family and oversize step, months, top
// sellers, stock value and turnover, dead stock, ABC classes, exposure and supplier reliability.
// The query schemas are used by the server routes and by the Angular pages, so both refuse the same
// input with the same words. Money is exact decimal text ("1234.50"); shares are fractions ("0.8125").
import { DateTime } from 'luxon';
import * as z from '../zod';
import { calendarDay, daysBetween, type PartLineJson } from './common';
import type { NeededPart } from '../part-needs';

/** Longest period one request may cover: ten years of months is already more than any chart shows. */
export const MAX_PERIOD_DAYS = 3660;
export const MAX_MONTHS = 120;

/**
 * The period shown when none is asked for: the last twelve calendar months, from the first day of
 * the month eleven months back to today, in the shop's time zone.
 */
export function defaultPeriod(
  timeZone: string,
  now: Date = new Date(),
): { from: string; to: string } {
  const today = DateTime.fromJSDate(now, { zone: timeZone }).startOf('day');
  return {
    from: today.startOf('month').minus({ months: 11 }).toISODate() as string,
    to: today.toISODate() as string,
  };
}

/** Both ends of a period or neither; the end not before the start; not longer than ten years. */
function checkPeriod(q: { from?: string; to?: string }, ctx: z.core.$RefinementCtx): void {
  if ((q.from === undefined) !== (q.to === undefined)) {
    ctx.addIssue({
      code: 'custom',
      message: 'give both ends of the period (from and to) or neither',
      path: [q.from === undefined ? 'from' : 'to'],
    });
    return;
  }
  if (q.from === undefined || q.to === undefined) return;
  const days = daysBetween(q.from, q.to);
  if (days < 0) {
    ctx.addIssue({
      code: 'custom',
      message: 'the period must not end before it starts',
      path: ['to'],
    });
  } else if (days > MAX_PERIOD_DAYS) {
    ctx.addIssue({
      code: 'custom',
      message: `the period may cover at most ${MAX_PERIOD_DAYS} days`,
      path: ['to'],
    });
  }
}

/** A period of calendar days in the shop's time zone, both ends included; by default the last 12 months. */
const periodShape = { from: z.optional(calendarDay), to: z.optional(calendarDay) };

export const SALES_GROUPS = ['family', 'step'] as const;
export type SalesGroup = (typeof SALES_GROUPS)[number];

/** "family,step" → the set asked for; order and repeats do not matter. */
const byField = z.pipe(
  z.string().check(z.trim()),
  z.transform((text, ctx): SalesGroup[] => {
    const parts = text
      .split(',')
      .map((p) => p.trim())
      .filter(Boolean);
    const bad = parts.filter((p) => !(SALES_GROUPS as readonly string[]).includes(p));
    if (bad.length || parts.length === 0) {
      return z.refuse(ctx, 'must be "family", "step" or "family,step"');
    }
    return SALES_GROUPS.filter((g) => parts.includes(g));
  }),
);

export const salesQuery = z
  .strictObject({ ...periodShape, by: z._default(byField, ['family', 'step']) })
  .check(z.superRefine(checkPeriod));
export type SalesQuery = z.output<typeof salesQuery>;

export const monthlyQuery = z.strictObject(periodShape).check(z.superRefine(checkPeriod));
export type MonthlyQuery = z.output<typeof monthlyQuery>;

export const TOP_SELLER_RANKS = ['units', 'revenue', 'margin'] as const;
export type TopSellerRank = (typeof TOP_SELLER_RANKS)[number];

export const topSellersQuery = z
  .strictObject({
    ...periodShape,
    rank: z._default(
      z.enum(TOP_SELLER_RANKS, { error: 'must be "units", "revenue" or "margin"' }),
      'units',
    ),
    limit: z._default(
      z.coerce
        .number({ error: 'must be a whole number' })
        .check(
          z.int('must be a whole number'),
          z.gte(1, 'must be at least 1'),
          z.lte(100, 'at most 100'),
        ),
      10,
    ),
  })
  .check(z.superRefine(checkPeriod));
export type TopSellersQuery = z.output<typeof topSellersQuery>;

/** How many months back to look (dead stock, ABC, turnover). */
export const monthsQuery = z.strictObject({
  months: z._default(
    z.coerce
      .number({ error: 'must be a whole number of months' })
      .check(
        z.int('must be a whole number of months'),
        z.gte(1, 'must be at least 1 month'),
        z.lte(MAX_MONTHS, `at most ${MAX_MONTHS} months`),
      ),
    12,
  ),
});
export type MonthsQuery = z.output<typeof monthsQuery>;

export const emptyQuery = z.strictObject({});

// ---- answers ----

export interface Period {
  from: string;
  to: string;
  timeZone: string;
}

export interface SalesRow {
  familyId: string | null;
  stepId: string | null;
  familyCode: string | null;
  familyName: string | null;
  stepLabel: string | null;
  /** Position of the step in its series (0 = STD), for ordering; null when not grouped by step. */
  stepPosition: number | null;
  units: number;
  revenue: string;
  margin: string;
}

export interface SalesTotals {
  units: number;
  revenue: string;
  margin: string;
}

export interface SalesAnswer {
  rows: SalesRow[];
  totals: SalesTotals;
  by: SalesGroup[];
  period: Period;
  /** ISO 4217 code of the shop's home currency, in which every amount is given. */
  currency: string;
}

export interface MonthRow {
  /** YYYY-MM in the shop's time zone. */
  month: string;
  units: number;
  revenue: string;
  margin: string;
}

export interface MonthlyAnswer {
  months: MonthRow[];
  period: Period;
  /** ISO 4217 code of the shop's home currency, in which every amount is given. */
  currency: string;
}

export interface TopSeller extends PartLineJson {
  units: number;
  revenue: string;
  margin: string;
}

export interface TopSellersAnswer {
  items: TopSeller[];
  rank: TopSellerRank;
  period: Period;
  /** ISO 4217 code of the shop's home currency, in which every amount is given. */
  currency: string;
}

export interface FamilyStockValue {
  familyId: string | null;
  familyCode: string | null;
  familyName: string | null;
  onHand: number;
  /** On hand at moving average cost. */
  value: string;
  /** Issues at their cost over the window. */
  costOfIssues: string;
  /** Stock value at the start of the window, rebuilt from the ledger. */
  openingValue: string;
  /** Cost of issues ÷ average of opening and closing value; null when nothing was held. */
  turnover: string | null;
  /** Days the stock lasts at the window's pace of issue; null when nothing was issued. */
  daysOfCover: number | null;
}

export interface StockValueAnswer {
  items: FamilyStockValue[];
  totalValue: string;
  totalOnHand: number;
  totalCostOfIssues: string;
  totalTurnover: string | null;
  months: number;
  /** ISO 4217 code of the shop's home currency, in which every amount is given. */
  currency: string;
}

export interface DeadStockItem extends PartLineJson {
  onHand: number;
  /** Value of the free units (on hand less held) at average cost. */
  value: string;
  lastIssuedAt: string | null;
  held: number;
  lastReceivedAt: string | null;
}

export interface DeadStockAnswer {
  items: DeadStockItem[];
  totalValue: string;
  months: number;
  /** Parts counted as dead: not issued since this moment. */
  since: string;
  /** ISO 4217 code of the shop's home currency, in which every amount is given. */
  currency: string;
}

export type AbcClass = 'A' | 'B' | 'C';

export interface AbcItem {
  partId: string;
  value: string;
  share: string;
  class: AbcClass;
  cumulative: string;
  sku: string;
  description: string;
  familyCode: string | null;
  stepLabel: string | null;
  onHand: number;
}

export interface AbcClassSummary {
  class: AbcClass;
  parts: number;
  value: string;
  share: string;
}

export interface AbcAnswer {
  items: AbcItem[];
  classes: AbcClassSummary[];
  totalValue: string;
  months: number;
  /** ISO 4217 code of the shop's home currency, in which every amount is given. */
  currency: string;
}

export interface ExposureItem {
  familyId: string;
  stepId: string;
  timesShort: number;
  jobsWaited: number;
  /** Days jobs spent waiting after these shortages, one decimal (a wait still going counts to now). */
  daysWaited: number;
  familyCode: string;
  familyName: string;
  stepLabel: string;
  stepPosition: number;
  /** Jobs waiting for a part at this step now (the job bench's "waiting for parts" rule). */
  stillWaiting: number;
  /** Which parts ran short here in the period, and which the waiting jobs wait for now. */
  partsShort: NeededPart[];
  waitingFor: NeededPart[];
  lastShortAt: string | null;
}

export interface ExposureAnswer {
  items: ExposureItem[];
  /** Open jobs waiting for parts now, each once: the job bench's "waiting for parts" count. */
  jobsWaitingNow: number;
  months: number;
}

export interface SupplierReliabilityRow {
  supplierId: string;
  supplierName: string;
  ordersReceived: number;
  linesReceived: number;
  /** Average days promised from ordering to arrival. */
  promisedDays: string | null;
  /** Average days it actually took. */
  actualDays: string | null;
  /** Average days late (negative: early). */
  averageDaysLate: string | null;
  /** Share of received lines that arrived on or before the promised day. */
  onTimeShare: string | null;
}

export interface SupplierReliabilityAnswer {
  items: SupplierReliabilityRow[];
  /** False until the shop has received anything against a purchase order (the list is empty). */
  ordersReceived: boolean;
  /** Why the list is empty, or null when it is not. */
  message: string | null;
  months: number;
}

// ---- money (from invoices, estimates and payments) ----

export interface RevenueMonth {
  /** YYYY-MM in the shop's time zone. */
  month: string;
  invoices: number;
  /** Line totals by kind, as invoiced (before tax when the shop's prices exclude it). */
  labour: string;
  parts: string;
  /** Lines staff added by hand, discounts among them. */
  other: string;
  tax: string;
  /** The invoices' totals. */
  invoiced: string;
  /** Credit notes issued in the month (a positive amount taken off). */
  credited: string;
}

export interface RevenueAnswer {
  months: RevenueMonth[];
  totals: Omit<RevenueMonth, 'month'>;
  period: Period;
  currency: string;
}

export interface EstimateMonth {
  /** YYYY-MM of the estimate's first sending, in the shop's time zone. */
  month: string;
  sent: number;
  approved: number;
  declined: number;
  /** Sent and not answered yet (or changed since and waiting for a new answer). */
  waiting: number;
  /** approved ÷ sent, four decimals ("0.7500"); null when nothing was sent. */
  approvalRate: string | null;
  /** Median days from first sending to first approval, one decimal; null when none approved. */
  medianDaysToApprove: string | null;
}

export interface EstimatesAnswer {
  months: EstimateMonth[];
  totals: Omit<EstimateMonth, 'month'> & {
    /** Approved at the counter or by phone without being sent first, in the period. */
    approvedWithoutSending: number;
  };
  period: Period;
}

export interface OutstandingItem {
  jobId: string;
  jobNumber: string;
  customerName: string | null;
  invoiceNumber: string;
  issuedAt: string;
  total: string;
  credited: string;
  paid: string;
  balance: string;
  /** Whole days since the invoice was issued. */
  daysOwed: number;
}

export interface OutstandingAnswer {
  items: OutstandingItem[];
  totalBalance: string;
  currency: string;
}

export interface DepositHeldItem {
  jobId: string;
  jobNumber: string;
  customerName: string | null;
  jobState: string;
  amount: string;
  paidAt: string | null;
  /** The job was called off: the deposit is to be given back. */
  toGiveBack: boolean;
}

export interface DepositsHeldAnswer {
  items: DepositHeldItem[];
  totalHeld: string;
  currency: string;
}
