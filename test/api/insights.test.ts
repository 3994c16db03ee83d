// Insights API against the real app and database: sales, months and top sellers add up to the
// ledger's issue rows; stock value, turnover, dead stock, ABC and exposure match rows built here;
// CSV exports; who may see what. Ledger rows are written directly with the moments we need (sales
// in 2003, far from any other test's rows; stock movements relative to now).
import Decimal from 'decimal.js';
import { DateTime } from 'luxon';
import { db } from '../../server/db/knex';
import { recordShortage, supplierReliability } from '../../server/insights/insights-service';
import { neutralizeCell } from '../../shared/csv-safety';
import { closeTestApp, everyRoleSignedIn } from '../support/api';
import { makeFamily, makePart, type Fixture } from '../support/catalog-fixtures';

// A zone without daylight saving and without a place name: UTC+3 all year (IANA "Etc/GMT-3").
const ZONE = 'Etc/GMT-3';

const { owner, buyer, machinist, staff } = everyRoleSignedIn();
let savedZone: string;
let fx: Fixture;

interface LedgerRow {
  part_id: string;
  kind: string;
  quantity: number;
  held_delta?: number;
  unit_cost?: string | null;
  sale_price?: string | null;
  at: string | ReturnType<typeof db.raw>;
  reason?: string;
}

async function ledger(rows: LedgerRow[]): Promise<void> {
  await db('stock_ledger').insert(rows);
}

/** Sets a part's levels and average cost as if its movements had gone through the stock service. */
async function setLevels(partId: string, onHand: number, averageCost: string, held = 0) {
  // Stock brought to this level at this cost is worth on hand × average cost.
  await db('part_levels')
    .update({
      on_hand: onHand,
      held,
      stock_value: new Decimal(averageCost).times(onHand).toFixed(),
    })
    .where({ part_id: partId });
  await db('parts').update({ average_cost: averageCost }).where({ id: partId });
}

function ago(spec: string) {
  return db.raw(`now() - interval '${spec}'`);
}

function sum(values: string[]): Decimal {
  return values.reduce((acc, v) => acc.plus(v), new Decimal(0));
}

beforeAll(async () => {
  savedZone = (await owner.get('/api/settings')).body.timeZone;
  const res = await owner.patch('/api/settings', { timeZone: ZONE });
  expect(res.status).toBe(200);
  fx = await makeFamily(owner);
});
afterAll(async () => {
  await owner.patch('/api/settings', { timeZone: savedZone });
  await closeTestApp();
});

