// The movements kept summed beside the ledger for stock value's turnover stay the ledger's sums when
// several receipts of one part are written at once (each adds to the same day's and month's row).
// Every figure worked by hand.
import { db } from '../../server/db/knex';
import { closeTestApp, signedInClients } from '../support/api';
import { familyAndBin, makePart } from '../support/jobs-fixtures';

const { owner } = signedInClients({ owner: 'mm' });
const { family, bin } = familyAndBin(owner);

afterAll(closeTestApp);

describe('movements summed beside the ledger', () => {
  it('when eight receipts of one part are written at once, then the day and the month hold their sums exactly', async () => {
    const part = await makePart(owner, family, '+0.020 in', 'rings');
    const quantities = [1, 2, 3, 4, 5, 6, 7, 8];
    const answers = await Promise.all(
      quantities.map((quantity) =>
        owner.post('/api/stock/receipts', {
          partId: part,
          quantity,
          binId: bin.id,
          unitCost: '2.50',
        }),
      ),
    );
    expect(answers.map((r) => r.status)).toEqual(quantities.map(() => 201));
    const moved = await db('stock_ledger').where({ part_id: part }).select('at');
    const days = new Set(moved.map((r: { at: Date }) => r.at.toISOString().slice(0, 10)));

    // By hand: 1 + 2 + … + 8 = 36 ring sets, at 2.50 each 36 × 2.50 = 90.00; no issue among them.
    const dayRows = await db('stock_moves_days').where({ part_id: part });
    const monthRows = await db('stock_moves_months').where({ part_id: part });
    const total = (rows: { value_known: string; quantity_cost_unknown: string }[]) => ({
      value: rows.reduce((sum, r) => sum + Number(r.value_known), 0),
      quantityWithoutCost: rows.reduce((sum, r) => sum + Number(r.quantity_cost_unknown), 0),
    });
    expect(dayRows).toHaveLength(days.size);
    expect(total(dayRows)).toEqual({ value: 90, quantityWithoutCost: 0 });
    expect(total(monthRows)).toEqual({ value: 90, quantityWithoutCost: 0 });
    expect(
      dayRows.every((r: { issue_cost_known: string }) => Number(r.issue_cost_known) === 0),
    ).toBe(true);
  });
});
