// The reorder suggestion counts what the shop could not sell and how late its supplier really is:
// lost sales join the demand, and a supplier's delivery-time spread joins the safety stock, each
// worked by hand below.
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, signedInClients, uniq } from '../support/api';
import { makeSupplier } from '../support/purchasing-fixtures';
import { familyAndBin, makeJob, makePart, receivePistons } from '../support/jobs-fixtures';

const { owner, buyer } = signedInClients({ owner: 'mm', buyer: 'mm' });
const { family, bin } = familyAndBin(owner, { cylinders: 1 });

beforeAll(async () => {
  await saveSettings(null, {
    timeZone: 'UTC',
    homeCurrency: 'EUR',
    orderCost: '25.00',
    holdingCostRate: '0.25',
    serviceLevel: 0.95,
  });
});
afterAll(closeTestApp);

const today = new Date().toISOString().slice(0, 10);
/** Noon, n days before today (UTC, the shop's time zone here). */
function daysAgo(n: number): Date {
  const d = new Date(`${today}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() - n);
  return d;
}

async function supplierOffering(
  partId: string,
  leadDays: number,
  shippingCost = '0.00',
): Promise<string> {
  const supplier = await makeSupplier(buyer, { currency: 'EUR', leadDays, shippingCost });
  await db('supplier_items').insert({
    supplier_id: supplier.id,
    sku: uniq('SI').toUpperCase(),
    description: 'Piston as listed by the supplier',
    part_id: partId,
    price: '40.00',
    currency: 'EUR',
    available: 10,
  });
  return supplier.id;
}

/** An order sent `sentDaysAgo` days ago and delivered `took` days later. */
async function delivery(supplierId: string, sentDaysAgo: number, took: number): Promise<void> {
  const [order] = await db('purchase_orders')
    .insert({
      supplier_id: supplierId,
      currency: 'EUR',
      state: 'all_in',
      sent_at: daysAgo(sentDaysAgo),
      closed_at: daysAgo(sentDaysAgo - took),
    })
    .returning('id');
  await db('purchase_order_receipts').insert({
    order_id: order.id,
    received_at: daysAgo(sentDaysAgo - took),
  });
}

describe('GET /api/parts/:id/reorder-suggestion with lost sales and a late supplier', () => {
  it('when pistons were asked for and none was free, then the unmet requests count as demand; once the supplier has delivered five times, its spread joins the safety stock', async () => {
    const step = '+0.020 in';
    const part = await makePart(owner, family, step, 'piston');
    await receivePistons(owner, part, bin.id, ['2.5368 in'], '40.00');
    const supplierId = await supplierOffering(part, 7);
    const jobNeverSupplied = (await makeJob(owner, family.id)).id as string;
    const jobSuppliedLater = (await makeJob(owner, family.id)).id as string;
    const stepId = family.steps[step];

    await db('stock_ledger').insert([
      { part_id: part, kind: 'issue', quantity: -2, at: daysAgo(2) },
      { part_id: part, kind: 'issue', quantity: -1, at: daysAgo(5) },
      { part_id: part, kind: 'issue', quantity: -2, at: daysAgo(9) },
      { part_id: part, kind: 'issue', quantity: -1, at: daysAgo(9), job_id: jobSuppliedLater },
    ]);
    await db('step_shortages').insert([
      // A customer at the counter went away without one: lost.
      { family_id: family.id, step_id: stepId, source: 'counter', at: daysAgo(4) },
      // A job that asked and never got a piston of this step: lost.
      {
        family_id: family.id,
        step_id: stepId,
        source: 'hold',
        job_id: jobNeverSupplied,
        cylinder: 1,
        at: daysAgo(6),
      },
      // A job that waited and got its piston on day 9: already counted by that issue.
      {
        family_id: family.id,
        step_id: stepId,
        source: 'hold',
        job_id: jobSuppliedLater,
        cylinder: 1,
        at: daysAgo(11),
      },
    ]);

    const fixed = await buyer.get(`/api/parts/${part}/reorder-suggestion?windowDays=14`);
    expect(fixed.status).toBe(200);
    // Worked by hand: days 2, 4, 5, 6, 9 carry 2, 1, 1, 1, 3 and nine days carry 0; 6 issued +
    // 2 lost = 8; mean 8/14 = 0.571429 a day; sample variance (16 − 14 × 0.571429²) / 13
    // = 0.879121, σ = 0.937614.
    expect(fixed.body.issued.value).toBe(6);
    // The window is written the shop's way (en-GB by default: day/month/year), not as ISO days.
    expect(fixed.body.issued.how).toMatch(/from \d{2}\/\d{2}\/\d{4} to \d{2}\/\d{2}\/\d{4}\.$/);
    expect(fixed.body.lostDemand.value).toBe(2);
    expect(fixed.body.meanDaily.value).toBeCloseTo(0.571429, 5);
    expect(fixed.body.sigmaDaily.value).toBeCloseTo(0.937614, 5);
    expect(fixed.body.notes.join(' ')).toMatch(/2 asked for when none was free/);
    // No deliveries yet: the quoted 7 days, taken as fixed. SS = 1.6449 × 0.937614 × √7 = 4.0803;
    // 0.571429 × 7 = 4.0 → 8.0803 → 9.
    expect(fixed.body.sigmaLeadDays).toBeNull();
    expect(fixed.body.leadDays.value).toBe(7);
    expect(fixed.body.safetyStock.value).toBeCloseTo(4.08, 2);
    expect(fixed.body.reorderPoint.value).toBe(9);

    // Five deliveries that took 7, 9, 7, 12 and 10 days: mean 9; deviations −2, 0, −2, 3, 1;
    // squares 4 + 0 + 4 + 9 + 1 = 18; sample variance 18 / 4 = 4.5; σL = 2.121320 days.
    for (const [ago, took] of [
      [200, 7],
      [150, 9],
      [100, 7],
      [60, 12],
      [30, 10],
    ])
      await delivery(supplierId, ago, took);
    const late = await buyer.get(`/api/parts/${part}/reorder-suggestion?windowDays=14`);
    expect(late.status).toBe(200);
    expect(late.body.leadDays.value).toBe(9);
    expect(late.body.leadDays.how).toMatch(/actually took.*5 deliveries.*quoted 7/);
    expect(late.body.sigmaLeadDays.value).toBeCloseTo(2.12132, 4);
    // SS = z·√(L·σd² + d²·σL²) (the formula for variable demand and lead time) =
    // 1.6449 × √(9 × 0.879121 + 0.326531 × 4.5) = 1.6449 × √9.381476 = 1.6449 × 3.062920 = 5.0381;
    // demand over the lead 0.571429 × 9 = 5.142857; 10.1810 → 11.
    expect(late.body.safetyStock.value).toBeCloseTo(5.04, 2);
    expect(late.body.reorderPoint.value).toBe(11);
  });
});

describe('the order quantity when nothing has been received yet', () => {
  it('when the only cost known is an offer of 40.00 with 15.00 shipping an order, then holding is priced on the 40.00 and the shipping joins the cost of ordering', async () => {
    const part = await makePart(owner, family, '+0.030 in', 'piston');
    await supplierOffering(part, 7, '15.00');
    await db('stock_ledger').insert([
      { part_id: part, kind: 'issue', quantity: -2, at: daysAgo(2) },
      { part_id: part, kind: 'issue', quantity: -1, at: daysAgo(5) },
      { part_id: part, kind: 'issue', quantity: -3, at: daysAgo(9) },
    ]);
    const res = await buyer.get(`/api/parts/${part}/reorder-suggestion?windowDays=14`);
    expect(res.status).toBe(200);
    // EOQ √(2DS/H) (the Wilson lot-size formula), worked by hand: D = 6/14 a day × 365 = 156.4286
    // a year; S = 25.00 to place an order + 15.00 shipping = 40.00; H = 0.25 × 40.00 = 10.00 a unit
    // a year; √(2 × 156.4286 × 40 / 10) = √1251.43 = 35.38 → 35. (Pricing one unit at its landed
    // 55.00 with the whole shipping in it, and S = 25.00, would give √568.8 = 23.85 → 24.)
    expect(res.body.orderQuantity.value).toBe(35);
    expect(res.body.orderQuantity.how).toMatch(
      /order cost 40\.00 \(25\.00 to place it \+ .*shipping 15\.00\)/,
    );
    expect(res.body.orderQuantity.how).toMatch(/best offer's price 40\.00/);
  });
});
