// The one receiving page: a delivery of a part on order is offered its open order lines first and
// taken in against one, so the line's count and the order move on; one nobody ordered is a plain
// receipt at the cost typed. Both go through POST /api/stock/receipts.
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, signedInClients } from '../support/api';
import { makeSupplier } from '../support/purchasing-fixtures';
import { familyAndBin, makePart } from '../support/jobs-fixtures';

const { owner, buyer, staff } = signedInClients({ owner: 'mm', buyer: 'mm', staff: 'mm' });
const { family, bin } = familyAndBin(owner);
let piston: string;
let rings: string;
let order: { id: string; number: string; lines: { id: string; partId: string }[] };

beforeAll(async () => {
  await saveSettings(null, { timeZone: 'UTC', homeCurrency: 'EUR' });
  piston = await makePart(owner, family, '+0.020 in', 'piston');
  rings = await makePart(owner, family, '+0.020 in', 'rings');
  const supplier = await makeSupplier(buyer, {
    currency: 'EUR',
    leadDays: 7,
    shippingCost: '0.00',
  });
  const draft = await buyer.post('/api/purchase-orders', {
    supplierId: supplier.id,
    lines: [
      { partId: piston, quantity: 2, unitPrice: '38.00' },
      { partId: rings, quantity: 4, unitPrice: '11.50' },
    ],
  });
  expect(draft.status).toBe(201);
  expect((await buyer.post(`/api/purchase-orders/${draft.body.id}/send`)).status).toBe(200);
  order = draft.body;
});
afterAll(closeTestApp);

const lineOf = (partId: string) => order.lines.find((l) => l.partId === partId)!.id;

describe('one receiving page', () => {
  it('when the part being received is on order, then its open lines are offered by part', async () => {
    const res = await staff.get(`/api/purchase-orders/open-lines?partId=${piston}`);
    expect(res.status).toBe(200);
    expect(res.body.items).toEqual([
      expect.objectContaining({
        orderId: order.id,
        orderNumber: order.number,
        expectedOn: expect.any(String),
        line: expect.objectContaining({ id: lineOf(piston), open: 2, received: 0 }),
      }),
    ]);
    const neither = await staff.get('/api/purchase-orders/open-lines');
    expect(neither.status).toBe(400);
  });

  it('when an ordered piston is received against its line, then the line counts it, the order is partly in, and the cost is the order price', async () => {
    const res = await staff.post('/api/stock/receipts', {
      partId: piston,
      quantity: 1,
      binId: bin.id,
      units: [{ skirt: '2.5360 in' }],
      orderLineId: lineOf(piston),
    });
    expect(res.status).toBe(201);
    expect(res.body.order).toEqual(
      expect.objectContaining({
        id: order.id,
        number: order.number,
        state: 'partly_in',
        lineNo: 1,
        received: 1,
        quantity: 2,
      }),
    );
    expect(res.body.units).toHaveLength(1);
    expect(res.body.levels.onHand).toBe(1);
    const line = await db('purchase_order_lines')
      .where({ id: lineOf(piston) })
      .first();
    expect(line.received_quantity).toBe(1);
    // The order's price (EUR, the home currency) is the stock cost; no cost was typed.
    const ledger = await db('stock_ledger').where({ part_id: piston, kind: 'receipt' });
    expect(ledger.map((l) => l.unit_cost)).toEqual(['38.0000']);
  });

  it('when the rest of the order comes in through the same page, then every line is closed and the order is all in', async () => {
    const last = await staff.post('/api/stock/receipts', {
      partId: piston,
      quantity: 1,
      binId: bin.id,
      units: [{ skirt: null }],
      orderLineId: lineOf(piston),
    });
    expect(last.status).toBe(201);
    expect(last.body.order).toEqual(expect.objectContaining({ received: 2, quantity: 2 }));
    const ringSets = await staff.post('/api/stock/receipts', {
      partId: rings,
      quantity: 4,
      binId: bin.id,
      orderLineId: lineOf(rings),
    });
    expect(ringSets.status).toBe(201);
    expect(ringSets.body.order).toEqual(
      expect.objectContaining({ state: 'all_in', stateLabel: expect.any(String) }),
    );
    const stored = await db('purchase_orders').where({ id: order.id }).first();
    expect(stored.state).toBe('all_in');
    expect(stored.closed_at).not.toBeNull();
    const open = await staff.get(`/api/purchase-orders/open-lines?partId=${piston}`);
    expect(open.body.items).toEqual([]);
  });

  it('when a line is full, for another part, or more came than is open, then 400 at the field and nothing is written', async () => {
    const before = await db('stock_ledger')
      .where({ part_id: piston })
      .count<{ n: number }[]>('* as n');
    const full = await staff.post('/api/stock/receipts', {
      partId: piston,
      quantity: 1,
      binId: bin.id,
      units: [{ skirt: null }],
      orderLineId: lineOf(piston),
    });
    expect(full.status).toBe(409);
    const other = await staff.post('/api/stock/receipts', {
      partId: piston,
      quantity: 1,
      binId: bin.id,
      units: [{ skirt: null }],
      orderLineId: lineOf(rings),
    });
    expect(other.status).toBe(400);
    expect(other.body.error.details[0].field).toBe('orderLineId');
    const after = await db('stock_ledger')
      .where({ part_id: piston })
      .count<{ n: number }[]>('* as n');
    expect(after[0].n).toBe(before[0].n);
  });

  it('when a delivery nobody ordered is received, then it needs the cost paid and leaves orders alone', async () => {
    const noCost = await staff.post('/api/stock/receipts', {
      partId: rings,
      quantity: 2,
      binId: bin.id,
    });
    expect(noCost.status).toBe(400);
    expect(noCost.body.error.details[0].field).toBe('unitCost');
    const plain = await staff.post('/api/stock/receipts', {
      partId: rings,
      quantity: 2,
      binId: bin.id,
      unitCost: '12.00',
    });
    expect(plain.status).toBe(201);
    expect(plain.body.order).toBeNull();
    expect(plain.body.levels.onHand).toBe(6);
  });
});
