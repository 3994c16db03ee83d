// Who sees which money (ASVS 4.0.3 V4.2.1, V8.3.4: data a role may not read is not in the answers
// it gets). The owner sees all; the buyer sees costs, not what was sold for nor margins; staff see
// sale prices, not costs; machinists see neither. Checked on the answers that carry money (the
// ledger, parts, units, receipts, purchase orders, the stock export) and swept over every list the
// role may read, so an answer that forgets to declare its money is caught too.
import { db } from '../../server/db/knex';
import { declaredRoutes } from '../../server/http/route';
import type { Role } from '../../shared/session-types';
import { type Client, closeTestApp, signedIn } from '../support/api';
import { makeBin, makeFamily, makePart, receiveCounted } from '../support/jobs-fixtures';

const clients = {} as Record<Role, Client>;
let partId: string;
let orderId: string;
let binId: string;

beforeAll(async () => {
  for (const role of ['owner', 'buyer', 'staff', 'machinist'] as Role[]) {
    clients[role] = await signedIn(role);
  }
  const owner = clients.owner;
  const family = await makeFamily(owner);
  binId = await makeBin(owner);
  partId = await makePart(owner, family, '+0.020 in', 'rings', '34.50');
  await receiveCounted(owner, partId, binId, 4, '12.40');
  // One sale, written the way the stock service writes an issue: a ledger row carrying the unit's
  // cost and the price it sold for, and the level lowered to match.
  await db('stock_ledger').insert({
    part_id: partId,
    kind: 'issue',
    quantity: -1,
    unit_cost: '12.40',
    sale_price: '34.50',
    from_bin_id: binId,
    ref: 'money-visibility test',
  });
  await db('part_levels').where({ part_id: partId }).decrement('on_hand', 1);
  const supplier = await clients.buyer.post('/api/suppliers', {
    name: `Money test supplier ${partId.slice(0, 8)}`,
    email: `money-${partId.slice(0, 8)}@example.test`,
    currency: 'EUR',
    leadDays: 3,
    shippingCost: '0',
  });
  expect(supplier.status).toBe(201);
  const order = await clients.buyer.post('/api/purchase-orders', {
    supplierId: supplier.body.id,
    lines: [{ partId, quantity: 2, unitPrice: '11.75' }],
  });
  expect(order.status).toBe(201);
  orderId = order.body.id;
});

afterAll(async () => {
  await closeTestApp();
});

/** Every property name in an answer whose value is a string or null (money is sent as text). */
function textKeys(value: unknown, into = new Set<string>()): Set<string> {
  if (Array.isArray(value)) value.forEach((v) => textKeys(v, into));
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      if (typeof v === 'string' || v === null) into.add(k);
      else textKeys(v, into);
    }
  }
  return into;
}

// What each role must not find, anywhere in an answer: the shop's costs, what it sold for, and
// margins. Names as the API spells them (shared/api/stock.ts, catalog.ts, purchasing.ts,
// insights-api.ts).
const COST = ['unitCost', 'averageCost', 'costOfIssues', 'totalCostOfIssues', 'openingValue'];
const SOLD = ['revenue'];
const MARGIN = ['margin'];
const MUST_NOT_SEE: Record<Exclude<Role, 'owner'>, string[]> = {
  buyer: [...SOLD, ...MARGIN],
  staff: [...COST, ...MARGIN],
  machinist: [...COST, ...SOLD, ...MARGIN],
};

