// The numbers purchasing relies on, checked against outside sources: the economic order quantity
// against a textbook's worked example, z for a service level against simple-statistics' table of the
// standard normal distribution, a reorder point worked by hand, and exact money for landed costs.
import { cumulativeStdNormalProbability, probit } from 'simple-statistics';
import { economicOrderQuantity, reorderPoint, zForServiceLevel } from '../../shared/reorder';
import { converter, D, moneyOut } from '../../shared/purchase-money';

describe('economic order quantity', () => {
  it('when D = 1,000 a year, S = 10 an order and H = 0.50 a unit-year, then Q* = 200 (textbook example)', () => {
    // Heizer & Render, Operations Management, chapter "Inventory Management", Example 3:
    // Q* = √(2 × 1,000 × 10 / 0.50) = √40,000 = 200 units.
    expect(
      economicOrderQuantity({ annualDemand: 1000, orderCost: 10, holdingCostPerUnitYear: 0.5 })
        .value,
    ).toBe(200);
  });

  it('when the same example has D = 1,200, then Q* = 219 (the book\u2019s learning exercise)', () => {
    // Same source, learning exercise after Example 3: √(2 × 1,200 × 10 / 0.50) = √48,000 = 219.09 → 219.
    const eoq = economicOrderQuantity({
      annualDemand: 1200,
      orderCost: 10,
      holdingCostPerUnitYear: 0.5,
    });
    expect(eoq.exact).toBeCloseTo(219.089, 3);
    expect(eoq.value).toBe(219);
  });
});

describe('z for a service level', () => {
  it.each([
    [0.9, 1.2816],
    [0.95, 1.6449],
    [0.99, 2.3263],
  ])('when the service level is %s, then z is %s as in a standard normal table', (p, table) => {
    // Standard normal table, upper-tail quantiles z(0.90) = 1.2816, z(0.95) = 1.6449, z(0.99) = 2.3263.
    expect(zForServiceLevel(p)).toBeCloseTo(table, 4);
  });

  it.each([0.9, 0.95, 0.99])(
    'when z for %s is looked up in simple-statistics\u2019 standard normal table, then it gives back the service level',
    (p) => {
      // simple-statistics' cumulativeStdNormalProbability reads a printed-style table (4 decimals).
      expect(cumulativeStdNormalProbability(zForServiceLevel(p))).toBeCloseTo(p, 3);
      // And its probit (a closed-form approximation) agrees to within its own accuracy.
      expect(Math.abs(zForServiceLevel(p) - probit(p))).toBeLessThan(0.006);
    },
  );
});

describe('reorder point worked by hand', () => {
  it('when demand is 0.8 a day with σ 1.1, the lead time 16 days and the service level 90%, then the point is 19', () => {
    // By hand: demand over the lead time = 0.8 × 16 = 12.8.
    // Safety stock = z(90%) × σ × √L = 1.2816 × 1.1 × 4 = 5.639.
    // Reorder point = 12.8 + 5.639 = 18.439, rounded up to whole pistons: 19.
    const rop = reorderPoint({ meanDaily: 0.8, sigmaDaily: 1.1, leadDays: 16, serviceLevel: 0.9 });
    expect(rop.demandOverLead).toBeCloseTo(12.8, 10);
    expect(rop.safety).toBeCloseTo(5.639, 3);
    expect(rop.value).toBe(19);
  });
});

describe('exact money for landed costs', () => {
  it('when amounts are converted and shared, then no binary-float error creeps in', () => {
    // 0.1 + 0.2 is 0.30000000000000004 in floats; decimal arithmetic gives 0.3 exactly.
    expect(moneyOut(new D('0.1').plus('0.2'))).toBe('0.30');
    const toEur = converter('EUR', [{ currency: 'USD', rate: '0.9215' }]);
    // 38.40 USD × 0.9215 = 35.3856 EUR exactly; + 15.00 USD shipping ÷ 4 × 0.9215 = 3.455625 → 38.841225.
    const price = toEur('38.40', 'USD');
    const share = toEur('15.00', 'USD')?.dividedBy(4);
    expect(price?.toFixed()).toBe('35.3856');
    expect(moneyOut(price!.plus(share!))).toBe('38.8412');
    expect(toEur('12.5', 'EUR')?.toFixed()).toBe('12.5');
    expect(toEur('12.5', 'GBP')).toBeNull();
  });

  it('when money is written out, then it has at least two and at most four decimals, rounded half up', () => {
    expect(moneyOut('76')).toBe('76.00');
    expect(moneyOut('0.12345')).toBe('0.1235');
    expect(moneyOut('12.5000')).toBe('12.50');
  });
});
