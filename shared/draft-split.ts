// How a suggested order quantity is shared between suppliers when the best one cannot supply it
// all: a supplier that states its stock is never asked for more than it has, and the rest goes to
// the next cheapest offer, so the draft still adds up to what the reorder list suggested.
import Decimal from 'decimal.js';

/** The parts of an offer the split needs (OfferJson has them all). */
export interface SplittableOffer {
  supplierId: string;
  supplierName: string;
  currency: string;
  price: string;
  /** Landed cost in the home currency; null when no exchange rate is known (cannot be chosen). */
  landedCost: string | null;
  /** What the supplier says it has; null when it does not say. */
  available: number | null;
  leadDays: number;
}

export interface SplitShare<O extends SplittableOffer> {
  offer: O;
  quantity: number;
  /** True when the supplier's stated stock limited this share. */
  capped: boolean;
}

export interface DraftSplit<O extends SplittableOffer> {
  shares: SplitShare<O>[];
  /** What no supplier has said it can supply. */
  uncovered: number;
}

function cheaperFirst(a: SplittableOffer, b: SplittableOffer): number {
  return (
    new Decimal(a.landedCost as string).comparedTo(new Decimal(b.landedCost as string)) ||
    a.leadDays - b.leadDays ||
    a.supplierName.localeCompare(b.supplierName)
  );
}

/**
 * One supplier for the whole quantity when any can supply it (one delivery, one shipping cost):
 * the cheapest landed of those. Otherwise the cheapest first, each up to its stated stock, until
 * the quantity is covered or the offers run out.
 */
export function splitAcrossOffers<O extends SplittableOffer>(
  quantity: number,
  offers: readonly O[],
): DraftSplit<O> {
  if (!Number.isInteger(quantity) || quantity < 0) {
    throw new RangeError(`The quantity must be a whole number of 0 or more, not ${quantity}.`);
  }
  const usable = offers
    .filter((o) => o.landedCost !== null && (o.available === null || o.available > 0))
    .sort(cheaperFirst);
  if (quantity === 0) return { shares: [], uncovered: 0 };
  const whole = usable.find((o) => o.available === null || o.available >= quantity);
  if (whole) return { shares: [{ offer: whole, quantity, capped: false }], uncovered: 0 };
  const shares: SplitShare<O>[] = [];
  let left = quantity;
  for (const offer of usable) {
    if (left === 0) break;
    const take = Math.min(left, offer.available as number);
    shares.push({ offer, quantity: take, capped: true });
    left -= take;
  }
  return { shares, uncovered: left };
}
