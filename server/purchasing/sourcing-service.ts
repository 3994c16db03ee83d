// Sourcing: every supplier's offer for a part (or for the pistons of a family's step), landed here
// in the home currency, the best one for a needed-by date, and whether the step is scarce. Also the
// exchange rates the owner keeps.
import type { Knex } from 'knex';
import { DateTime } from 'luxon';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, NotFound } from '../errors';
import { getSettings } from '../settings/settings-service';
import type {
  ExchangeRateJson,
  OfferJson,
  SourcingJson,
  SourcingQuery,
} from '../../shared/api/purchasing';
import { converter, D, moneyOut, type Dec } from '../../shared/purchase-money';
import { waitingItemsFor } from '../suppliers/suppliers-service';
import * as repo from './sourcing-repository';

function fieldError(field: string, message: string): BadRequest {
  return new BadRequest(`${field}: ${message}`, [{ field, message }]);
}

/** Today's date where the shop is. */
export async function shopToday(k: Knex = db): Promise<DateTime> {
  const { timeZone } = await getSettings(k);
  return DateTime.now().setZone(timeZone).startOf('day');
}

export interface OfferOptions {
  quantity: number;
  neededBy?: string | null;
}

/**
 * Offers with landed cost: the price plus this quantity's share of the supplier's shipping cost
 * (shipping ÷ quantity per unit), each converted to the home currency at the owner's rate.
 */
export async function offersFor(
  partIds: string[],
  opts: OfferOptions,
  k: Knex = db,
): Promise<OfferJson[]> {
  const [rows, settings, rates, today] = await Promise.all([
    repo.offersForParts(partIds, k),
    getSettings(k),
    repo.listRates(k),
    shopToday(k),
  ]);
  const home = settings.homeCurrency;
  const toHome = converter(home, rates);
  return rows.map((r) => {
    const price = toHome(r.price, r.currency);
    const shipping = toHome(r.shipping_cost, r.supplier_currency);
    const share = shipping?.dividedBy(opts.quantity) ?? null;
    const landed = price && share ? price.plus(share) : null;
    const missing = [
      ...(price ? [] : [r.currency]),
      ...(shipping ? [] : [r.supplier_currency]),
    ].filter((c, i, all) => all.indexOf(c) === i);
    const landedHow = landed
      ? `${moneyOut(r.price)} ${r.currency}${r.currency === home ? '' : ` = ${moneyOut(price as Dec)} ${home}`}` +
        ` + shipping ${moneyOut(r.shipping_cost)} ${r.supplier_currency} ÷ ${opts.quantity}` +
        ` = ${moneyOut(landed)} ${home}`
      : `No exchange rate for ${missing.join(', ')}: the owner adds it under exchange rates.`;
    const arrivesBy = today.plus({ days: r.lead_days }).toISODate() ?? '';
    return {
      supplierId: r.supplier_id,
      supplierName: r.supplier_name,
      itemId: r.item_id,
      supplierSku: r.supplier_sku,
      partId: r.part_id,
      sku: r.sku,
      price: moneyOut(r.price),
      currency: r.currency,
      landedCost: landed ? moneyOut(landed) : null,
      priceHome: price ? moneyOut(price) : null,
      shippingHome: shipping ? moneyOut(shipping) : null,
      homeCurrency: home,
      landedHow,
      available: r.available,
      leadDays: r.lead_days,
      seenAt: r.seen_at.toISOString(),
      arrivesBy,
      meetsNeededBy: opts.neededBy ? arrivesBy <= opts.neededBy : true,
    };
  });
}

/** An offer can be chosen when it has a landed cost and the supplier does not report none left. */
function canSupply(o: OfferJson, quantity: number): boolean {
  return o.landedCost !== null && (o.available === null || o.available >= quantity);
}

/** The cheapest landed offer that can supply the quantity by the date; ties go to the sooner. */
export function bestOffer(
  offers: OfferJson[],
  quantity: number,
  neededBy: string | null,
): { best: OfferJson | null; how: string } {
  const able = offers.filter((o) => canSupply(o, quantity));
  const inTime = able.filter((o) => o.meetsNeededBy);
  const best =
    [...inTime].sort(
      (a, b) =>
        new D(a.landedCost as string).comparedTo(new D(b.landedCost as string)) ||
        a.leadDays - b.leadDays,
    )[0] ?? null;
  if (offers.length === 0) return { best, how: 'No active supplier offers this.' };
  if (best) {
    return {
      best,
      how:
        `Lowest landed cost among ${inTime.length} of ${offers.length} offers that can supply ${quantity}` +
        (neededBy ? ` and arrive by ${neededBy}` : '') +
        `: ${best.supplierName} at ${best.landedCost} ${best.homeCurrency}.`,
    };
  }
  if (able.length === 0) {
    return {
      best,
      how: `None of the ${offers.length} offers can supply ${quantity} at a known landed cost.`,
    };
  }
  const soonest = [...able].sort((a, b) => a.leadDays - b.leadDays)[0];
  return {
    best,
    how: `No offer arrives by ${neededBy}; the soonest is ${soonest.supplierName}, by ${soonest.arrivesBy}.`,
  };
}

