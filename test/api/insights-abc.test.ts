// ABC classes from the SQL, on a database of its own so that no other test's issues change the
// total, checked against the figures worked by hand below (not against shared/abc.ts).
import { migrateLatest } from '../../server/db/migrate';
import { abc } from '../../server/insights/insights-service';
import { scratchDatabase } from '../support/scratch-database';

const scratch = scratchDatabase('abc');

beforeAll(async () => {
  await migrateLatest(scratch.db);
});

/** A part whose issues in the last year are worth `value` at cost, and one issued before then. */
async function partIssued(sku: string, value: string, whenAgo = '1 month'): Promise<string> {
  const [part] = await scratch
    .db('parts')
    .insert({ kind: 'other', sku, description: `Sundry ${sku}` })
    .returning('id');
  await scratch.db('stock_ledger').insert([
    {
      part_id: part.id,
      kind: 'receipt',
      quantity: 10,
      unit_cost: value,
      at: scratch.db.raw(`now() - interval '14 months'`),
    },
    {
      part_id: part.id,
      kind: 'issue',
      quantity: -1,
      unit_cost: value,
      sale_price: value,
      at: scratch.db.raw(`now() - interval '${whenAgo}'`),
    },
  ]);
  return part.id as string;
}

describe('ABC classes (Pareto 80/15/5)', () => {
  it('when seven parts were issued for 5,000 … 100 in the last twelve months, then the classes, shares and running shares are the ones worked by hand', async () => {
    // Pareto convention 80/15/5 (ABC inventory classification): a part is A while the share of value
    // before it is below 80 %, B while below 95 %, else C. By hand, total 10,000:
    //   part  value  share   running  share before → class
    //   P1    5000   0.5000  0.5000   0.00 → A
    //   P2    2500   0.2500  0.7500   0.50 → A
    //   P3    1200   0.1200  0.8700   0.75 → A (crosses 80 %: still A)
    //   P4     600   0.0600  0.9300   0.87 → B
    //   P5     400   0.0400  0.9700   0.93 → B
    //   P6     200   0.0200  0.9900   0.97 → C
    //   P7     100   0.0100  1.0000   0.99 → C
    // An issue 13 months ago is outside the window and counts for nothing.
    const ids: Record<string, string> = {};
    for (const [sku, value] of [
      ['P4', '600'],
      ['P7', '100'],
      ['P1', '5000'],
      ['P6', '200'],
      ['P3', '1200'],
      ['P5', '400'],
      ['P2', '2500'],
    ]) {
      ids[sku] = await partIssued(sku, value);
    }
    const old = await partIssued('OLD', '9000', '13 months');

    const answer = await abc(12, scratch.db);
    const bySku = answer.items.map((i) => [i.sku, i.class, i.value, i.share, i.cumulative]);
    expect(bySku).toEqual([
      ['P1', 'A', '5000.00', '0.5000', '0.5000'],
      ['P2', 'A', '2500.00', '0.2500', '0.7500'],
      ['P3', 'A', '1200.00', '0.1200', '0.8700'],
      ['P4', 'B', '600.00', '0.0600', '0.9300'],
      ['P5', 'B', '400.00', '0.0400', '0.9700'],
      ['P6', 'C', '200.00', '0.0200', '0.9900'],
      ['P7', 'C', '100.00', '0.0100', '1.0000'],
    ]);
    expect(answer.items.some((i) => i.partId === old)).toBe(false);
    expect(answer.totalValue).toBe('10000.00');
    // By hand: A = 5000 + 2500 + 1200 = 8700 (0.87); B = 600 + 400 = 1000 (0.10); C = 300 (0.03).
    expect(answer.classes).toEqual([
      { class: 'A', parts: 3, value: '8700.00', share: '0.8700' },
      { class: 'B', parts: 2, value: '1000.00', share: '0.1000' },
      { class: 'C', parts: 2, value: '300.00', share: '0.0300' },
    ]);
    expect(ids.P1).toBe(answer.items[0].partId);
  });
});
