// Purchasing against the real database: exchange rates, sourcing with landed costs, purchase orders
// sent by e-mail with a CSV attachment, receiving against an order (pistons held for the waiting
// jobs, oldest first, and the machinist told by e-mail), drafts from the reorder list, and the
// reorder suggestion worked by hand.
import { db } from '../../server/db/knex';
import { onOrderByPart } from '../../server/purchasing/orders-repository';
import { saveSettings } from '../../server/settings/settings-service';
import { armFault, disarmFaults } from '../../server/testing-faults';
import { gtinCheckDigit } from '../../shared/gtin';
import { closeTestApp, everyRoleSignedIn, uniq } from '../support/api';
import { makeSupplier } from '../support/purchasing-fixtures';
import { localMailbox } from '../support/mailbox';
import { familyAndBin, makeJob, makePart, receivePistons } from '../support/jobs-fixtures';

const smtp = localMailbox();
const { owner, buyer, staff, machinist } = everyRoleSignedIn();
const { family, bin } = familyAndBin(owner, { cylinders: 2 });
let today: string;

beforeAll(async () => {
  await saveSettings(null, {
    timeZone: 'UTC',
    homeCurrency: 'EUR',
    orderCost: '25.00',
    holdingCostRate: '0.25',
    serviceLevel: 0.95,
    shopName: 'Quarry Bend Cylinder Works',
    // Unit costs here are about currency conversion; shipping in the cost has its own tests.
    shippingAllocation: 'none',
  });
  today = new Date().toISOString().slice(0, 10);
  expect((await owner.put('/api/exchange-rates/USD', { rate: '0.9' })).status).toBe(200);
});
afterAll(async () => {
  disarmFaults();
  await closeTestApp();
});