describe('ASVS 4.0.3 V4.2.1 / V8.3.4 money fields by role', () => {
  it('when each role reads the issues in the ledger, then the owner gets cost and sale price, the buyer only the cost, staff only the sale price, a machinist neither', async () => {
    const seen: Record<string, { unitCost?: unknown; salePrice?: unknown }> = {};
    for (const role of ['owner', 'buyer', 'staff', 'machinist'] as Role[]) {
      const res = await clients[role].get(`/api/stock/ledger?kind=issue&partId=${partId}`);
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(1);
      const [issue] = res.body.items;
      expect(issue.quantity).toBe(-1);
      seen[role] = { unitCost: issue.unitCost, salePrice: issue.salePrice };
    }
    expect(seen).toEqual({
      owner: { unitCost: '12.40', salePrice: '34.50' },
      buyer: { unitCost: '12.40', salePrice: undefined },
      staff: { unitCost: undefined, salePrice: '34.50' },
      machinist: { unitCost: undefined, salePrice: undefined },
    });
  });

  it('when each role reads the part, then only the owner and the buyer get its average cost; everyone gets its list price and levels', async () => {
    for (const role of ['owner', 'buyer', 'staff', 'machinist'] as Role[]) {
      const one = await clients[role].get(`/api/parts/${partId}`);
      const list = await clients[role].get(`/api/parts?q=${encodeURIComponent(one.body.sku)}`);
      expect(one.status).toBe(200);
      expect(list.body.items).toHaveLength(1);
      for (const part of [one.body, list.body.items[0]]) {
        expect(part.salePrice).toBe('34.50');
        expect(part.onHand).toBe(3);
        if (role === 'owner' || role === 'buyer') expect(part.averageCost).toBe('12.40');
        else expect(part).not.toHaveProperty('averageCost');
      }
    }
  });

  it('when staff receive stock, then the answer says what came in without the unit or average cost', async () => {
    const res = await clients.staff.post('/api/stock/receipts', {
      partId,
      quantity: 1,
      binId,
      unitCost: '13.00',
    });
    expect(res.status).toBe(201);
    expect(res.body.levels).toEqual({ onHand: 4, held: 0, free: 4 });
    for (const key of COST) expect(textKeys(res.body).has(key)).toBe(false);
    const owner = await clients.owner.get(`/api/parts/${partId}`);
    // (3 × 12.40 + 13.00) ÷ 4 = 12.55, the moving average (worked by hand).
    expect(owner.body.averageCost).toBe('12.55');
  });

  it('when staff and machinists read a purchase order, then its prices and totals are gone; the buyer and the owner get them', async () => {
    for (const role of ['owner', 'buyer', 'staff', 'machinist'] as Role[]) {
      const one = await clients[role].get(`/api/purchase-orders/${orderId}`);
      const list = await clients[role].get('/api/purchase-orders?pageSize=500');
      expect(one.status).toBe(200);
      const listed = list.body.items.find((o: { id: string }) => o.id === orderId);
      expect(typeof list.body.total).toBe('number');
      if (role === 'owner' || role === 'buyer') {
        expect(one.body.total).toBe('23.50');
        expect(one.body.lines[0]).toEqual(
          expect.objectContaining({ unitPrice: '11.75', lineTotal: '23.50' }),
        );
        expect(listed.total).toBe('23.50');
      } else {
        expect(one.body).not.toHaveProperty('total');
        expect(one.body.lines[0]).not.toHaveProperty('unitPrice');
        expect(one.body.lines[0]).not.toHaveProperty('lineTotal');
        expect(one.body.lines[0].quantity).toBe(2);
        expect(listed).not.toHaveProperty('total');
      }
    }
  });

  it('when staff export the stock list, then it has no average cost column; the buyer gets one', async () => {
    const staff = await clients.staff.get('/api/exports/stock.csv');
    const buyer = await clients.buyer.get('/api/exports/stock.csv');
    expect(staff.status).toBe(200);
    expect(staff.text.split('\n')[0]).not.toMatch(/Average cost/);
    expect(staff.text.split('\n')[0]).toMatch(/Sale price/);
    expect(buyer.text.split('\n')[0]).toMatch(/Average cost/);
  });

  it('when every list a non-owner may read is fetched, then none carries a money field that role may not see', async () => {
    const lists = declaredRoutes.filter(
      (r) =>
        r.method === 'get' &&
        !r.path.includes(':') &&
        !r.path.endsWith('.csv') &&
        r.access !== 'public',
    );
    expect(lists.length).toBeGreaterThan(20);
    const leaks: string[] = [];
    for (const role of ['buyer', 'staff', 'machinist'] as const) {
      for (const r of lists) {
        if (r.access !== 'signed-in' && !r.access.includes(role)) continue;
        const res = await clients[role].get(r.path);
        if (res.status !== 200) continue;
        const keys = textKeys(res.body);
        for (const key of MUST_NOT_SEE[role]) {
          if (keys.has(key)) leaks.push(`${role} GET ${r.path}: ${key}`);
        }
      }
    }
    expect(leaks).toEqual([]);
  });
});
