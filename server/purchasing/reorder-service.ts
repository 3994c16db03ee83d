// Reorder rules: a part's own reorder point and order-up-to level, defaults per family and step,
// the list of parts at or below their point, and a suggestion computed from the issue history with
// every figure explained (shared/reorder.ts does the arithmetic).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, NotFound } from '../errors';
import { getSettings } from '../settings/settings-service';
import {
  demandStats,
  economicOrderQuantity,
  reorderPoint,
  ReorderError,
} from '../../shared/reorder';
import type {
  Figure,
  ReorderDefaultInput,
  ReorderDefaultJson,
  ReorderLineJson,
  ReorderListQuery,
  ReorderRuleInput,
  ReorderRuleJson,
  ReorderSuggestionJson,
  ReorderSuggestionQuery,
} from '../../shared/api/purchasing';
import { D, moneyOut } from '../../shared/purchase-money';
import { mean, sampleStandardDeviation } from 'simple-statistics';
import * as repo from './reorder-repository';
import { bestOffer, offersFor, shopToday } from './sourcing-service';
import { formatShopDate } from '../../shared/dates';
import type { Page } from '../../shared/api/common';

/** Used when no supplier offers the part and none is given: an assumption, shown as one. */
export const FALLBACK_LEAD_DAYS = 14;
const DAYS_PER_YEAR = 365;
/**
 * Deliveries needed before a supplier's lead-time spread is trusted; fewer, and the lead time is
 * taken as fixed (common practice, no source: a spread from two or three points is mostly noise).
 */
export const MIN_DELIVERIES_FOR_SPREAD = 5;

function fieldError(field: string, message: string): BadRequest {
  return new BadRequest(`${field}: ${message}`, [{ field, message }]);
}

function ruleJson(row: repo.ReorderPartRow): ReorderRuleJson {
  return {
    partId: row.id,
    reorderPoint: row.reorder_point,
    orderUpTo: row.order_up_to,
    effective: {
      reorderPoint: row.rule_point,
      orderUpTo: row.rule_up_to,
      source: row.rule_source,
    },
  };
}

async function requirePart(partId: string, k: Knex): Promise<repo.ReorderPartRow> {
  const row = await repo.reorderPart(partId, k);
  if (!row) throw new NotFound('That part');
  return row;
}

export async function getRule(partId: string, k: Knex = db): Promise<ReorderRuleJson> {
  return ruleJson(await requirePart(partId, k));
}

export async function setRule(
  actorId: string,
  partId: string,
  input: ReorderRuleInput,
  k: Knex = db,
): Promise<ReorderRuleJson> {
  const part = await requirePart(partId, k);
  if (part.kind === 'kit') {
    throw fieldError(
      'reorderPoint',
      `${part.sku} is a kit: its stock follows its parts; set reorder rules on those`,
    );
  }
  await k.transaction(async (trx) => {
    const before = await repo.lockPart(trx, partId);
    if (!before) throw new NotFound('That part');
    const after = { reorder_point: input.reorderPoint, order_up_to: input.orderUpTo };
    // The trigger on parts checks the new point against the free stock in this transaction.
    await repo.setPartRule(trx, partId, after);
    await recordAudit(trx, {
      userId: actorId,
      action: 'reorder_rule.update',
      entity: 'part',
      entityId: partId,
      before: { reorderPoint: before.reorder_point, orderUpTo: before.order_up_to },
      after: { reorderPoint: input.reorderPoint, orderUpTo: input.orderUpTo },
    });
  });
  return getRule(partId, k);
}

// ---- The reorder list ---------------------------------------------------------------------------

/** What to order to bring free + on order back to the order-up-to level (point + 1 without one). */
export function quantityToOrder(row: repo.ReorderPartRow): number {
  if (row.rule_point === null) return 0;
  const position = row.free + row.on_order;
  if (position > row.rule_point) return 0;
  const target = row.rule_up_to ?? row.rule_point + 1;
  return Math.max(target - position, 1);
}

