// An order's shipping joins the cost of what it brings in: received stock is valued at its price
// plus its share, by value, by count or not at all as the shop sets it. Worked by hand.
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, signedIn, signedInClients } from '../support/api';
import { makeSupplier } from '../support/purchasing-fixtures';
import { makeBin, makeFamily, makePart, type Family } from '../support/jobs-fixtures';

const { owner, buyer, staff } = signedInClients({ owner: 'mm', buyer: 'mm', staff: 'mm' });
let family: Family;

beforeAll(async () => {
  await saveSettings(null, { homeCurrency: 'EUR', shippingAllocation: 'value' });
  family = await makeFamily(owner);
  await makeBin(owner);
});
afterAll(closeTestApp);

async function sentOrder(shipping?: string) {
  const supplier = await makeSupplier(buyer, {
    currency: 'EUR',
    leadDays: 5,
    shippingCost: '10.00',
  });
  const a = await makePart(owner, family, '+0.010 in', 'rings');
  const b = await makePart(owner, family, '+0.020 in', 'rings');
  const order = await buyer.post('/api/purchase-orders', {
    supplierId: supplier.id,
    lines: [
      { partId: a, quantity: 2, unitPrice: '40.00' },
      { partId: b, quantity: 1, unitPrice: '20.00' },
    ],
    ...(shipping === undefined ? {} : { shipping }),
  });
  expect(order.status).toBe(201);
  expect((await buyer.post(`/api/purchase-orders/${order.body.id}/send`)).status).toBe(200);
  return { order: order.body, a, b };
}

async function averageOf(partId: string): Promise<string> {
  return (await db('parts').where({ id: partId }).first()).average_cost;
}

describe('shipping in the cost of received stock', () => {
  it('when an order of 2 × 40.00 and 1 × 20.00 with 10.00 shipping comes in, then by value the units cost 44.00 and 22.00', async () => {
    const { order, a, b } = await sentOrder();
    // The supplier's usual shipping, unless the buyer gives the order's own.
    expect(order.shipping).toBe('10.00');
    const res = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [
        { lineId: order.lines[0].id, quantity: 1 },
        { lineId: order.lines[1].id, quantity: 1 },
      ],
    });
    expect(res.status).toBe(201);
    // By hand: order value 2 × 40 + 20 = 100; 40 + 10 × 40/100 = 44.00; 20 + 10 × 20/100 = 22.00.
    expect(await averageOf(a)).toBe('44.0000');
    expect(await averageOf(b)).toBe('22.0000');
    // The second unit of the first line, in a later delivery, costs the same.
    await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId: order.lines[0].id, quantity: 1 }],
    });
    expect(await averageOf(a)).toBe('44.0000');
  });

  it('when the shop spreads shipping by count, or not at all, then each unit carries 10 ÷ 3 or nothing', async () => {
    await saveSettings(null, { shippingAllocation: 'quantity' });
    const byCount = await sentOrder();
    await staff.post(`/api/purchase-orders/${byCount.order.id}/receipts`, {
      lines: [{ lineId: byCount.order.lines[1].id, quantity: 1 }],
    });
    // 20 + 10 / 3 = 23.3333.
    expect(await averageOf(byCount.b)).toBe('23.3333');

    await saveSettings(null, { shippingAllocation: 'none' });
    const none = await sentOrder('15.00');
    expect(none.order.shipping).toBe('15.00');
    await staff.post(`/api/purchase-orders/${none.order.id}/receipts`, {
      lines: [{ lineId: none.order.lines[0].id, quantity: 1 }],
    });
    expect(await averageOf(none.a)).toBe('40.0000');
    await saveSettings(null, { shippingAllocation: 'value' });
  });

  it('when a machinist reads the order, then its shipping is not in the answer', async () => {
    const { order } = await sentOrder();
    const machinist = await signedIn('machinist');
    const res = await machinist.get(`/api/purchase-orders/${order.id}`);
    expect(res.status).toBe(200);
    expect(res.body.shipping).toBeUndefined();
  });
});

describe('the purchase order e-mail', () => {
  it("when an order is wanted by a day, then the e-mail writes it the shop's way and the CSV keeps the ISO day", async () => {
    const { orderMail } = await import('../../server/purchasing/order-mail');
    const { findOrder, orderLines } = await import('../../server/purchasing/orders-repository');
    const { order } = await sentOrder();
    const row = await findOrder(order.id);
    const lines = await orderLines([order.id]);
    if (!row) throw new Error('order not found');
    const gb = orderMail('Test shop', row, lines, '2027-03-14', {
      locale: 'en-GB',
      timeZone: 'UTC',
    });
    expect(gb.text).toMatch(/Wanted by:? 14\/03\/2027/);
    const us = orderMail('Test shop', row, lines, '2027-03-14', {
      locale: 'en-US',
      timeZone: 'UTC',
    });
    expect(us.text).toMatch(/Wanted by:? 03\/14\/2027/);
  });
});
