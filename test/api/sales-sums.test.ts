// The sales sums kept beside the ledger: each issue row lands in its day and month in the shop's
// zone, a change of zone rebuilds them, and the sales figures read the same from the sums as from
// the ledger itself. Expected figures are worked by hand in the comments.
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, signedInClients } from '../support/api';
import { makeFamily, makePart } from '../support/jobs-fixtures';

const { owner } = signedInClients({ owner: 'mm' });
let part: string;

async function sums(partId: string) {
  const days = await db('sales_days').where({ part_id: partId }).orderBy('day');
  return days.map((d) => ({
    day: (d.day as Date).toISOString().slice(0, 10),
    units: Number(d.units),
    revenue: String(d.revenue),
  }));
}

beforeAll(async () => {
  await saveSettings(null, { timeZone: 'UTC' });
  const family = await makeFamily(owner);
  part = await makePart(owner, family, '+0.030 in', 'rings');
  await db('parts').update({ average_cost: '5.0000' }).where({ id: part });
  // Three issues: 2 on 31 January at 23:30 UTC at 20.00 with cost 8.00; 1 on 1 February 10:00
  // at 25.00 with no cost recorded (valued at the average, 5.0000); 4 on 14 March 12:00 at 20.00,
  // cost 8.00. A receipt and a hold's reservation write no sales.
  await db('stock_ledger').insert([
    { part_id: part, kind: 'receipt', quantity: 10, unit_cost: '8.00', at: '2031-01-10T08:00:00Z' },
    {
      part_id: part,
      kind: 'issue',
      quantity: -2,
      unit_cost: '8.00',
      sale_price: '20.00',
      at: '2031-01-31T23:30:00Z',
    },
    {
      part_id: part,
      kind: 'issue',
      quantity: -1,
      unit_cost: null,
      sale_price: '25.00',
      at: '2031-02-01T10:00:00Z',
    },
    { part_id: part, kind: 'reservation', quantity: 0, held_delta: 1, at: '2031-02-02T10:00:00Z' },
    {
      part_id: part,
      kind: 'issue',
      quantity: -4,
      unit_cost: '8.00',
      sale_price: '20.00',
      at: '2031-03-14T12:00:00Z',
    },
  ]);
});
afterAll(async () => {
  await saveSettings(null, { timeZone: 'UTC' });
  await closeTestApp();
});

describe('sales sums', () => {
  it('when issues are written, then each lands in its day in the shop zone, and receipts and holds add nothing', async () => {
    expect(await sums(part)).toEqual([
      { day: '2031-01-31', units: 2, revenue: '40.0000' },
      { day: '2031-02-01', units: 1, revenue: '25.0000' },
      { day: '2031-03-14', units: 4, revenue: '80.0000' },
    ]);
    const months = await db('sales_months').where({ part_id: part }).orderBy('month');
    expect(
      months.map((m) => [(m.month as Date).toISOString().slice(0, 7), Number(m.units)]),
    ).toEqual([
      ['2031-01', 2],
      ['2031-02', 1],
      ['2031-03', 4],
    ]);
  });

  it('when the shop moves to a zone two hours ahead, then the sums are rebuilt: 23:30 UTC on 31 January is 1 February there', async () => {
    await saveSettings(null, { timeZone: 'Africa/Johannesburg' }); // UTC+2 all year, no summer time
    expect(await sums(part)).toEqual([
      { day: '2031-02-01', units: 3, revenue: '65.0000' },
      { day: '2031-03-14', units: 4, revenue: '80.0000' },
    ]);
    const [zone] = await db('sales_rollup_zone').select('zone');
    expect(zone.zone).toBe('Africa/Johannesburg');
    await saveSettings(null, { timeZone: 'UTC' });
  });

  // 15 January to 20 March: January's days, February whole, March's days. Units 2 + 1 + 4 = 7;
  // revenue 40.00 + 25.00 + 80.00 = 145.00; margin (20 − 8) × 2 + (25 − 5) × 1 + (20 − 8) × 4 = 92.
  const expected = { units: 7, revenue: '145.00', margin: '92.00' };

  it('when the period cuts months at both ends, then the figures from the sums are the hand-worked ones', async () => {
    const res = await owner.get(
      '/api/insights/top-sellers?from=2031-01-15&to=2031-03-20&rank=units',
    );
    expect(res.status).toBe(200);
    const mine = res.body.items.find((r: { partId: string }) => r.partId === part);
    expect({ units: mine.units, revenue: mine.revenue, margin: mine.margin }).toEqual(expected);
    const monthly = await owner.get('/api/insights/sales/monthly?from=2031-01-15&to=2031-03-20');
    expect(monthly.status).toBe(200);
    expect(monthly.body.months.map((r: { units: number }) => r.units)).toEqual([2, 1, 4]);
  });

  it('when the sums were made in another zone, then the figures come from the ledger and say the same', async () => {
    await db('sales_rollup_zone').update({ zone: 'Pacific/Auckland' });
    try {
      const res = await owner.get(
        '/api/insights/top-sellers?from=2031-01-15&to=2031-03-20&rank=units',
      );
      const mine = res.body.items.find((r: { partId: string }) => r.partId === part);
      expect({ units: mine.units, revenue: mine.revenue, margin: mine.margin }).toEqual(expected);
    } finally {
      await db.raw(`SELECT sales_rollup_rebuild('UTC')`);
    }
  });

  it('when the period is a few days inside one month, then only those days count', async () => {
    // 1 February alone: 1 unit at 25.00, margin 20.
    const res = await owner.get(
      '/api/insights/top-sellers?from=2031-02-01&to=2031-02-01&rank=units',
    );
    const mine = res.body.items.find((r: { partId: string }) => r.partId === part);
    expect({ units: mine.units, revenue: mine.revenue, margin: mine.margin }).toEqual({
      units: 1,
      revenue: '25.00',
      margin: '20.00',
    });
  });
});
