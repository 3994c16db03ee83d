// Sharing a suggested order between suppliers. The rule is common practice (no source): never ask a
// supplier for more than it says it has, buy from the cheapest first, and prefer one supplier for
// the whole quantity when one can supply it (one delivery, one shipping charge). Every expected
// share below is worked by hand from the offers written out in the test.
import { splitAcrossOffers, type SplittableOffer } from '../../shared/draft-split';

function offer(
  supplierName: string,
  landedCost: string | null,
  available: number | null,
  leadDays = 5,
): SplittableOffer {
  return {
    supplierId: supplierName.toLowerCase(),
    supplierName,
    currency: 'EUR',
    price: landedCost ?? '10.00',
    landedCost,
    available,
    leadDays,
  };
}

describe('splitting a suggested quantity between suppliers', () => {
  it('when nobody has all 6 and the cheapest says it has 3, then 3 go to it and 3 to the next cheapest', () => {
    const split = splitAcrossOffers(6, [offer('Birch', '33.00', 4), offer('Alder', '30.00', 3)]);
    expect(split.shares.map((s) => [s.offer.supplierName, s.quantity, s.capped])).toEqual([
      ['Alder', 3, true],
      ['Birch', 3, true],
    ]);
    expect(split.uncovered).toBe(0);
  });

  it('when one supplier can supply all 6, then it gets all of them even if a cheaper one has only some', () => {
    const split = splitAcrossOffers(6, [offer('Alder', '30.00', 3), offer('Birch', '33.00', null)]);
    // Birch states no stock limit, so one delivery from Birch covers the 6.
    expect(split.shares.map((s) => [s.offer.supplierName, s.quantity])).toEqual([['Birch', 6]]);
  });

  it('when all suppliers together have 3 + 2 of 8, then 3 are not covered', () => {
    const split = splitAcrossOffers(8, [
      offer('Alder', '30.00', 3),
      offer('Birch', '31.00', 2),
      offer('Cedar', '29.00', 0),
    ]);
    expect(split.shares.map((s) => [s.offer.supplierName, s.quantity])).toEqual([
      ['Alder', 3],
      ['Birch', 2],
    ]);
    expect(split.uncovered).toBe(3);
  });

  it('when an offer has no landed cost (no exchange rate), then it is never chosen', () => {
    const split = splitAcrossOffers(2, [offer('Alder', null, null)]);
    expect(split.shares).toEqual([]);
    expect(split.uncovered).toBe(2);
  });

  it('when two offers cost the same, then the sooner one is taken first', () => {
    const split = splitAcrossOffers(4, [
      offer('Alder', '30.00', 2, 9),
      offer('Birch', '30.00', 2, 3),
    ]);
    expect(split.shares.map((s) => s.offer.supplierName)).toEqual(['Birch', 'Alder']);
  });

  it('when the quantity is not a whole number, then it is refused', () => {
    expect(() => splitAcrossOffers(1.5, [])).toThrow(RangeError);
  });
});