describe('what sells', () => {
  let pistonA: string;
  let pistonB: string;
  let rings: string;
  let other: string;
  /** Every issue the test writes, in or out of the period, with its moment in UTC. */
  const issues: { part: () => string; q: number; price: string; cost: string; at: string }[] = [
    // 1 Feb 00:30 local: inside.
    { part: () => other, q: 2, price: '5.25', cost: '2.1000', at: '2003-01-31T21:30:00Z' },
    { part: () => pistonA, q: 1, price: '120.00', cost: '70.0000', at: '2003-02-10T10:00:00Z' },
    { part: () => pistonA, q: 1, price: '120.00', cost: '72.5000', at: '2003-03-15T09:00:00Z' },
    { part: () => rings, q: 3, price: '18.40', cost: '9.9900', at: '2003-03-20T12:00:00Z' },
    // 30 Apr 23:30 local: inside.
    { part: () => pistonB, q: 1, price: '135.50', cost: '80.1234', at: '2003-04-30T20:30:00Z' },
    // 1 May 00:30 local and 31 Jan 23:59 local: outside the period, inside the months around it.
    { part: () => pistonA, q: 1, price: '120.00', cost: '72.5000', at: '2003-04-30T21:30:00Z' },
    { part: () => rings, q: 1, price: '18.40', cost: '9.9900', at: '2003-01-31T20:59:00Z' },
  ];
  const period = { from: '2003-02-01', to: '2003-04-30' };

  function inPeriod(at: string): boolean {
    const day = DateTime.fromISO(at, { zone: ZONE }).toISODate() as string;
    return day >= period.from && day <= period.to;
  }

  beforeAll(async () => {
    pistonA = (await makePart(owner, fx, 'piston', 1)).id;
    pistonB = (await makePart(owner, fx, 'piston', 2)).id;
    rings = (await makePart(owner, fx, 'rings', 1)).id;
    other = (await makePart(owner, fx, 'other', 0, { description: '=SUM(A1:A9) gasket set' })).id;
    const at = '2003-01-02T08:00:00Z';
    await ledger([
      { part_id: pistonA, kind: 'receipt', quantity: 5, unit_cost: '70.0000', at },
      { part_id: pistonB, kind: 'receipt', quantity: 2, unit_cost: '80.1234', at },
      { part_id: rings, kind: 'receipt', quantity: 10, unit_cost: '9.9900', at },
      { part_id: other, kind: 'receipt', quantity: 4, unit_cost: '2.1000', at },
      ...issues.map((i) => ({
        part_id: i.part(),
        kind: 'issue',
        quantity: -i.q,
        unit_cost: i.cost,
        sale_price: i.price,
        at: i.at,
      })),
      // Movements in the period that are not sales.
      {
        part_id: pistonA,
        kind: 'receipt',
        quantity: 1,
        unit_cost: '75.0000',
        at: '2003-03-01T10:00:00Z',
      },
      {
        part_id: pistonA,
        kind: 'reservation',
        quantity: 0,
        held_delta: 1,
        at: '2003-03-02T10:00:00Z',
      },
      {
        part_id: pistonA,
        kind: 'release',
        quantity: 0,
        held_delta: -1,
        at: '2003-03-03T10:00:00Z',
      },
      {
        part_id: rings,
        kind: 'scrap',
        quantity: -1,
        unit_cost: '9.9900',
        reason: 'bent',
        at: '2003-03-04T10:00:00Z',
      },
    ]);
    await setLevels(pistonA, 3, '72.5000');
    await setLevels(pistonB, 1, '80.1234');
    await setLevels(rings, 5, '9.9900');
    await setLevels(other, 2, '2.1000');
  });

  it('when sales are asked for a period, then the totals equal the sum of the issue rows in the ledger', async () => {
    const res = await owner.get(
      `/api/insights/sales?from=${period.from}&to=${period.to}&by=family,step`,
    );
    expect(res.status).toBe(200);

    // Independently, from the rows this test wrote (their local day decides the period).
    const mine = issues.filter((i) => inPeriod(i.at));
    expect(mine).toHaveLength(5);
    const units = mine.reduce((n, i) => n + i.q, 0);
    const revenue = sum(mine.map((i) => new Decimal(i.price).times(i.q).toString()));
    const margin = sum(mine.map((i) => new Decimal(i.price).minus(i.cost).times(i.q).toString()));
    expect(units).toBe(8);
    expect(revenue.toFixed(2)).toBe('441.20');
    expect(margin.toFixed(4)).toBe('184.4066');
    expect(res.body.totals).toEqual({ units, revenue: '441.20', margin: '184.4066' });

    // And straight from the ledger with plain SQL: every issue row whose moment falls in the period.
    const lo = DateTime.fromISO(period.from, { zone: ZONE }).toUTC().toISO();
    const hi = DateTime.fromISO(period.to, { zone: ZONE }).plus({ days: 1 }).toUTC().toISO();
    const raw = await db.raw(
      `SELECT sum(-quantity)::int AS units, sum(-quantity * sale_price) AS revenue,
              sum(-quantity * (sale_price - unit_cost)) AS margin
         FROM stock_ledger WHERE kind = 'issue' AND at >= ? AND at < ?`,
      [lo, hi],
    );
    const direct = raw.rows[0];
    expect(res.body.totals.units).toBe(direct.units);
    expect(new Decimal(res.body.totals.revenue).equals(direct.revenue)).toBe(true);
    expect(new Decimal(res.body.totals.margin).equals(direct.margin)).toBe(true);

    // Rows add up to the totals.
    const rows = res.body.rows as { units: number; revenue: string; margin: string }[];
    expect(rows.reduce((n, r) => n + r.units, 0)).toBe(res.body.totals.units);
    expect(sum(rows.map((r) => r.revenue)).equals(res.body.totals.revenue)).toBe(true);
    expect(sum(rows.map((r) => r.margin)).equals(res.body.totals.margin)).toBe(true);
  });

  it('when grouped by family and step, then each pair carries its units, revenue, margin and labels', async () => {
    const res = await owner.get(
      `/api/insights/sales?from=${period.from}&to=${period.to}&by=family,step`,
    );
    const rows = res.body.rows as Record<string, unknown>[];
    const find = (familyId: string | null, stepId: string | null) =>
      rows.find((r) => r.familyId === familyId && r.stepId === stepId);
    // 2 × (120.00 − 70.0000 | 72.5000) + 3 × (18.40 − 9.99) = 50 + 47.5 + 25.23
    expect(find(fx.familyId, fx.steps[1].id)).toMatchObject({
      units: 5,
      revenue: '295.20',
      margin: '122.73',
      familyCode: fx.familyCode,
      stepLabel: fx.steps[1].label,
    });
    expect(find(fx.familyId, fx.steps[2].id)).toMatchObject({
      units: 1,
      revenue: '135.50',
      margin: '55.3766',
    });
    expect(find(null, null)).toMatchObject({ units: 2, revenue: '10.50', margin: '6.30' });
    for (const row of rows) {
      expect(Object.keys(row)).toEqual(
        expect.arrayContaining(['familyId', 'stepId', 'units', 'revenue', 'margin']),
      );
    }
  });

  it('when grouped by family only or by step only, then the other key is null', async () => {
    const byFamily = await owner.get(
      `/api/insights/sales?from=${period.from}&to=${period.to}&by=family`,
    );
    expect(byFamily.status).toBe(200);
    expect(byFamily.body.rows).toEqual([
      expect.objectContaining({ familyId: fx.familyId, stepId: null, units: 6, revenue: '430.70' }),
      expect.objectContaining({ familyId: null, stepId: null, units: 2, revenue: '10.50' }),
    ]);
    const byStep = await owner.get(
      `/api/insights/sales?from=${period.from}&to=${period.to}&by=step`,
    );
    expect(byStep.body.rows).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ familyId: null, stepId: fx.steps[1].id, units: 5 }),
        expect.objectContaining({ familyId: null, stepId: fx.steps[2].id, units: 1 }),
      ]),
    );
    expect(byStep.body.totals).toEqual(byFamily.body.totals);
  });

  it('when months are asked for, then every month shows, empty ones as zero, in the shop time zone', async () => {
    const res = await owner.get('/api/insights/sales/monthly?from=2002-12-01&to=2003-06-30');
    expect(res.status).toBe(200);
    expect(
      res.body.months.map((m: { month: string; units: number }) => [m.month, m.units]),
    ).toEqual([
      ['2002-12', 0],
      ['2003-01', 1],
      ['2003-02', 3],
      ['2003-03', 4],
      ['2003-04', 1],
      ['2003-05', 1],
      ['2003-06', 0],
    ]);
    expect(res.body.months[1]).toEqual({
      month: '2003-01',
      units: 1,
      revenue: '18.40',
      margin: '8.41',
    });
    expect(res.body.period).toEqual({ from: '2002-12-01', to: '2003-06-30', timeZone: ZONE });
  });

  it('when top sellers are ranked by units or revenue, then the order follows that figure', async () => {
    const byUnits = await owner.get(
      `/api/insights/top-sellers?from=${period.from}&to=${period.to}&rank=units&limit=2`,
    );
    expect(byUnits.status).toBe(200);
    expect(byUnits.body.items.map((i: { partId: string }) => i.partId)[0]).toBe(rings);
    expect(byUnits.body.items).toHaveLength(2);
    const byRevenue = await owner.get(
      `/api/insights/top-sellers?from=${period.from}&to=${period.to}&rank=revenue`,
    );
    expect(byRevenue.body.items.map((i: { partId: string }) => i.partId)).toEqual([
      pistonA,
      pistonB,
      rings,
      other,
    ]);
    expect(byRevenue.body.items[0]).toMatchObject({ units: 2, revenue: '240.00', margin: '97.50' });
  });

  it('when the sales table is exported, then the CSV holds the rows and a total, with text made safe', async () => {
    const res = await owner.get(`/api/insights/sales.csv?from=${period.from}&to=${period.to}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="stepstock-sales-2003-02-01-to-2003-04-30.csv"',
    );
    const lines = res.text
      .replace(/^\uFEFF/, '')
      .trim()
      .split('\r\n');
    expect(lines[0]).toBe('Family,Family name,Step,Units,Revenue,Margin,Family id,Step id');
    expect(lines.at(-1)).toBe('Total,,,8,441.20,184.4066,,');
    // Step labels such as "+0.020 in" start like a formula, so they too get the leading quote.
    const step = neutralizeCell(fx.steps[2].label);
    expect(lines).toContain(
      `${fx.familyCode},Test family ${fx.familyCode},${step},1,135.50,55.3766,${fx.familyId},${fx.steps[2].id}`,
    );

    // A description that starts like a formula is shown as text in a spreadsheet.
    const top = await owner.get(
      `/api/insights/top-sellers.csv?from=${period.from}&to=${period.to}`,
    );
    expect(top.status).toBe(200);
    expect(top.text).toContain(",'=SUM(A1:A9) gasket set,");
  });

  it.each([
    ['from=2003-02-30&to=2003-03-01', 'from'],
    ['from=2003-03-01&to=2003-02-01', 'to'],
    ['from=2003-03-01', 'to'],
    ['from=2000-01-01&to=2012-01-01', 'to'],
    ['by=colour', 'by'],
    ['color=red', 'query'],
  ])('when the query is %s, then it is refused with a reason on %s', async (query, field) => {
    const res = await owner.get(`/api/insights/sales?${query}`);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid');
    expect(res.body.error.details[0].field).toBe(field);
  });

  it('when no period is given, then the last twelve months up to today are shown', async () => {
    const res = await owner.get('/api/insights/sales/monthly');
    expect(res.status).toBe(200);
    const today = DateTime.now().setZone(ZONE);
    expect(res.body.period.to).toBe(today.toISODate());
    expect(res.body.months).toHaveLength(12);
    expect(res.body.months.at(-1).month).toBe(today.toFormat('yyyy-MM'));
  });
});

describe('what sits', () => {
  let valued: Fixture;

  it('when receipts and issues at different costs go through, then stock value and turnover follow the weighted-average cost method', async () => {
    valued = await makeFamily(owner);
    const part = (await makePart(owner, valued, 'piston', 1)).id;
    // Weighted-average cost method (perpetual moving average), worked by hand: receive 10 @ 12.00,
    // issue 4 @ 12.0000, receive 6 @ 15.00 → (6 × 12 + 6 × 15) ÷ 12 = 13.5000, issue 5 @ 13.5000
    // → 7 left @ 13.5000.
    const first = { averageCost: '12.0000' };
    const second = { quantity: 7, averageCost: '13.5000' };
    await ledger([
      { part_id: part, kind: 'receipt', quantity: 10, unit_cost: '12.0000', at: ago('6 months') },
      {
        part_id: part,
        kind: 'issue',
        quantity: -4,
        unit_cost: first.averageCost,
        sale_price: '30.00',
        at: ago('3 months'),
      },
      { part_id: part, kind: 'receipt', quantity: 6, unit_cost: '15.0000', at: ago('7 weeks') },
      {
        part_id: part,
        kind: 'issue',
        quantity: -5,
        unit_cost: second.averageCost,
        sale_price: '30.00',
        at: ago('1 month'),
      },
    ]);
    await setLevels(part, second.quantity, second.averageCost);

    const res = await buyer.get('/api/insights/stock-value?months=12');
    expect(res.status).toBe(200);
    const row = res.body.items.find((i: { familyId: string }) => i.familyId === valued.familyId);
    // Closing 7 × 13.50 = 94.50; issued at cost 4 × 12 + 5 × 13.50 = 115.50; the window holds every
    // movement, so the opening value is 0. Inventory turnover = cost of goods sold ÷ average
    // inventory = 115.50 ÷ ((0 + 94.50) ÷ 2) = 2.444… → 2.44.
    expect(row).toMatchObject({
      familyCode: valued.familyCode,
      onHand: 7,
      value: '94.50',
      costOfIssues: '115.50',
      openingValue: '0.00',
      turnover: '2.44',
    });
    // Days of cover = 94.50 ÷ (115.50 ÷ days in the last 12 months) ≈ 299.
    expect(row.daysOfCover).toBeGreaterThanOrEqual(298);
    expect(row.daysOfCover).toBeLessThanOrEqual(300);
    const total = sum(res.body.items.map((i: { value: string }) => i.value));
    expect(total.equals(res.body.totalValue)).toBe(true);

    // A shorter window that misses the first receipt and issue rebuilds an opening value:
    // opening = 94.50 − (6 × 15 − 5 × 13.50) = 94.50 − 22.50 = 72.00.
    const short = await buyer.get('/api/insights/stock-value?months=2');
    const shortRow = short.body.items.find(
      (i: { familyId: string }) => i.familyId === valued.familyId,
    );
    expect(shortRow).toMatchObject({ openingValue: '72.00', costOfIssues: '67.50' });
  });

  it('when parts sit without an issue or a receipt for the months asked, then dead stock lists their free units with the money tied up', async () => {
    const family = await makeFamily(owner);
    const sleeper = (await makePart(owner, family, 'piston', 3)).id;
    const newStock = (await makePart(owner, family, 'rings', 4)).id;
    const mover = (await makePart(owner, family, 'piston', 1)).id;
    const empty = (await makePart(owner, family, 'piston', 2)).id;
    const oldStock = (await makePart(owner, family, 'rings', 0)).id;
    const allHeld = (await makePart(owner, family, 'piston', 4)).id;
    const lastIssue = await db.raw(`SELECT now() - interval '14 months' AS at`);
    const lastIssuedAt: Date = lastIssue.rows[0].at;
    await ledger([
      {
        part_id: sleeper,
        kind: 'receipt',
        quantity: 5,
        unit_cost: '10.5000',
        at: ago('20 months'),
      },
      {
        part_id: sleeper,
        kind: 'issue',
        quantity: -1,
        unit_cost: '10.5000',
        sale_price: '25.00',
        at: lastIssuedAt.toISOString(),
      },
      { part_id: newStock, kind: 'receipt', quantity: 2, unit_cost: '7.2500', at: ago('2 days') },
      { part_id: mover, kind: 'receipt', quantity: 6, unit_cost: '11.0000', at: ago('9 months') },
      {
        part_id: mover,
        kind: 'issue',
        quantity: -1,
        unit_cost: '11.0000',
        sale_price: '25.00',
        at: ago('2 months'),
      },
      {
        part_id: oldStock,
        kind: 'receipt',
        quantity: 3,
        unit_cost: '4.2000',
        at: ago('20 months'),
      },
      { part_id: allHeld, kind: 'receipt', quantity: 2, unit_cost: '9.0000', at: ago('20 months') },
    ]);
    await setLevels(sleeper, 4, '10.5000', 1);
    await setLevels(newStock, 2, '7.2500');
    await setLevels(mover, 5, '11.0000');
    await setLevels(empty, 0, '9.0000');
    await setLevels(oldStock, 3, '4.2000');
    await setLevels(allHeld, 2, '9.0000', 2);

    const res = await buyer.get('/api/insights/dead-stock?months=12');
    expect(res.status).toBe(200);
    const byPart = new Map<string, Record<string, unknown>>(
      res.body.items.map((i: { partId: string }) => [i.partId, i]),
    );
    // Worked by hand: the sleeper has 4 on hand, 1 held for a job → 3 free × 10.50 = 31.50.
    expect(byPart.get(sleeper)).toMatchObject({
      partId: sleeper,
      onHand: 4,
      held: 1,
      value: '31.50',
      lastIssuedAt: lastIssuedAt.toISOString(),
    });
    // Never issued, received 20 months ago: 3 × 4.20 = 12.60.
    expect(byPart.get(oldStock)).toMatchObject({ onHand: 3, value: '12.60', lastIssuedAt: null });
    // Received two days ago: new stock, not dead. Every unit held: nothing free to be dead.
    expect(byPart.has(newStock)).toBe(false);
    expect(byPart.has(allHeld)).toBe(false);
    expect(byPart.has(mover)).toBe(false);
    expect(byPart.has(empty)).toBe(false);
    const listed = sum(res.body.items.map((i: { value: string }) => i.value));
    expect(listed.equals(res.body.totalValue)).toBe(true);
    for (const item of res.body.items) {
      expect(Object.keys(item)).toEqual(
        expect.arrayContaining(['partId', 'onHand', 'value', 'lastIssuedAt']),
      );
    }

    // Over 18 months the sleeper's issue 14 months ago counts: it is no longer dead.
    const longer = await buyer.get('/api/insights/dead-stock?months=18');
    const ids = longer.body.items.map((i: { partId: string }) => i.partId);
    expect(ids).not.toContain(sleeper);
    expect(ids).toContain(oldStock);
    expect(ids).not.toContain(newStock);

    const bad = await buyer.get('/api/insights/dead-stock?months=0');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('months');
  });
});

describe('ABC classes', () => {
  it('when parts were issued in the last twelve months, then the route lists them by value with every part in one class (figures by hand: insights-abc.test.ts)', async () => {
    const family = await makeFamily(owner);
    // The worked example of test/unit/abc.test.ts as issue values at cost (Pareto 80/15/5).
    const values = ['5000', '2500', '1200', '600', '400', '200', '100'];
    const parts: string[] = [];
    for (const [i, value] of values.entries()) {
      const id = (await makePart(owner, family, i % 2 ? 'rings' : 'piston', i % 5)).id;
      parts.push(id);
      await ledger([
        {
          part_id: id,
          kind: 'receipt',
          quantity: 10,
          unit_cost: new Decimal(value).div(10).toFixed(4),
          at: ago('2 months'),
        },
        {
          part_id: id,
          kind: 'issue',
          quantity: -10,
          unit_cost: new Decimal(value).div(10).toFixed(4),
          sale_price: '1.00',
          at: ago('1 month'),
        },
      ]);
    }
    const res = await buyer.get('/api/insights/abc?months=12');
    expect(res.status).toBe(200);
    const items = res.body.items as {
      partId: string;
      value: string;
      share: string;
      class: string;
      cumulative: string;
    }[];
    for (const id of parts) expect(items.some((i) => i.partId === id)).toBe(true);

    // The other tests' parts share this database, so the shares here are not the example's; the
    // exact figures are worked by hand on a database of its own in insights-abc.test.ts.
    const ours = items.filter((i) => parts.includes(i.partId));
    expect(ours.map((i) => i.value)).toEqual([
      '5000.00',
      '2500.00',
      '1200.00',
      '600.00',
      '400.00',
      '200.00',
      '100.00',
    ]);
    // The example's own order is kept among them.
    const order = items.filter((i) => parts.includes(i.partId)).map((i) => i.partId);
    expect(order).toEqual(parts);

    const classes = res.body.classes as { class: string; parts: number; value: string }[];
    expect(classes.map((c) => c.class)).toEqual(['A', 'B', 'C']);
    expect(classes.reduce((n, c) => n + c.parts, 0)).toBe(items.length);
    expect(sum(classes.map((c) => c.value)).equals(res.body.totalValue)).toBe(true);
  });
});

describe('exposure', () => {
  let family: Fixture;

  async function openJob(cylinders = 1, state = 'gauged', closedAgo?: string) {
    const [job] = await db('jobs')
      .insert({
        customer_name: 'Test customer',
        family_id: family.familyId,
        cylinders,
        state,
        closed_at: closedAgo ? ago(closedAgo) : null,
      })
      .returning(['id']);
    for (let n = 1; n <= cylinders; n++) await db('job_cylinders').insert({ job_id: job.id, n });
    return job.id as string;
  }

  beforeAll(async () => {
    family = await makeFamily(owner);
  });

  it('when steps were short, then times short, jobs that waited and the days they waited are counted per step', async () => {
    const step = family.steps[2].id;
    const piston = (await makePart(owner, family, 'piston', 2)).id;
    const waitedThenHeld = await openJob();
    const stillWaiting = await openJob();
    const closedWaiting = await openJob(1, 'handed_back', '20 days');
    await db('step_shortages').insert([
      {
        family_id: family.familyId,
        step_id: step,
        job_id: waitedThenHeld,
        cylinder: 1,
        source: 'hold',
        at: ago('10 days'),
      },
      {
        family_id: family.familyId,
        step_id: step,
        job_id: stillWaiting,
        cylinder: 1,
        source: 'hold',
        at: ago('5 days'),
      },
      {
        family_id: family.familyId,
        step_id: step,
        job_id: closedWaiting,
        cylinder: 1,
        source: 'hold',
        at: ago('30 days'),
      },
    ]);
    await db('holds').insert({
      job_id: waitedThenHeld,
      cylinder: 1,
      part_id: piston,
      quantity: 1,
      created_at: ago('7 days'),
    });
    // Still waiting means what the job bench means: the step is chosen, no piston is held and none
    // is free (a ring set is free here, so it waits for the piston alone).
    const rings = (await makePart(owner, family, 'rings', 2)).id;
    await db('part_levels').where({ part_id: rings }).update({ on_hand: 2 });
    await db('job_cylinders')
      .update({ chosen_step_id: step })
      .where({ job_id: stillWaiting, n: 1 });
    // A counter enquiry: short, but no job waited for it.
    expect(
      await recordShortage({ familyId: family.familyId, stepId: step, source: 'counter' }),
    ).toBe(true);

    const res = await buyer.get('/api/insights/exposure');
    expect(res.status).toBe(200);
    const row = res.body.items.find(
      (i: { familyId: string; stepId: string }) =>
        i.familyId === family.familyId && i.stepId === step,
    );
    // Waits: 10 − 7 = 3 days to the hold; 5 days and going; 30 − 20 = 10 days until the job closed.
    expect(row).toMatchObject({
      timesShort: 4,
      jobsWaited: 3,
      stillWaiting: 1,
      stepLabel: family.steps[2].label,
    });
    expect(row.daysWaited).toBeGreaterThanOrEqual(17.9);
    expect(row.daysWaited).toBeLessThanOrEqual(18.1);

    const csv = await buyer.get('/api/insights/exposure.csv');
    expect(csv.status).toBe(200);
    const label = neutralizeCell(family.steps[2].label);
    expect(csv.text).toContain(
      `${family.familyCode},Test family ${family.familyCode},${label},4,3,`,
    );
  });

  it('when a cylinder is given a step with no measured piston free, then a shortage is noted once; with one free or held, none', async () => {
    const short = family.steps[1].id;
    const stocked = family.steps[3].id;
    const shortPiston = (await makePart(owner, family, 'piston', 1)).id;
    const stockedPiston = (await makePart(owner, family, 'piston', 3)).id;
    await db('piston_units').insert({
      part_id: stockedPiston,
      skirt_nm: 63_480_000,
      status: 'free',
    });
    // An unmeasured piston does not count as free: it cannot be matched to a bore yet.
    await db('piston_units').insert({ part_id: shortPiston, skirt_nm: null, status: 'free' });
    // Each piston on the shelf counted on hand too, as receiving through the stock door keeps it.
    await db('part_levels').whereIn('part_id', [shortPiston, stockedPiston]).update({ on_hand: 1 });
    // Ring sets are free at both steps, so only the piston can be short here.
    for (const index of [1, 3]) {
      const rings = (await makePart(owner, family, 'rings', index)).id;
      await db('part_levels').where({ part_id: rings }).update({ on_hand: 2 });
    }
    const job = await openJob(3);
    const count = async () =>
      (await db('step_shortages').where({ job_id: job }).count<{ n: number }[]>('* as n'))[0].n;

    await db('job_cylinders').update({ chosen_step_id: short }).where({ job_id: job, n: 1 });
    expect(
      await db('step_shortages').where({ job_id: job }).select('cylinder', 'step_id', 'source'),
    ).toEqual([{ cylinder: 1, step_id: short, source: 'step_chosen' }]);
    // Chosen again: still one shortage for that cylinder and step.
    await db('job_cylinders').update({ chosen_step_id: null }).where({ job_id: job, n: 1 });
    await db('job_cylinders').update({ chosen_step_id: short }).where({ job_id: job, n: 1 });
    expect(await count()).toBe(1);

    await db('job_cylinders').update({ chosen_step_id: stocked }).where({ job_id: job, n: 2 });
    expect(await count()).toBe(1);

    // A piston held in the same transaction as the choice is found, not short.
    await db.transaction(async (trx) => {
      await trx('job_cylinders').update({ chosen_step_id: short }).where({ job_id: job, n: 3 });
      await trx('holds').insert({ job_id: job, cylinder: 3, part_id: shortPiston, quantity: 1 });
    });
    expect(await count()).toBe(1);
  });
});

describe('who may see insights', () => {
  const OWNER_ONLY = [
    '/api/insights/sales',
    '/api/insights/sales/monthly',
    '/api/insights/top-sellers',
  ];
  const STOCK_SIDE = [
    '/api/insights/stock-value',
    '/api/insights/dead-stock',
    '/api/insights/abc',
    '/api/insights/exposure',
    '/api/insights/supplier-reliability',
  ];
  const ALL = [...OWNER_ONLY, ...STOCK_SIDE].flatMap((p) => [p, `${p}.csv`]);

  it('when the owner asks, then every page and export answers', async () => {
    for (const path of ALL)
      expect({ path, status: (await owner.get(path)).status }).toEqual({ path, status: 200 });
  });

  it('when the buyer asks, then the stock side answers and sales are refused', async () => {
    for (const path of ALL) {
      const allowed = STOCK_SIDE.some((p) => path === p || path === `${p}.csv`);
      expect({ path, status: (await buyer.get(path)).status }).toEqual({
        path,
        status: allowed ? 200 : 403,
      });
    }
  });

  it('when a machinist or staff asks, then every insight is refused', async () => {
    for (const client of [machinist, staff]) {
      for (const path of ALL)
        expect({ path, status: (await client.get(path)).status }).toEqual({ path, status: 403 });
    }
  });
});

describe('supplier reliability', () => {
  it('when deliveries came in against purchase orders, then promised and actual lead times compare per supplier', async () => {
    const family = await makeFamily(owner);
    const piston = (await makePart(owner, family, 'piston', 1)).id;
    const rings = (await makePart(owner, family, 'rings', 1)).id;
    const [supplier] = await db('suppliers')
      .insert({ name: `Test supplier ${family.familyCode}`, currency: 'EUR', lead_days: 10 })
      .returning(['id']);
    // Calendar days in the shop's zone: sent at 10:00, received at 15:00 local.
    const today = DateTime.now().setZone(ZONE).startOf('day');
    const at = (days: number, hour: number) => today.plus({ days, hours: hour }).toUTC().toISO();
    const order = async (sentDay: number, expectedAfter: number | null) => {
      const [o] = await db('purchase_orders')
        .insert({
          supplier_id: supplier.id,
          currency: 'EUR',
          state: 'all_in',
          sent_at: at(sentDay, 10),
          closed_at: at(0, 0),
          expected_on:
            expectedAfter === null
              ? null
              : today.plus({ days: sentDay + expectedAfter }).toISODate(),
        })
        .returning(['id']);
      return o.id as string;
    };
    const line = async (orderId: string, lineNo: number, partId: string, quantity: number) => {
      const [l] = await db('purchase_order_lines')
        .insert({
          order_id: orderId,
          line_no: lineNo,
          part_id: partId,
          quantity,
          unit_price: '10.00',
          received_quantity: quantity,
        })
        .returning(['id']);
      return l.id as string;
    };
    const receive = async (orderId: string, day: number, lines: [string, number][]) => {
      const [r] = await db('purchase_order_receipts')
        .insert({ order_id: orderId, received_at: at(day, 15) })
        .returning(['id']);
      await db('purchase_order_receipt_lines').insert(
        lines.map(([lineId, quantity]) => ({
          receipt_id: r.id,
          line_id: lineId,
          quantity,
          stock_receipt_id: r.id,
        })),
      );
    };
    // Order 1: sent 40 days ago, promised in 14 days; one line came early (day 12), one late (day 20).
    const first = await order(-40, 14);
    const firstPiston = await line(first, 1, piston, 2);
    const firstRings = await line(first, 2, rings, 4);
    await receive(first, -40 + 12, [[firstPiston, 2]]);
    await receive(first, -40 + 20, [[firstRings, 4]]);
    // Order 2: sent 30 days ago with no date named: the supplier's usual 10 days; came on day 13.
    const second = await order(-30, null);
    await receive(second, -30 + 13, [[await line(second, 1, piston, 1), 1]]);

    const res = await buyer.get('/api/insights/supplier-reliability?months=12');
    expect(res.status).toBe(200);
    expect(res.body.ordersReceived).toBe(true);
    const row = res.body.items.find((i: { supplierId: string }) => i.supplierId === supplier.id);
    // Promised 14, 14, 10 → 12.7; actual 12, 20, 13 → 15.0; late −2, 6, 3 → 2.3; on time 1 of 3.
    expect(row).toEqual({
      supplierId: supplier.id,
      supplierName: `Test supplier ${family.familyCode}`,
      ordersReceived: 2,
      linesReceived: 3,
      promisedDays: '12.7',
      actualDays: '15.0',
      averageDaysLate: '2.3',
      onTimeShare: '0.3333',
    });
  });

  it('when nothing has been received against a purchase order, then the list is empty and says so', async () => {
    // Rolled back: the other tests' deliveries are hidden only inside this transaction.
    await db
      .transaction(async (trx) => {
        await trx('purchase_order_receipt_lines').del();
        await trx('purchase_order_receipts').del();
        const answer = await supplierReliability(12, trx);
        expect(answer).toEqual({
          items: [],
          ordersReceived: false,
          message: expect.stringMatching(/^No orders received yet/),
          months: 12,
        });
        throw new Error('roll back');
      })
      .catch((e: Error) => {
        if (e.message !== 'roll back') throw e;
      });
    const res = await buyer.get('/api/insights/supplier-reliability?months=12');
    expect(res.body.ordersReceived).toBe(true);
  });
});
