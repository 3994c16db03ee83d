// What stock is worth, kept exactly beside its count: receipts add quantity × unit cost, stock
// leaving takes its share, a count that finds more adds it at the average; the average cost is
// derived from value ÷ quantity. Every figure worked by hand.
import { db } from '../../server/db/knex';
import { closeTestApp, signedInClients } from '../support/api';
import { familyAndBin, makeFamily, makePart } from '../support/jobs-fixtures';

const { owner } = signedInClients({ owner: 'mm' });
const { family, bin } = familyAndBin(owner);

afterAll(closeTestApp);

async function valueOf(partId: string) {
  const row = await db('part_levels as pl')
    .join('parts as p', 'p.id', 'pl.part_id')
    .where('pl.part_id', partId)
    .select('pl.on_hand', 'pl.stock_value', 'p.average_cost')
    .first();
  return { onHand: row.on_hand, value: String(Number(row.stock_value)), average: row.average_cost };
}

describe('the value of stock on hand', () => {
  it('when three ring sets come in one at a time at 1.00, 1.00 and 2.00, then they are worth 4.00, not 3 × 1.3333 = 3.9999', async () => {
    const part = await makePart(owner, family, '+0.010 in', 'rings');
    for (const unitCost of ['1.00', '1.00', '2.00']) {
      const res = await owner.post('/api/stock/receipts', {
        partId: part,
        quantity: 1,
        binId: bin.id,
        unitCost,
      });
      expect(res.status).toBe(201);
    }
    // By hand: 1 + 1 + 2 = 4 for 3; average 4 ÷ 3 = 1.3333 (4 decimals, half-up).
    expect(await valueOf(part)).toEqual({ onHand: 3, value: '4', average: '1.3333' });

    // One counted missing: it takes its share, 4 × 1/3 = 1.3333 (4 decimals): 2.6667 left.
    const less = await owner.post('/api/stock/adjustments', {
      partId: part,
      quantity: -1,
      reason: 'Counted two on the shelf',
    });
    expect(less.status).toBe(201);
    expect(await valueOf(part)).toEqual({ onHand: 2, value: '2.6667', average: '1.3333' });

    // One found again comes back at the average: 2.6667 + 1.3333 = 4.
    const more = await owner.post('/api/stock/adjustments', {
      partId: part,
      quantity: 1,
      reason: 'Found behind the bin',
    });
    expect(more.status).toBe(201);
    expect(await valueOf(part)).toEqual({ onHand: 3, value: '4', average: '1.3333' });

    // The last ones out take all that is left: nothing is worth anything once none are on hand.
    await owner.post('/api/stock/adjustments', {
      partId: part,
      quantity: -3,
      reason: 'Written off',
    });
    expect((await valueOf(part)).value).toBe('0');
  });

  it('when the owner reads the stock value, then a family shows the exact value', async () => {
    const fam = await makeFamily(owner);
    const part = await makePart(owner, fam, '+0.020 in', 'rings');
    for (const unitCost of ['1.00', '1.00', '2.00']) {
      await owner.post('/api/stock/receipts', {
        partId: part,
        quantity: 1,
        binId: bin.id,
        unitCost,
      });
    }
    const res = await owner.get('/api/insights/stock-value?months=12');
    expect(res.status).toBe(200);
    const row = res.body.items.find((i: { familyId: string }) => i.familyId === fam.id);
    expect(row).toMatchObject({ onHand: 3, value: '4.00' });
  });
});
