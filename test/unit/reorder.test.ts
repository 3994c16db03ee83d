import { probit } from 'simple-statistics';
import {
  ReorderError,
  demandStats,
  economicOrderQuantity,
  reorderPoint,
  safetyStock,
  safetyStockVariableLead,
  zForServiceLevel,
} from '../../shared/reorder';

describe('zForServiceLevel', () => {
  it.each([
    [0.9, 1.2816],
    [0.95, 1.6449],
    [0.975, 1.96],
    [0.99, 2.3263],
  ])('when the service level is %s, then z matches the standard normal table (%s)', (p, table) => {
    // Standard normal table (upper-tail quantiles): 1.2816, 1.6449, 1.9600, 2.3263.
    expect(zForServiceLevel(p)).toBeCloseTo(table, 4);
  });

  it.each([0.9, 0.95, 0.99])(
    'when the service level is %s, then z agrees with simple-statistics probit to its accuracy',
    (p) => {
      // simple-statistics probit is a closed-form approximation (about 0.005 off at 0.99); ours refines it.
      expect(Math.abs(zForServiceLevel(p) - probit(p))).toBeLessThan(0.006);
    },
  );

  it('when the service level is 50%, then z is 0 (the median of the standard normal)', () => {
    expect(zForServiceLevel(0.5)).toBeCloseTo(0, 6);
  });

  it.each([0, 1, -0.1, 1.5, Number.NaN])(
    'when the service level is %s, then it is refused',
    (p) => {
      expect(() => zForServiceLevel(p)).toThrow(/between 0 and 1/);
    },
  );
});

describe('reorderPoint and safetyStock', () => {
  it('when demand is 2 a day (σ 1.5) over a 9-day lead at 95%, then the reorder point is 26', () => {
    // Worked by hand with the standard safety-stock formula SS = z·σ_d·√L:
    // demand over lead = 2 × 9 = 18; SS = 1.6449 × 1.5 × √9 = 1.6449 × 4.5 = 7.402;
    // reorder point = 18 + 7.402 = 25.402 → rounded up to 26 whole units.
    const rop = reorderPoint({ meanDaily: 2, sigmaDaily: 1.5, leadDays: 9, serviceLevel: 0.95 });
    expect(rop.demandOverLead).toBe(18);
    expect(rop.safety).toBeCloseTo(7.402, 3);
    expect(rop.z).toBeCloseTo(1.6449, 4);
    expect(rop.value).toBe(26);
    expect(rop.explanation).toEqual([
      'Demand over the lead time: 2 a day × 9 days = 18.',
      'Safety stock for a 95% service level: z 1.6449 × σ 1.5 × √9 = 7.4.',
      'Reorder point: 18 + 7.4, rounded up to 26.',
    ]);
  });

  it('when demand never varies, then the reorder point is the lead-time demand exactly', () => {
    // 0.5 a day × 20 days = 10 units; no safety stock. 10 must not be rounded up to 11 by float noise.
    expect(
      reorderPoint({ meanDaily: 0.5, sigmaDaily: 0, leadDays: 20, serviceLevel: 0.99 }).value,
    ).toBe(10);
  });

  it('when safety stock is worked alone, then it is z·σ·√L', () => {
    // 2.3263 × 2 × √16 = 2.3263 × 8 = 18.61 (by hand, standard normal table z for 99%).
    expect(safetyStock(2.3263, 2, 16)).toBeCloseTo(18.6104, 4);
  });

  it('when inputs are negative or not numbers, then a ReorderError names them', () => {
    expect(() =>
      reorderPoint({ meanDaily: -1, sigmaDaily: 1, leadDays: 5, serviceLevel: 0.9 }),
    ).toThrow(/mean daily demand must not be negative/);
    expect(() => safetyStock(1.64, Number.NaN, 5)).toThrow(ReorderError);
    expect(() => safetyStock(1.64, 1, -5)).toThrow(/lead time/);
  });
});