export function reorderLineJson(row: repo.ReorderPartRow): ReorderLineJson {
  const quantity = quantityToOrder(row);
  return {
    partId: row.id,
    sku: row.sku,
    description: row.description,
    kind: row.kind,
    familyId: row.family_id,
    familyCode: row.family_code,
    stepId: row.step_id,
    stepLabel: row.step_label,
    onHand: row.on_hand,
    held: row.held,
    free: row.free,
    onOrder: row.on_order,
    reorderPoint: row.rule_point,
    orderUpTo: row.rule_up_to,
    ruleSource: row.rule_source,
    low: quantity > 0,
    suggestedQuantity: quantity,
  };
}

export async function listReorder(
  q: ReorderListQuery,
  k: Knex = db,
): Promise<Page<ReorderLineJson>> {
  const { rows, total } = await repo.listReorder(q, k);
  return { items: rows.map(reorderLineJson), total };
}

// ---- The computed suggestion --------------------------------------------------------------------

function round(x: number, places = 2): number {
  const f = 10 ** places;
  return Math.round(x * f) / f;
}

function fig(value: number, how: string): Figure {
  return { value, how };
}

export async function suggestion(
  partId: string,
  q: ReorderSuggestionQuery,
  k: Knex = db,
): Promise<ReorderSuggestionJson> {
  const part = await requirePart(partId, k);
  if (part.kind === 'kit') {
    throw new BadRequest(`${part.sku} is a kit: its demand is the demand of its parts.`);
  }
  const settings = await getSettings(k);
  const today = await shopToday(k);
  const shopDay = (day: string | null) =>
    formatShopDate(day, 'date', { locale: settings.locale, timeZone: settings.timeZone });
  // Whole days only: the window ends where today begins in the shop's time zone.
  const to = today;
  const from = to.minus({ days: q.windowDays });
  const demandWindow = {
    partId,
    from: from.toJSDate(),
    to: to.toJSDate(),
    timeZone: settings.timeZone,
  };
  const issued = await repo.dailyIssues(demandWindow, k);
  const lost = await repo.dailyLostDemand(demandWindow, k);
  // What the shop could not sell was demand too: it counts on the day it was asked for.
  const byDay = new Map(issued.map((d) => [d.day, d.quantity]));
  for (const d of lost) byDay.set(d.day, (byDay.get(d.day) ?? 0) + d.quantity);
  const daily: number[] = [];
  for (let d = from; d < to; d = d.plus({ days: 1 }))
    daily.push(byDay.get(d.toISODate() ?? '') ?? 0);
  const lostTotal = lost.reduce((a, d) => a + d.quantity, 0);
  const total = daily.reduce((a, b) => a + b, 0) - lostTotal;
  const notes: string[] = [];
  if (lostTotal > 0) {
    notes.push(
      `Demand includes ${lostTotal} asked for when none was free and never supplied (lost sales).`,
    );
  }

  let stats;
  try {
    stats = demandStats(daily);
  } catch (e) {
    throw new BadRequest(
      e instanceof ReorderError ? e.message : 'The demand history cannot be read.',
    );
  }

  const offers = await offersFor([partId], { quantity: 1 }, k);
  const { best } = bestOffer(offers, 1, null);
  let leadDays: Figure;
  if (q.leadDays !== undefined) {
    leadDays = fig(q.leadDays, `${q.leadDays} days, as asked.`);
  } else if (best) {
    leadDays = fig(
      best.leadDays,
      `${best.leadDays} days: the lead time of the best offer (${best.supplierName}).`,
    );
  } else if (offers.length > 0) {
    const soonest = Math.min(...offers.map((o) => o.leadDays));
    leadDays = fig(soonest, `${soonest} days: the shortest lead time any supplier quotes.`);
  } else {
    leadDays = fig(
      FALLBACK_LEAD_DAYS,
      `${FALLBACK_LEAD_DAYS} days assumed: no supplier offers this part yet; give the lead time you expect.`,
    );
    notes.push('No supplier offers this part: the lead time is an assumption.');
  }

  // How late the supplier really is: its deliveries' spread, once there are enough of them.
  let sigmaLeadDays: Figure | null = null;
  const deliveries = best ? await repo.deliveryLeadDays(best.supplierId, settings.timeZone, k) : [];
  if (best && deliveries.length >= MIN_DELIVERIES_FOR_SPREAD) {
    const actual = mean(deliveries);
    const spread = sampleStandardDeviation(deliveries);
    if (q.leadDays === undefined) {
      leadDays = fig(
        round(actual, 2),
        `${round(actual, 2)} days: how long ${best.supplierName} actually took, on average over ${deliveries.length} deliveries in the last year (quoted ${best.leadDays}).`,
      );
    }
    sigmaLeadDays = fig(
      round(spread, 4),
      `Sample standard deviation of ${best.supplierName}'s ${deliveries.length} delivery times in the last year = ${round(spread, 4)} days.`,
    );
  } else if (best) {
    notes.push(
      `${best.supplierName} has delivered ${deliveries.length} time(s) in the last year; with fewer than ${MIN_DELIVERIES_FOR_SPREAD}, the lead time is taken as fixed.`,
    );
  }

  const serviceLevel = q.serviceLevel ?? settings.serviceLevel;
  let point;
  try {
    point = reorderPoint({
      meanDaily: stats.mean,
      sigmaDaily: stats.sigma,
      leadDays: leadDays.value,
      sigmaLeadDays: sigmaLeadDays?.value,
      serviceLevel,
    });
  } catch (e) {
    throw new BadRequest(
      e instanceof ReorderError ? e.message : 'The reorder point cannot be computed.',
    );
  }
  const annual = stats.mean * DAYS_PER_YEAR;

  // Holding cost per unit and year = the owner's holding cost rate × what a unit costs us. Without a
  // received cost, the offer's price alone: its shipping is paid once per order, so it belongs to
  // the cost of ordering, not to one unit's price.
  const average = new D(part.average_cost);
  const unitCost = average.gt(0) ? average : best?.priceHome ? new D(best.priceHome) : null;
  const unitCostHow = average.gt(0)
    ? `the moving average cost ${moneyOut(average)} ${settings.homeCurrency}`
    : best?.priceHome
      ? `the best offer's price ${best.priceHome} ${settings.homeCurrency}`
      : null;
  let orderQuantity: Figure | null = null;
  const holdingRate = new D(settings.holdingCostRate || '0');
  const shopOrderCost = new D(settings.orderCost || '0');
  const shipping = best?.shippingHome ? new D(best.shippingHome) : new D(0);
  const orderCost = shopOrderCost.plus(shipping);
  const orderCostHow = shipping.gt(0)
    ? `order cost ${moneyOut(orderCost)} (${moneyOut(shopOrderCost)} to place it + ${best?.supplierName}'s shipping ${moneyOut(shipping)})`
    : `order cost ${moneyOut(orderCost)}`;
  if (unitCost && unitCostHow && holdingRate.gt(0)) {
    const h = holdingRate.times(unitCost);
    const eoq = economicOrderQuantity({
      annualDemand: annual,
      orderCost: orderCost.toNumber(),
      holdingCostPerUnitYear: h.toNumber(),
    });
    orderQuantity = fig(
      eoq.value,
      `√(2 × ${round(annual)} a year × ${orderCostHow} ÷ holding ${moneyOut(h)} a unit a year) = ${round(eoq.exact)}, rounded to ${eoq.value}; holding = rate ${holdingRate.toFixed()} × ${unitCostHow}.`,
    );
  } else {
    notes.push(
      holdingRate.gt(0)
        ? 'No cost is known for this part yet (nothing received, no offer): no order quantity is suggested.'
        : 'The holding cost rate is 0 in the settings: no order quantity is suggested.',
    );
  }
  const upTo = point.value + (orderQuantity?.value ?? 0);

  return {
    partId,
    sku: part.sku,
    window: {
      from: from.toISODate() ?? '',
      to: to.minus({ days: 1 }).toISODate() ?? '',
      days: q.windowDays,
    },
    issued: fig(
      total,
      `${total} issued in the ${q.windowDays} days from ${shopDay(from.toISODate())} to ${shopDay(to.minus({ days: 1 }).toISODate())}.`,
    ),
    lostDemand: fig(
      lostTotal,
      `${lostTotal} asked for in the same days when none was free, and never supplied.`,
    ),
    meanDaily: fig(
      round(stats.mean, 6),
      `${total + lostTotal} ÷ ${q.windowDays} days = ${round(stats.mean, 4)} a day${lostTotal > 0 ? ` (${total} issued + ${lostTotal} lost)` : ''}.`,
    ),
    sigmaDaily: fig(
      round(stats.sigma, 6),
      `Sample standard deviation of the ${q.windowDays} daily totals (days without issues count as 0) = ${round(stats.sigma, 4)}.`,
    ),
    annualDemand: fig(
      round(annual, 2),
      `${round(stats.mean, 4)} a day × ${DAYS_PER_YEAR} = ${round(annual, 2)} a year.`,
    ),
    leadDays,
    sigmaLeadDays,
    serviceLevel: fig(
      serviceLevel,
      `${round(serviceLevel * 100, 1)}%: the chance of not running out while an order is on its way${q.serviceLevel === undefined ? ' (the shop setting)' : ''}.`,
    ),
    z: fig(
      round(point.z, 4),
      `Standard normal z for ${round(serviceLevel * 100, 1)}% = ${round(point.z, 4)}.`,
    ),
    demandOverLead: fig(round(point.demandOverLead, 2), point.explanation[0]),
    safetyStock: fig(round(point.safety, 2), point.explanation[1]),
    reorderPoint: fig(point.value, point.explanation[2]),
    orderQuantity,
    orderUpTo: fig(
      upTo,
      orderQuantity
        ? `Reorder point ${point.value} + order quantity ${orderQuantity.value} = ${upTo}.`
        : `The reorder point ${point.value}, as no order quantity could be computed.`,
    ),
    current: ruleJson(part).effective,
    notes,
  };
}