function addDays(iso: string, days: number): string {
  const d = new Date(`${iso}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** What a supplier's price list offers for a part (brought in by an import in real use). */
async function offer(
  supplierId: string,
  partId: string,
  price: string,
  currency: string,
  available: number | null,
  gtin: string | null = null,
) {
  await db('supplier_items').insert({
    supplier_id: supplierId,
    sku: uniq('SI').toUpperCase(),
    description: 'Piston as listed by the supplier',
    part_id: partId,
    price,
    currency,
    available,
    gtin,
  });
}

describe('exchange rates', () => {
  it('when the owner keeps rates, then buyers read them; the home currency and bad rates are refused', async () => {
    const list = await buyer.get('/api/exchange-rates');
    expect(list.status).toBe(200);
    expect(list.body.homeCurrency).toBe('EUR');
    expect(list.body.items).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ currency: 'USD', rate: '0.9', homeCurrency: 'EUR' }),
      ]),
    );
    expect((await buyer.put('/api/exchange-rates/GBP', { rate: '1.17' })).status).toBe(403);
    const home = await owner.put('/api/exchange-rates/EUR', { rate: '1' });
    expect(home.status).toBe(400);
    expect(home.body.error.details[0].field).toBe('currency');
    expect((await owner.put('/api/exchange-rates/GBP', { rate: '0' })).status).toBe(400);
    expect((await owner.put('/api/exchange-rates/XYZ', { rate: '1.2' })).status).toBe(400);
    expect((await owner.put('/api/exchange-rates/GBP', { rate: '1.17' })).status).toBe(200);
    expect((await owner.delete('/api/exchange-rates/GBP')).status).toBe(204);
    expect((await owner.delete('/api/exchange-rates/GBP')).status).toBe(404);
  });
});

describe('GET /api/sourcing', () => {
  let part: string;
  let near: { id: string };
  let far: { id: string };

  beforeAll(async () => {
    part = await makePart(owner, family, '+0.020 in', 'piston');
    near = await makeSupplier(buyer, { currency: 'EUR', leadDays: 5, shippingCost: '10.00' });
    far = await makeSupplier(buyer, { currency: 'USD', leadDays: 20, shippingCost: '20.00' });
    await offer(near.id, part, '50.00', 'EUR', 3);
    await offer(far.id, part, '40.00', 'USD', null);
  });

  it('when two suppliers offer the part, then each offer has its landed cost in the home currency and the cheapest is best', async () => {
    const res = await buyer.get(`/api/sourcing?partId=${part}&quantity=2`);
    expect(res.status).toBe(200);
    // Worked by hand: near 50.00 EUR + 10.00 EUR shipping ÷ 2 = 55.00 EUR;
    // far (40.00 USD + 20.00 USD ÷ 2) × 0.9 = 36.00 + 9.00 = 45.00 EUR.
    const byId = Object.fromEntries(
      res.body.offers.map((o: { supplierId: string }) => [o.supplierId, o]),
    );
    expect(byId[near.id]).toEqual(
      expect.objectContaining({
        supplierId: near.id,
        price: '50.00',
        currency: 'EUR',
        landedCost: '55.00',
        available: 3,
        leadDays: 5,
        seenAt: expect.any(String),
      }),
    );
    expect(byId[far.id]).toEqual(
      expect.objectContaining({
        supplierId: far.id,
        price: '40.00',
        currency: 'USD',
        landedCost: '45.00',
        available: null,
        leadDays: 20,
      }),
    );
    expect(res.body.best).toEqual(expect.objectContaining({ supplierId: far.id }));
    expect(res.body.scarce).toBe(false);
    expect(res.body.free).toBe(0);
  });

  it('when the part is needed within ten days, then the best offer is the one that arrives in time', async () => {
    const res = await buyer.get(
      `/api/sourcing?familyId=${family.id}&stepId=${family.steps['+0.020 in']}&quantity=2&neededBy=${addDays(today, 10)}`,
    );
    expect(res.status).toBe(200);
    expect(res.body.best).toEqual(
      expect.objectContaining({ supplierId: near.id, arrivesBy: addDays(today, 5) }),
    );
    const late = await buyer.get(`/api/sourcing?partId=${part}&neededBy=${addDays(today, 2)}`);
    expect(late.body.best).toBeNull();
    expect(late.body.bestHow).toMatch(/No offer arrives by/);
  });

  it('when nothing is free and only one supplier still has it, then the step is flagged scarce', async () => {
    await db('supplier_items')
      .where({ supplier_id: far.id, part_id: part })
      .update({ available: 0 });
    const res = await buyer.get(`/api/sourcing?partId=${part}`);
    expect(res.body.suppliersOffering).toBe(1);
    expect(res.body.scarce).toBe(true);
    await db('supplier_items')
      .where({ supplier_id: far.id, part_id: part })
      .update({ available: null });
  });

  it('when the query names neither a part nor a step, then 400; staff may not source', async () => {
    expect((await buyer.get('/api/sourcing')).status).toBe(400);
    expect((await buyer.get(`/api/sourcing?familyId=${family.id}`)).status).toBe(400);
    expect((await staff.get(`/api/sourcing?partId=${part}`)).status).toBe(403);
  });
});

describe('purchase orders, receiving and waiting jobs', () => {
  let part: string;
  let supplier: { id: string; name: string; email: string | null };
  let order: { id: string; number: string; lines: { id: string }[] };
  let olderJob: { id: string; number: string };
  let newerJob: { id: string; number: string };
  const gtin = (() => {
    const body = `0${String(Date.now()).slice(-11)}`;
    return `${body}${gtinCheckDigit(body)}`;
  })();

  beforeAll(async () => {
    part = await makePart(owner, family, '+0.030 in', 'piston');
    expect((await owner.patch(`/api/parts/${part}`, { gtin })).status).toBe(200);
    supplier = await makeSupplier(buyer, { currency: 'USD', leadDays: 12, shippingCost: '15.00' });
    await offer(supplier.id, part, '38.00', 'USD', 10);
  });

  it('when the buyer creates an order, then 201 and it is being drafted', async () => {
    const res = await buyer.post('/api/purchase-orders', {
      supplierId: supplier.id,
      lines: [{ partId: part, quantity: 2, unitPrice: '38.00' }],
    });
    expect(res.status).toBe(201);
    expect(res.body).toEqual(
      expect.objectContaining({
        supplierId: supplier.id,
        currency: 'USD',
        state: 'drafting',
        total: '76.00',
        number: expect.stringMatching(/^PO-\d{4}-\d{4,}$/),
      }),
    );
    expect(res.body.lines).toEqual([
      expect.objectContaining({
        partId: part,
        quantity: 2,
        received: 0,
        open: 2,
        unitPrice: '38.00',
      }),
    ]);
    order = res.body;
    const twice = await buyer.post('/api/purchase-orders', {
      supplierId: supplier.id,
      lines: [
        { partId: part, quantity: 1, unitPrice: '38.00' },
        { partId: part, quantity: 1, unitPrice: '38.00' },
      ],
    });
    expect(twice.status).toBe(400);
    expect(twice.body.error.details[0].field).toBe('lines.1.partId');
    expect(
      (await staff.post('/api/purchase-orders', { supplierId: supplier.id, lines: [] })).status,
    ).toBe(403);
    expect(
      (await buyer.post('/api/purchase-orders', { supplierId: supplier.id, lines: [] })).status,
    ).toBe(400);
    // A price sent as a JSON number is read by its decimal writing; a negative one is refused.
    const numeric = await buyer.post('/api/purchase-orders', {
      supplierId: supplier.id,
      lines: [{ partId: part, quantity: 1, unitPrice: 38.4 }],
    });
    expect(numeric.status).toBe(201);
    expect(numeric.body.lines[0].unitPrice).toBe('38.40');
    expect((await buyer.post(`/api/purchase-orders/${numeric.body.id}/cancel`)).status).toBe(200);
    const negative = await buyer.post('/api/purchase-orders', {
      supplierId: supplier.id,
      lines: [{ partId: part, quantity: 1, unitPrice: -1 }],
    });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details[0].field).toBe('lines.0.unitPrice');
  });

  it('when a drafting order is received against, then 409: it has not been sent', async () => {
    const res = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId: order.lines[0].id, quantity: 1, units: [{ skirt: '2.5468 in' }] }],
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('order_not_open');
  });

  it('when the order is sent, then the supplier gets one e-mail with the lines as a CSV attachment and the lines count as on order', async () => {
    const res = await buyer.post(`/api/purchase-orders/${order.id}/send`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual(
      expect.objectContaining({
        state: 'sent_out',
        stateLabel: 'Sent out',
        expectedOn: addDays(today, 12),
        sentAt: expect.any(String),
      }),
    );
    expect((await buyer.post(`/api/purchase-orders/${order.id}/send`)).status).toBe(409);

    await smtp.deliver();
    const got = smtp.received.filter((m) => m.to.includes(supplier.email as string));
    expect(got).toHaveLength(1);
    expect(got[0].subject).toBe(`Purchase order ${order.number} from Quarry Bend Cylinder Works`);
    expect(got[0].attachments).toHaveLength(1);
    expect(got[0].attachments[0].filename).toBe(`${order.number}.csv`);
    const csv = got[0].attachments[0].content.trim().split('\n');
    expect(csv[0]).toBe(
      'line,supplier_sku,our_sku,description,quantity,unit_price,currency,line_total',
    );
    expect(csv[1]).toMatch(
      /^1,SI-[0-9A-F]{8},PST-[0-9A-F]{8},Cast piston \+0\.030 in,2,38\.00,USD,76\.00$/,
    );

    expect((await onOrderByPart([part])).get(part)).toBe(2);
    const ladder = await buyer.get(`/api/engine-families/${family.id}/ladder`);
    const step = ladder.body.steps.find((s: { label: string }) => s.label === '+0.030 in');
    expect(step.pistons.onOrder).toBe(2);
  });

  it('when a supplier has no ordering address, then sending is 409', async () => {
    const silent = await makeSupplier(buyer, {
      currency: 'EUR',
      leadDays: 3,
      shippingCost: '0',
      email: null,
    });
    const draft = await buyer.post('/api/purchase-orders', {
      supplierId: silent.id,
      lines: [{ partId: part, quantity: 1, unitPrice: '40.00' }],
    });
    const res = await buyer.post(`/api/purchase-orders/${draft.body.id}/send`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('no_supplier_email');
  });

  it('when jobs wait on the line, then the machinist sets them and the older job comes first', async () => {
    olderJob = await makeJob(machinist, family.id, { customerEmail: 'pell.ashdown@example.test' });
    newerJob = await makeJob(machinist, family.id, { customerEmail: null });
    const first = await machinist.post('/api/order-waits', {
      jobId: newerJob.id,
      cylinder: 1,
      lineId: order.lines[0].id,
    });
    expect(first.status).toBe(201);
    const second = await machinist.post('/api/order-waits', {
      jobId: olderJob.id,
      cylinder: 1,
      lineId: order.lines[0].id,
    });
    expect(second.status).toBe(201);
    const again = await machinist.post('/api/order-waits', {
      jobId: olderJob.id,
      cylinder: 1,
      lineId: order.lines[0].id,
    });
    expect(again.status).toBe(409);
    const list = await staff.get(`/api/order-waits?lineId=${order.lines[0].id}`);
    expect(list.body.items.map((w: { jobNumber: string }) => w.jobNumber)).toEqual([
      olderJob.number,
      newerJob.number,
    ]);
    expect(
      (
        await staff.post('/api/order-waits', {
          jobId: olderJob.id,
          cylinder: 2,
          lineId: order.lines[0].id,
        })
      ).status,
    ).toBe(403);
  });

  it('when a GTIN is scanned at the bench, then the open line it belongs to is found', async () => {
    const res = await staff.get(`/api/purchase-orders/open-lines?gtin=${gtin}`);
    expect(res.status).toBe(200);
    expect(res.body.items).toEqual([
      expect.objectContaining({
        orderId: order.id,
        orderNumber: order.number,
        line: expect.objectContaining({ id: order.lines[0].id }),
      }),
    ]);
    const bad = await staff.get(
      `/api/purchase-orders/open-lines?gtin=${gtin.slice(0, -1)}${(Number(gtin.slice(-1)) + 1) % 10}`,
    );
    expect(bad.status).toBe(400);
  });

  it('when a receipt asks for more than is open, gives the wrong number of pistons or an impossible skirt, then 400 naming the field and nothing is written', async () => {
    const lineId = order.lines[0].id;
    const tooMany = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId, quantity: 3, units: [{}, {}, {}] }],
    });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details[0].field).toBe('lines.0.quantity');
    const count = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId, quantity: 2, units: [{ skirt: '2.5468 in' }] }],
    });
    expect(count.status).toBe(400);
    expect(count.body.error.details[0].field).toBe('lines.0.units');
    const inchesAsMm = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId, quantity: 1, units: [{ skirt: '2.5468 mm' }] }],
    });
    expect(inchesAsMm.status).toBe(400);
    expect(inchesAsMm.body.error.details[0].field).toBe('lines.0.units.0.skirt');
    expect((await db('purchase_order_lines').where({ id: lineId }).first()).received_quantity).toBe(
      0,
    );
    expect(await db('piston_units').where({ part_id: part })).toHaveLength(0);
  });

  it('when the receipt fails half-way, then nothing of it is kept', async () => {
    armFault('purchasing.receipt.afterStock');
    const res = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId: order.lines[0].id, quantity: 1, units: [{ skirt: '2.5468 in' }] }],
    });
    expect(res.status).toBe(500);
    expect(await db('piston_units').where({ part_id: part })).toHaveLength(0);
    expect(await db('stock_ledger').where({ part_id: part })).toHaveLength(0);
    expect(await db('purchase_order_receipts').where({ order_id: order.id })).toHaveLength(0);
    expect(
      (await db('purchase_order_lines').where({ id: order.lines[0].id }).first()).received_quantity,
    ).toBe(0);
  });

  it('when one measured piston is received, then it is held for the older waiting job and the machinist and the customer get an e-mail', async () => {
    const res = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId: order.lines[0].id, quantity: 1, units: [{ skirt: '2.5468 in' }] }],
    });
    expect(res.status).toBe(201);
    expect(res.body.order).toEqual(expect.objectContaining({ state: 'partly_in' }));
    expect(res.body.order.lines[0]).toEqual(expect.objectContaining({ received: 1, open: 1 }));
    expect(res.body.holds).toEqual([
      expect.objectContaining({
        jobId: olderJob.id,
        jobNumber: olderJob.number,
        cylinder: 1,
        skirt: { mm: '64.68872', in: '2.5468' },
      }),
    ]);
    const unit = await db('piston_units').where({ id: res.body.holds[0].unitId }).first();
    expect(unit).toEqual(
      expect.objectContaining({
        status: 'held',
        held_for_job_id: olderJob.id,
        held_cylinder: 1,
        skirt_nm: 64_688_720,
      }),
    );
    // Stock is kept at cost in the home currency: 38.00 USD × 0.9 = 34.20 EUR.
    expect(unit.unit_cost).toBe('34.2000');
    const waits = await db('order_line_waits')
      .where({ line_id: order.lines[0].id })
      .orderBy('created_at');
    expect(waits.map((w) => ({ job: w.job_id, done: w.fulfilled_at !== null }))).toEqual([
      { job: newerJob.id, done: false },
      { job: olderJob.id, done: true },
    ]);
    const job = await machinist.get(`/api/jobs/${olderJob.id}`);
    expect(job.body.pistonsHeld).toBe(1);

    await smtp.deliver();
    const me = machinist.user?.email as string;
    const told = smtp.received.filter(
      (m) => m.to.includes(me) && m.subject.includes(olderJob.number),
    );
    expect(told).toHaveLength(1);
    expect(told[0].subject).toBe(
      `Piston in for job ${olderJob.number}: ${unit.label} held for cylinder 1`,
    );
    expect(told[0].text).toContain('2.5468 in');
    expect(told[0].text).toContain(`/jobs/${olderJob.id}`);
    const customer = smtp.received.filter((m) => m.to.includes('pell.ashdown@example.test'));
    expect(customer).toHaveLength(1);
    expect(customer[0].text).toContain(olderJob.number);
  });

  it('when the rest arrives, then the next job in line gets it and the order is all in', async () => {
    const res = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId: order.lines[0].id, quantity: 1, units: [{ skirt: '2.5466 in' }] }],
    });
    expect(res.status).toBe(201);
    expect(res.body.order.state).toBe('all_in');
    expect(res.body.holds).toEqual([expect.objectContaining({ jobId: newerJob.id })]);
    expect((await onOrderByPart([part])).get(part)).toBeUndefined();
    const done = await staff.post(`/api/purchase-orders/${order.id}/receipts`, {
      lines: [{ lineId: order.lines[0].id, quantity: 1, units: [{ skirt: '2.5466 in' }] }],
    });
    expect(done.status).toBe(409);
  });

  it('when an order is called off, then its open waits end and nothing stays on order', async () => {
    const draft = await buyer.post('/api/purchase-orders', {
      supplierId: supplier.id,
      lines: [{ partId: part, quantity: 1, unitPrice: '38.00' }],
    });
    await buyer.post(`/api/purchase-orders/${draft.body.id}/send`);
    const job = await makeJob(machinist, family.id);
    const wait = await machinist.post('/api/order-waits', {
      jobId: job.id,
      cylinder: 1,
      lineId: draft.body.lines[0].id,
    });
    expect(wait.status).toBe(201);
    const res = await buyer.post(`/api/purchase-orders/${draft.body.id}/cancel`);
    expect(res.status).toBe(200);
    expect(res.body.state).toBe('called_off');
    expect(
      (await db('order_line_waits').where({ id: wait.body.id }).first()).cancelled_at,
    ).toBeInstanceOf(Date);
    expect((await onOrderByPart([part])).get(part)).toBeUndefined();
    expect((await buyer.post(`/api/purchase-orders/${draft.body.id}/cancel`)).status).toBe(409);
  });

  it('when orders are listed, then staff see them without their totals (the prices are costs)', async () => {
    const res = await staff.get(`/api/purchase-orders?supplierId=${supplier.id}&state=all_in`);
    expect(res.status).toBe(200);
    expect(res.body.items).toEqual([
      expect.objectContaining({
        id: order.id,
        lines: 1,
        quantity: 2,
        received: 2,
        stateLabel: 'All in',
      }),
    ]);
    expect(res.body.items[0]).not.toHaveProperty('total');
    expect(res.body.total).toBe(1);
  });
});

describe('POST /api/purchase-orders/drafts', () => {
  it('when parts are at their reorder point, then drafts go to the best supplier with the quantity up to the order-up-to level', async () => {
    const cheap = await makeSupplier(buyer, { currency: 'EUR', leadDays: 4, shippingCost: '0' });
    const dear = await makeSupplier(buyer, { currency: 'EUR', leadDays: 4, shippingCost: '0' });
    const low = await makePart(owner, family, '+0.040 in', 'piston');
    const nobody = await makePart(owner, family, '+0.040 in', 'rings');
    await offer(cheap.id, low, '30.00', 'EUR', null);
    await offer(dear.id, low, '33.00', 'EUR', null);
    expect(
      (await buyer.put(`/api/parts/${low}/reorder-rule`, { reorderPoint: 2, orderUpTo: 6 })).status,
    ).toBe(200);
    expect(
      (await buyer.put(`/api/parts/${nobody}/reorder-rule`, { reorderPoint: 1, orderUpTo: 3 }))
        .status,
    ).toBe(200);

    const res = await buyer.post('/api/purchase-orders/drafts', { partIds: [low, nobody] });
    expect(res.status).toBe(201);
    expect(res.body.orders).toEqual([
      expect.objectContaining({
        supplierId: cheap.id,
        state: 'drafting',
        lines: [expect.objectContaining({ partId: low, quantity: 6, unitPrice: '30.00' })],
      }),
    ]);
    expect(res.body.unsourced).toEqual([expect.objectContaining({ partId: nobody, quantity: 3 })]);
    // Drafting again leaves out what is already on a draft.
    const again = await buyer.post('/api/purchase-orders/drafts', { partIds: [low] });
    expect(again.body.orders).toEqual([]);
  });
});

describe('drafts that differ from the suggestion', () => {
  it('when the cheapest supplier says it has 3 of the 6 suggested and nobody has all 6, then 3 go to it, 3 to the next, and the page is told why', async () => {
    const cheap = await makeSupplier(buyer, { currency: 'EUR', leadDays: 4, shippingCost: '0' });
    const next = await makeSupplier(buyer, { currency: 'EUR', leadDays: 4, shippingCost: '0' });
    const part = await makePart(owner, family, '+0.030 in', 'piston');
    await offer(cheap.id, part, '30.00', 'EUR', 3);
    await offer(next.id, part, '34.00', 'EUR', 4);
    expect(
      (await buyer.put(`/api/parts/${part}/reorder-rule`, { reorderPoint: 2, orderUpTo: 6 }))
        .status,
    ).toBe(200);

    const res = await buyer.post('/api/purchase-orders/drafts', { partIds: [part] });
    expect(res.status).toBe(201);
    const lines = res.body.orders.map(
      (o: { supplierId: string; lines: { partId: string; quantity: number }[] }) => [
        o.supplierId,
        o.lines.map((l) => l.quantity),
      ],
    );
    expect(lines).toEqual(
      expect.arrayContaining([
        [cheap.id, [3]],
        [next.id, [3]],
      ]),
    );
    expect(res.body.adjusted).toEqual([
      expect.objectContaining({
        partId: part,
        suggested: 6,
        uncovered: 0,
        shares: [
          expect.objectContaining({ supplierId: cheap.id, quantity: 3, available: 3 }),
          expect.objectContaining({ supplierId: next.id, quantity: 3, available: 4 }),
        ],
      }),
    ]);
    expect(res.body.adjusted[0].why).toContain(`${cheap.name} says it has 3`);
    expect(res.body.adjusted[0].why).toContain(`3 from ${next.name}`);
  });

  it('when the only supplier says it has 2 of 5, then 2 are drafted and 3 are named as not covered', async () => {
    const only = await makeSupplier(buyer, { currency: 'EUR', leadDays: 4, shippingCost: '0' });
    const part = await makePart(owner, family, '+0.030 in', 'rings');
    await offer(only.id, part, '12.00', 'EUR', 2);
    await buyer.put(`/api/parts/${part}/reorder-rule`, { reorderPoint: 1, orderUpTo: 5 });
    const res = await buyer.post('/api/purchase-orders/drafts', { partIds: [part] });
    expect(res.status).toBe(201);
    expect(res.body.orders[0].lines).toEqual([
      expect.objectContaining({ partId: part, quantity: 2 }),
    ]);
    expect(res.body.adjusted[0]).toEqual(expect.objectContaining({ suggested: 5, uncovered: 3 }));
    expect(res.body.adjusted[0].why).toMatch(/3 not covered/);
  });
});

describe('parts nobody offers, and the mapping queue', () => {
  it('when an unmapped supplier item has the part as a suggestion, then sourcing and the drafts name it as waiting to be mapped', async () => {
    const supplier = await makeSupplier(buyer, { currency: 'EUR', leadDays: 4, shippingCost: '0' });
    const part = await makePart(owner, family, '+0.040 in', 'piston');
    const sku = (await owner.get(`/api/parts/${part}`)).body.sku as string;
    // Same SKU as ours: the queue suggests this part first (an SKU match is near certain).
    await db('supplier_items').insert({
      supplier_id: supplier.id,
      sku,
      description: 'Piston, not yet mapped',
      part_id: null,
      price: '41.00',
      currency: 'EUR',
      available: null,
    });
    const queue = await buyer.get(`/api/supplier-items/unmapped?q=${encodeURIComponent(sku)}`);
    expect(queue.status).toBe(200);
    expect(queue.body.items[0].suggestions.map((s: { id: string }) => s.id)).toContain(part);

    const src = await buyer.get(`/api/sourcing?partId=${part}`);
    expect(src.status).toBe(200);
    expect(src.body.offers).toEqual([]);
    expect(src.body.part).toEqual(
      expect.objectContaining({
        id: part,
        sku,
        familyId: family.id,
        stepId: family.steps['+0.040 in'],
      }),
    );
    expect(src.body.waiting).toEqual([
      expect.objectContaining({ supplierId: supplier.id, supplierSku: sku, partId: part }),
    ]);

    await buyer.put(`/api/parts/${part}/reorder-rule`, { reorderPoint: 1, orderUpTo: 2 });
    const drafts = await buyer.post('/api/purchase-orders/drafts', { partIds: [part] });
    expect(drafts.body.unsourced).toEqual([
      expect.objectContaining({
        partId: part,
        quantity: 2,
        waiting: [expect.objectContaining({ supplierId: supplier.id, supplierSku: sku })],
      }),
    ]);
  });
});

describe('GET /api/parts/:id/reorder-suggestion', () => {
  it('when a part was issued 2, 1 and 3 on three days of fourteen, then the reorder point and order quantity match the hand calculation', async () => {
    const part = await makePart(owner, family, '+0.010 in', 'piston');
    await receivePistons(owner, part, bin.id, ['2.5268 in'], '41.20');
    const day = (n: number) => new Date(`${addDays(today, -n)}T12:00:00Z`);
    await db('stock_ledger').insert([
      { part_id: part, kind: 'issue', quantity: -2, at: day(2) },
      { part_id: part, kind: 'issue', quantity: -1, at: day(5) },
      { part_id: part, kind: 'issue', quantity: -3, at: day(9) },
    ]);
    const res = await buyer.get(
      `/api/parts/${part}/reorder-suggestion?windowDays=14&leadDays=7&serviceLevel=0.95`,
    );
    expect(res.status).toBe(200);
    // Worked by hand (our own example):
    //   daily demand over 14 days: 2, 1, 3 and eleven zeros; total 6; mean 6/14 = 0.428571.
    //   sample variance = (2² + 1² + 3² − 14 × 0.428571²) / 13 = (14 − 2.571429) / 13 = 0.879121;
    //   σ = √0.879121 = 0.937614.
    //   demand over 7 days' lead = 0.428571 × 7 = 3.0.
    //   z for 95% = 1.6449 (standard normal table); safety = 1.6449 × 0.937614 × √7 = 4.0803.
    //   reorder point = 3.0 + 4.0803 = 7.0803, rounded up to 8.
    //   EOQ (Wilson): annual demand 0.428571 × 365 = 156.43; holding = 0.25 × 41.20 = 10.30 a year;
    //   √(2 × 156.43 × 25.00 / 10.30) = √759.36 = 27.56 → 28; order up to 8 + 28 = 36.
    expect(res.body.issued.value).toBe(6);
    expect(res.body.meanDaily.value).toBeCloseTo(0.428571, 5);
    expect(res.body.sigmaDaily.value).toBeCloseTo(0.937614, 4);
    expect(res.body.z.value).toBeCloseTo(1.6449, 4);
    expect(res.body.safetyStock.value).toBeCloseTo(4.08, 2);
    expect(res.body.reorderPoint.value).toBe(8);
    expect(res.body.orderQuantity.value).toBe(28);
    expect(res.body.orderUpTo.value).toBe(36);
    expect(res.body.reorderPoint.how).toMatch(/rounded up to 8/);
    expect(res.body.leadDays.how).toMatch(/as asked/);

    const defaults = await buyer.get(`/api/parts/${part}/reorder-suggestion?windowDays=14`);
    expect(defaults.body.leadDays.how).toMatch(/assumed/);
    expect((await buyer.get(`/api/parts/${part}/reorder-suggestion?windowDays=3`)).status).toBe(
      400,
    );
    expect((await staff.get(`/api/parts/${part}/reorder-suggestion`)).status).toBe(403);
  });
});