describe('safety stock when the supplier is sometimes late', () => {
  // The standard formula for variable demand and variable lead time (Chopra & Meindl, "Supply Chain
  // Management: Strategy, Planning, and Operation", chapter on safety inventory, the example with an
  // uncertain lead time): SS = z·√(L·σd² + d²·σL²).
  it('when the textbook case is worked (2,500 a week, σ 500, lead 7 weeks, σ lead 7 weeks, 90%), then SS is about 22,491', () => {
    // By hand: 7 × 500² = 1,750,000; 2,500² × 7² = 306,250,000; √308,000,000 = 17,549.93;
    // × z(90%) 1.2816 = 22,491 (figures of the textbook's example from memory; the arithmetic here).
    const ss = safetyStockVariableLead(zForServiceLevel(0.9), 2500, 500, 7, 7);
    expect(ss).toBeGreaterThan(22_490);
    expect(ss).toBeLessThan(22_492);
  });

  it('when demand is 2 a day (σ 1.5), the lead 9 days (σ 3 days), at 95%, then the reorder point is 31', () => {
    // By hand: √(9 × 1.5² + 2² × 3²) = √(20.25 + 36) = √56.25 = 7.5; SS = 1.6449 × 7.5 = 12.337;
    // demand over lead 18; 18 + 12.337 = 30.337 → 31 whole units (26 with a fixed lead, above).
    const rop = reorderPoint({
      meanDaily: 2,
      sigmaDaily: 1.5,
      leadDays: 9,
      sigmaLeadDays: 3,
      serviceLevel: 0.95,
    });
    expect(rop.safety).toBeCloseTo(12.3366, 3);
    expect(rop.value).toBe(31);
    expect(rop.explanation[1]).toBe(
      'Safety stock for a 95% service level, with a lead time that varies: z 1.6449 × √(9 days × σ 1.5² + 2 a day² × σ lead 3 days²) = 12.34.',
    );
  });

  it('when the lead time never varies, then it is the fixed-lead formula', () => {
    // σL = 0 leaves z·√(L·σd²) = z·σd·√L: 1.6449 × 1.5 × 3 = 7.402, as worked above.
    expect(safetyStockVariableLead(1.6449, 2, 1.5, 9, 0)).toBeCloseTo(7.402, 3);
  });

  it('when the lead-time spread is negative, then a ReorderError names it', () => {
    expect(() => safetyStockVariableLead(1.64, 2, 1, 5, -1)).toThrow(
      /lead-time standard deviation must not be negative/,
    );
  });
});

describe('economicOrderQuantity', () => {
  it('when D = 1000 a year, S = 10 an order and H = 0.50 a unit-year, then EOQ is 200', () => {
    // Textbook EOQ worked example (Wilson/Harris formula), as in operations-management texts (from
    // memory), reproduced by hand: Q* = √(2DS/H) = √(2 × 1000 × 10 / 0.50) = √40 000 = 200 units.
    const eoq = economicOrderQuantity({
      annualDemand: 1000,
      orderCost: 10,
      holdingCostPerUnitYear: 0.5,
    });
    expect(eoq.exact).toBeCloseTo(200, 10);
    expect(eoq.value).toBe(200);
    expect(eoq.explanation[0]).toMatch(
      /√\(2 × demand 1000 × order cost 10 ÷ holding cost 0.5\) = 200/,
    );
  });

  it('when the result is not whole, then it is rounded to the nearest unit', () => {
    // √(2 × 52 × 25 / 4) = √650 = 25.495… → 25 (by hand).
    const eoq = economicOrderQuantity({
      annualDemand: 52,
      orderCost: 25,
      holdingCostPerUnitYear: 4,
    });
    expect(eoq.exact).toBeCloseTo(25.4951, 4);
    expect(eoq.value).toBe(25);
  });

  it('when the holding cost is zero, then it is refused (the formula would divide by zero)', () => {
    expect(() =>
      economicOrderQuantity({ annualDemand: 10, orderCost: 5, holdingCostPerUnitYear: 0 }),
    ).toThrow(/holding cost/);
  });
});

describe('demandStats', () => {
  it('when daily demand is 2,4,4,4,5,5,7,9, then the mean is 5 and the sample σ is √(32/7)', () => {
    // Worked by hand: deviations² 9,1,1,1,0,0,4,16 sum to 32; sample variance 32/7; σ = 2.1381.
    // (Same data as the population example with σ = 2 in Wikipedia "Standard deviation".)
    const stats = demandStats([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(stats.days).toBe(8);
    expect(stats.mean).toBe(5);
    expect(stats.sigma).toBeCloseTo(Math.sqrt(32 / 7), 10);
    expect(stats.sigma).toBeCloseTo(2.1381, 4);
  });

  it('when fewer than two days or a negative day are given, then it is refused', () => {
    expect(() => demandStats([3])).toThrow(/two days/);
    expect(() => demandStats([3, -1])).toThrow(/Day 2/);
  });
});
