// Drafts from the reorder list: each low part's suggested quantity at the cheapest supplier that
// can supply it, split between suppliers when the best states less stock, and explained.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type {
  DraftAdjustmentJson,
  DraftsInput,
  DraftsJson,
  OfferJson,
  OrderInput,
  OrderJson,
} from '../../shared/api/purchasing';
import { splitAcrossOffers, type DraftSplit } from '../../shared/draft-split';
import { waitingItemsFor } from '../suppliers/suppliers-service';
import { getOrder, insertOrderWithLines } from './orders-service';
import * as repo from './orders-repository';
import { lowParts } from './reorder-repository';
import { quantityToOrder } from './reorder-service';
import { offersFor } from './sourcing-service';

/**
 * Drafts from the reorder list: every low part (or the ones named) with the quantity that brings
 * it back to its order-up-to level, at the best supplier's price, one draft per supplier and
 * currency. A supplier that states less stock than that gets only what it has, and the rest goes
 * to the next cheapest offer; each such part is explained. Parts already on a draft are left out;
 * parts nobody offers are listed as unsourced, with the unmapped items that might be them.
 */
export async function draftFromSuggestions(
  actorId: string,
  input: DraftsInput,
  k: Knex = db,
): Promise<DraftsJson> {
  const low = await lowParts({ partIds: input.partIds, familyId: input.familyId }, k);
  const drafted = await repo.partsOnDrafts(
    low.map((p) => p.id),
    k,
  );
  const groups = new Map<
    string,
    { supplierId: string; currency: string; lines: OrderInput['lines'] }
  >();
  const unsourcedParts: { partId: string; sku: string; quantity: number }[] = [];
  const splits: { partId: string; sku: string; suggested: number; split: DraftSplit<OfferJson> }[] =
    [];
  for (const part of low) {
    if (drafted.has(part.id)) continue;
    const quantity = quantityToOrder(part);
    if (quantity <= 0) continue;
    const offers = await offersFor([part.id], { quantity }, k);
    const split = splitAcrossOffers(quantity, offers);
    if (split.shares.length === 0) {
      unsourcedParts.push({ partId: part.id, sku: part.sku, quantity });
      continue;
    }
    if (split.shares.length > 1 || split.uncovered > 0) {
      splits.push({ partId: part.id, sku: part.sku, suggested: quantity, split });
    }
    for (const share of split.shares) {
      const key = groupKey(share.offer);
      const group = groups.get(key) ?? {
        supplierId: share.offer.supplierId,
        currency: share.offer.currency,
        lines: [],
      };
      group.lines.push({
        partId: part.id,
        quantity: share.quantity,
        unitPrice: share.offer.price,
      });
      groups.set(key, group);
    }
  }
  const created = await k.transaction(async (trx) => {
    const ids = new Map<string, string>();
    for (const [key, g] of groups) {
      const supplier = await repo.findSupplier(g.supplierId, trx);
      if (!supplier) continue;
      ids.set(
        key,
        await insertOrderWithLines(
          trx,
          actorId,
          supplier,
          { lines: g.lines, currency: g.currency },
          'purchase_order.draft_from_suggestions',
        ),
      );
    }
    return ids;
  });
  const orders: OrderJson[] = [];
  const byKey = new Map<string, OrderJson>();
  for (const [key, id] of created) {
    const order = await getOrder(id, k);
    orders.push(order);
    byKey.set(key, order);
  }
  const adjusted = splits.map(({ partId, sku, suggested, split }) =>
    adjustmentJson(partId, sku, suggested, split, byKey),
  );
  const waiting = await waitingItemsFor(
    unsourcedParts.map((u) => u.partId),
    k,
  );
  const unsourced = unsourcedParts.map((u) => ({ ...u, waiting: waiting.get(u.partId) ?? [] }));
  return { orders, adjusted, unsourced };
}

function groupKey(o: { supplierId: string; currency: string }): string {
  return `${o.supplierId}:${o.currency}`;
}

/** "Suggested 6: Alder has 3 in stock, so 3 from Alder (PO-…) and 3 from Birch (PO-…)." */
function adjustmentJson(
  partId: string,
  sku: string,
  suggested: number,
  split: DraftSplit<OfferJson>,
  orders: Map<string, OrderJson>,
): DraftAdjustmentJson {
  const shares = split.shares.map((s) => {
    const order = orders.get(groupKey(s.offer));
    return {
      supplierId: s.offer.supplierId,
      supplierName: s.offer.supplierName,
      orderId: order?.id ?? '',
      orderNumber: order?.number ?? '',
      quantity: s.quantity,
      available: s.offer.available,
    };
  });
  const stated = split.shares
    .filter((s) => s.capped)
    .map((s) => `${s.offer.supplierName} says it has ${s.offer.available}`);
  const parts = shares.map(
    (s) => `${s.quantity} from ${s.supplierName}${s.orderNumber ? ` (${s.orderNumber})` : ''}`,
  );
  const rest =
    split.uncovered > 0
      ? `; ${split.uncovered} not covered: no other supplier says it has more, so order them by hand or wait for a newer price list`
      : '';
  return {
    partId,
    sku,
    suggested,
    shares,
    uncovered: split.uncovered,
    why: `Suggested ${suggested}, but ${stated.join(' and ')}: ${parts.join(' and ')}${rest}.`,
  };
}