export async function sourcing(q: SourcingQuery, k: Knex = db): Promise<SourcingJson> {
  let parts: repo.SourcedPartRow[];
  let asked: SourcingJson['part'] = null;
  if (q.partId) {
    const part = await repo.partForSourcing(q.partId, k);
    if (!part) throw new NotFound('That part');
    parts = [part];
    asked = {
      id: part.id,
      sku: part.sku,
      description: part.description,
      familyId: part.family_id,
      stepId: part.step_id,
    };
  } else {
    const exists = await repo.familyStepExists(q.familyId as string, q.stepId as string, k);
    if (!exists.family) throw new NotFound('That engine family');
    if (!exists.step) throw fieldError('stepId', "not a step of the family's series");
    parts = await repo.pistonsAtStep(q.familyId as string, q.stepId as string, k);
  }
  const neededBy = q.neededBy ?? null;
  const offers = await offersFor(
    parts.map((p) => p.id),
    { quantity: q.quantity, neededBy },
    k,
  );
  const { best, how } = bestOffer(offers, q.quantity, neededBy);
  const free = parts.reduce((sum, p) => sum + p.free, 0);
  const suppliersOffering = new Set(
    offers.filter((o) => o.available === null || o.available > 0).map((o) => o.supplierId),
  ).size;
  const { homeCurrency } = await getSettings(k);
  // An item nobody has mapped yet may be another offer (or the only one) for these parts.
  const waitingByPart = await waitingItemsFor(
    parts.map((p) => p.id),
    k,
  );
  const waiting = [...waitingByPart.values()]
    .flat()
    .filter((w, i, all) => all.findIndex((x) => x.itemId === w.itemId) === i);
  return {
    part: asked,
    waiting,
    offers,
    best,
    bestHow: how,
    scarce: free === 0 && suppliersOffering <= 1,
    free,
    suppliersOffering,
    homeCurrency,
    neededBy,
    quantity: q.quantity,
  };
}

// ---- Exchange rates -----------------------------------------------------------------------------

function rateJson(r: repo.RateRow, home: string): ExchangeRateJson {
  return {
    currency: r.currency,
    rate: new D(r.rate).toFixed(),
    homeCurrency: home,
    updatedAt: r.updated_at.toISOString(),
    updatedBy: r.updated_by_name,
  };
}

export async function listRates(
  k: Knex = db,
): Promise<{ items: ExchangeRateJson[]; homeCurrency: string }> {
  const [rows, settings] = await Promise.all([repo.listRates(k), getSettings(k)]);
  return {
    items: rows.map((r) => rateJson(r, settings.homeCurrency)),
    homeCurrency: settings.homeCurrency,
  };
}

export async function setRate(
  actorId: string,
  currency: string,
  rate: string,
  k: Knex = db,
): Promise<ExchangeRateJson> {
  const settings = await getSettings(k);
  if (currency === settings.homeCurrency) {
    throw fieldError('currency', `${currency} is the home currency; its rate is always 1`);
  }
  await k.transaction(async (trx) => {
    const before = await repo.findRate(currency, trx);
    await repo.upsertRate(trx, currency, rate, actorId);
    await recordAudit(trx, {
      userId: actorId,
      action: 'exchange_rate.set',
      entity: 'exchange_rate',
      entityId: currency,
      before: before ? { rate: before.rate } : undefined,
      after: { rate, homeCurrency: settings.homeCurrency },
    });
  });
  const row = await repo.findRate(currency, k);
  if (!row) throw new NotFound('The exchange rate');
  return rateJson(row, settings.homeCurrency);
}

export async function deleteRate(actorId: string, currency: string, k: Knex = db): Promise<void> {
  await k.transaction(async (trx) => {
    const before = await repo.findRate(currency, trx);
    if (!before || !(await repo.deleteRate(trx, currency))) {
      throw new NotFound(`An exchange rate for ${currency}`);
    }
    await recordAudit(trx, {
      userId: actorId,
      action: 'exchange_rate.delete',
      entity: 'exchange_rate',
      entityId: currency,
      before: { rate: before.rate },
    });
  });
}
