// Insights for the owner and the buyer: what sells, what sits, where the shop ran short and which
// suppliers keep their word. PostgreSQL computes every figure (insights-repository.ts); this file
// picks the period in the shop's time zone and shapes the answers.
import type { Knex } from 'knex';
import { DateTime, IANAZone } from 'luxon';
import { db } from '../db/knex';
import { logger } from '../logger';
import { getSettings } from '../settings/settings-service';
import { BadRequest } from '../errors';
import { defaultPeriod } from '../../shared/api/insights';
import type {
  AbcAnswer,
  AbcClass,
  DeadStockAnswer,
  ExposureAnswer,
  MonthlyAnswer,
  Period,
  SalesAnswer,
  SalesGroup,
  StockValueAnswer,
  SupplierReliabilityAnswer,
  TopSellersAnswer,
  TopSellerRank,
} from '../../shared/api/insights';
import * as repo from './insights-repository';
import * as shortages from './shortages-repository';
import type { NeededPart } from '../../shared/part-needs';

/** NUMERIC text as the API writes money: at least the cents, no trailing zeros past them. */
export function moneyOut(value: string | null | undefined): string {
  if (value === null || value === undefined) return '0.00';
  const [whole, fraction = ''] = value.split('.');
  const trimmed = fraction.replace(/0+$/, '');
  const out = `${whole}.${trimmed.padEnd(2, '0')}`;
  return /^-0\.0+$/.test(out) ? out.slice(1) : out;
}

function iso(value: Date | null | undefined): string | null {
  return value ? value.toISOString() : null;
}

function salesSums(r: repo.SalesSumsDb) {
  return { units: Number(r.units), revenue: moneyOut(r.revenue), margin: moneyOut(r.margin) };
}

function partNames(r: repo.PartNamesDb) {
  return {
    sku: r.sku,
    description: r.description,
    kind: r.kind,
    familyId: r.family_id,
    familyCode: r.family_code,
    stepId: r.step_id,
    stepLabel: r.step_label,
  };
}

/**
 * The shop's time zone and home currency. An unknown zone in the settings falls back to UTC rather
 * than failing every page.
 */
export async function shopContext(k: Knex = db): Promise<{ timeZone: string; currency: string }> {
  const settings = await getSettings(k);
  const zone = settings.timeZone;
  if (IANAZone.isValidZone(zone)) return { timeZone: zone, currency: settings.homeCurrency };
  logger.warn({ zone }, 'insights: the shop time zone is not known; using UTC');
  return { timeZone: 'UTC', currency: settings.homeCurrency };
}

/** The period asked for, or by default the last twelve calendar months up to today. */
export function resolvePeriod(query: { from?: string; to?: string }, timeZone: string): Period {
  if (query.from && query.to) return { from: query.from, to: query.to, timeZone };
  return { ...defaultPeriod(timeZone), timeZone };
}

/** The period asked for, the shop's currency, and the period as the repositories take it. */
export async function periodArgs(query: { from?: string; to?: string }, k: Knex) {
  const shop = await shopContext(k);
  const period = resolvePeriod(query, shop.timeZone);
  return {
    period,
    currency: shop.currency,
    args: { fromDay: period.from, toDay: period.to, tz: period.timeZone },
  };
}

export async function sales(
  query: { from?: string; to?: string; by: SalesGroup[] },
  k: Knex = db,
): Promise<SalesAnswer> {
  const { period, currency, args } = await periodArgs(query, k);
  const rows = await repo.salesBy(
    { ...args, byFamily: query.by.includes('family'), byStep: query.by.includes('step') },
    k,
  );
  const grand = rows.find((r) => r.grand === 1);
  if (!grand) throw new Error('insights: the sales total row is missing');
  return {
    rows: rows
      .filter((r) => r.grand === 0)
      .map((r) => ({
        familyId: r.family_id,
        stepId: r.step_id,
        familyCode: r.family_code,
        familyName: r.family_name,
        stepLabel: r.step_label,
        stepPosition: r.step_position,
        ...salesSums(r),
      })),
    totals: salesSums(grand),
    by: query.by,
    period,
    currency,
  };
}

export async function monthly(
  query: { from?: string; to?: string },
  k: Knex = db,
): Promise<MonthlyAnswer> {
  const { period, currency, args } = await periodArgs(query, k);
  const rows = await repo.salesByMonth(args, k);
  return {
    months: rows.map((r) => ({ month: r.month, ...salesSums(r) })),
    period,
    currency,
  };
}

export async function topSellers(
  query: { from?: string; to?: string; rank: TopSellerRank; limit: number },
  k: Knex = db,
): Promise<TopSellersAnswer> {
  const { period, currency, args } = await periodArgs(query, k);
  const rows = await repo.topSellers({ ...args, rank: query.rank, limit: query.limit }, k);
  return {
    items: rows.map((r) => ({ partId: r.part_id, ...partNames(r), ...salesSums(r) })),
    rank: query.rank,
    period,
    currency,
  };
}

export async function stockValue(months: number, k: Knex = db): Promise<StockValueAnswer> {
  const [rows, { currency }] = await Promise.all([repo.stockValue(months, k), shopContext(k)]);
  const grand = rows.find((r) => r.grand === 1);
  if (!grand) throw new Error('insights: the stock value total row is missing');
  return {
    items: rows
      .filter((r) => r.grand === 0)
      .map((r) => ({
        familyId: r.family_id,
        familyCode: r.family_code,
        familyName: r.family_name,
        onHand: Number(r.on_hand),
        value: moneyOut(r.value),
        costOfIssues: moneyOut(r.cost_of_issues),
        openingValue: moneyOut(r.opening_value),
        turnover: r.turnover,
        daysOfCover: r.days_of_cover,
      })),
    totalValue: moneyOut(grand.value),
    totalOnHand: Number(grand.on_hand),
    totalCostOfIssues: moneyOut(grand.cost_of_issues),
    totalTurnover: grand.turnover,
    months,
    currency,
  };
}