// ---- Defaults per family and step ---------------------------------------------------------------

function defaultJson(r: repo.DefaultRow): ReorderDefaultJson {
  return {
    id: r.id,
    familyId: r.family_id,
    familyCode: r.family_code,
    stepId: r.step_id,
    stepLabel: r.step_label,
    kind: r.kind,
    reorderPoint: r.reorder_point,
    orderUpTo: r.order_up_to,
    updatedAt: r.updated_at.toISOString(),
  };
}

export async function listDefaults(
  familyId: string | undefined,
  k: Knex = db,
): Promise<{ items: ReorderDefaultJson[]; total: number }> {
  const rows = await repo.listDefaults(familyId, k);
  return { items: rows.map(defaultJson), total: rows.length };
}

export async function setDefault(
  actorId: string,
  input: ReorderDefaultInput,
  k: Knex = db,
): Promise<ReorderDefaultJson> {
  const exists = await repo.stepOfFamily(input.familyId, input.stepId, k);
  if (!exists.family) throw fieldError('familyId', 'no engine family has this id');
  if (!exists.step) throw fieldError('stepId', "not a step of the family's series");
  const id = await k.transaction(async (trx) => {
    const newId = await repo.upsertDefault(trx, {
      family_id: input.familyId,
      step_id: input.stepId,
      kind: input.kind,
      reorder_point: input.reorderPoint,
      order_up_to: input.orderUpTo,
      updated_by: actorId,
    });
    await recordAudit(trx, {
      userId: actorId,
      action: 'reorder_default.set',
      entity: 'reorder_default',
      entityId: newId,
      after: input,
    });
    return newId;
  });
  const row = await repo.findDefault(id, k);
  if (!row) throw new NotFound('The reorder default');
  return defaultJson(row);
}

export async function deleteDefault(actorId: string, id: string, k: Knex = db): Promise<void> {
  await k.transaction(async (trx) => {
    const before = await repo.findDefault(id, trx);
    if (!before || !(await repo.deleteDefault(trx, id))) throw new NotFound('That reorder default');
    await recordAudit(trx, {
      userId: actorId,
      action: 'reorder_default.delete',
      entity: 'reorder_default',
      entityId: id,
      before: defaultJson(before),
    });
  });
}