export async function deadStock(months: number, k: Knex = db): Promise<DeadStockAnswer> {
  const [rows, { currency }] = await Promise.all([repo.deadStock(months, k), shopContext(k)]);
  const since = rows[0]?.since;
  if (!since) throw new Error('insights: the dead-stock cut-off is missing');
  const items = rows.filter((r) => r.part_id !== null);
  return {
    items: items.map((r) => ({
      partId: r.part_id as string,
      onHand: r.on_hand,
      value: moneyOut(r.value),
      lastIssuedAt: iso(r.last_issued_at),
      ...partNames(r),
      held: r.held,
      lastReceivedAt: iso(r.last_received_at),
    })),
    totalValue: moneyOut(items[0]?.total_value ?? '0'),
    months,
    since: since.toISOString(),
    currency,
  };
}

export async function abc(months: number, k: Knex = db): Promise<AbcAnswer> {
  // The last `months` months as whole days in the shop's zone, today included.
  const { timeZone, currency } = await shopContext(k);
  const today = DateTime.now().setZone(timeZone);
  const rows = await repo.abc(
    {
      fromDay: today.minus({ months }).plus({ days: 1 }).toISODate() as string,
      toDay: today.toISODate() as string,
      tz: timeZone,
    },
    k,
  );
  const classes = (['A', 'B', 'C'] as AbcClass[]).map((cls) => {
    const first = rows.find((r) => r.class === cls);
    return {
      class: cls,
      parts: first?.class_parts ?? 0,
      value: moneyOut(first?.class_value ?? '0'),
      share: first?.class_share ?? '0.0000',
    };
  });
  return {
    items: rows.map((r) => ({
      partId: r.part_id,
      value: moneyOut(r.value),
      share: r.share,
      class: r.class,
      cumulative: r.cumulative,
      sku: r.sku,
      description: r.description,
      familyCode: r.family_code,
      stepLabel: r.step_label,
      onHand: r.on_hand,
    })),
    classes,
    totalValue: moneyOut(rows[0]?.total_value ?? '0'),
    months,
    currency,
  };
}

export async function exposure(months: number, k: Knex = db): Promise<ExposureAnswer> {
  const [rows, jobsWaitingNow] = await Promise.all([
    shortages.exposure(months, k),
    shortages.jobsWaitingNow(k),
  ]);
  return {
    items: rows.map((r) => ({
      familyId: r.family_id,
      stepId: r.step_id,
      timesShort: r.times_short,
      jobsWaited: r.jobs_waited,
      daysWaited: Number(r.days_waited),
      familyCode: r.family_code,
      familyName: r.family_name,
      stepLabel: r.step_label,
      stepPosition: r.step_position,
      stillWaiting: r.still_waiting,
      partsShort: r.parts_short,
      waitingFor: r.waiting_for,
      lastShortAt: iso(r.last_short_at),
    })),
    jobsWaitingNow,
    months,
  };
}

export async function supplierReliability(
  months: number,
  k: Knex = db,
): Promise<SupplierReliabilityAnswer> {
  const { timeZone } = await shopContext(k);
  const { rows, anyEver } = await repo.supplierReliability({ months, tz: timeZone }, k);
  return {
    items: rows.map((r) => ({
      supplierId: r.supplier_id,
      supplierName: r.supplier_name,
      ordersReceived: r.orders_received,
      linesReceived: r.lines_received,
      promisedDays: r.promised_days,
      actualDays: r.actual_days,
      averageDaysLate: r.average_days_late,
      onTimeShare: r.on_time_share,
    })),
    ordersReceived: anyEver,
    message: !anyEver
      ? 'No orders received yet: once a delivery is taken in against a purchase order, its promised and actual lead times show here.'
      : rows.length === 0
        ? `Nothing was received against a purchase order in the last ${months} months.`
        : null,
    months,
  };
}

export interface ShortageInput {
  familyId: string;
  stepId: string;
  jobId?: string | null;
  cylinder?: number | null;
  /** hold: a hold was refused because nothing was free; counter: asked for at the counter. */
  source: 'hold' | 'counter';
  /** What was not free: a piston (the default) or a ring set. */
  part?: NeededPart;
  userId?: string | null;
}

/**
 * Notes that a piston or a ring set was needed at a step and none was free. Call it from a refused hold or a
 * counter enquiry, outside the transaction that failed (so the note survives the rollback).
 * Choosing a cylinder's step is noted by the database itself. Returns false when this job's
 * cylinder was already noted short at that step.
 */
export async function recordShortage(input: ShortageInput, k: Knex = db): Promise<boolean> {
  if (input.cylinder !== undefined && input.cylinder !== null && !input.jobId) {
    throw new BadRequest('A cylinder number needs the job it belongs to.');
  }
  return shortages.insertShortage(
    {
      family_id: input.familyId,
      step_id: input.stepId,
      job_id: input.jobId ?? null,
      cylinder: input.cylinder ?? null,
      source: input.source,
      part: input.part ?? 'piston',
      user_id: input.userId ?? null,
    },
    k,
  );
}
