// The home page's summary of the day's work, against the real app and database: each role gets
// its own sections; jobs due today or overdue, jobs waiting for parts or for the customer's
// approval, unseen stock alerts and orders on the way are counted as their own pages count them.
import { DateTime } from 'luxon';
import request from 'supertest';
import { HOME_LIST_LENGTH, HOME_SECTIONS_BY_ROLE, type HomeJson } from '../../shared/api/home';
import type { Role } from '../../shared/session-types';
import { type Client, closeTestApp, everyRoleSignedIn, testApp, uniq } from '../support/api';
import {
  makeFamily,
  makeJob,
  makePart,
  WORN_READINGS,
  type Family,
} from '../support/jobs-fixtures';
import { makeLabour, makePricedJob } from '../support/money-fixtures';

const { owner, buyer, machinist, staff } = everyRoleSignedIn();
let family: Family;

beforeAll(async () => {
  family = await makeFamily(owner, { cylinders: 1 });
});
afterAll(async () => {
  await closeTestApp();
});

async function home(client: Client): Promise<HomeJson> {
  const res = await client.get('/api/home');
  expect(res.status).toBe(200);
  return res.body as HomeJson;
}

function shift(today: string, days: number): string {
  return DateTime.fromISO(today).plus({ days }).toISODate() as string;
}

describe('GET /api/home', () => {
  it('when nobody is signed in, then 401', async () => {
    expect((await request(testApp()).get('/api/home')).status).toBe(401);
  });

  it.each<[Role, string[]]>([
    ['owner', ['dueToday', 'waitingForParts', 'waitingForApproval', 'alerts', 'ordersArriving']],
    ['buyer', ['waitingForParts', 'alerts', 'ordersArriving']],
    ['machinist', ['dueToday', 'waitingForParts', 'waitingForApproval']],
    ['staff', ['dueToday', 'waitingForApproval', 'ordersArriving']],
  ])('when a %s asks, then only that role’s sections come back', async (role, sections) => {
    const client = { owner, buyer, machinist, staff }[role];
    const body = await home(client);
    expect(Object.keys(body).sort()).toEqual(['today', ...sections].sort());
    expect([...HOME_SECTIONS_BY_ROLE[role]].sort()).toEqual([...sections].sort());
    expect(body.today).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    for (const s of sections) {
      const list = body[s as keyof Omit<HomeJson, 'today'>]!;
      expect(list.items.length).toBeLessThanOrEqual(Math.min(HOME_LIST_LENGTH, list.total));
    }
  });

  it('when jobs are due yesterday, today and tomorrow, then the first two count as due and the overdue one says so', async () => {
    const before = await home(machinist);
    const today = before.today;
    const late = await makeJob(staff, family.id, { dueDate: shift(today, -1) });
    const now = await makeJob(staff, family.id, { dueDate: today });
    await makeJob(staff, family.id, { dueDate: shift(today, 1) });
    const off = await makeJob(staff, family.id, { dueDate: today });
    expect((await owner.post(`/api/jobs/${off.id}/cancel`)).status).toBe(200);

    const after = await home(machinist);
    expect(after.dueToday!.total).toBe(before.dueToday!.total + 2);
    const dues = after.dueToday!.items.map((j) => j.dueDate!);
    expect(dues).toEqual([...dues].sort());
    expect(dues.every((d) => d <= today)).toBe(true);
    if (after.dueToday!.total <= HOME_LIST_LENGTH) {
      const mine = after.dueToday!.items.filter((j) => [late.id, now.id].includes(j.id));
      expect(mine.map((j) => [j.number, j.overdue])).toEqual([
        [late.number, true],
        [now.number, false],
      ]);
      expect(mine[0].familyCode).toBe(family.code);
      expect(mine[0].customerName).toBe('Odile Farrant');
    }
  });

  it('when a chosen step has no piston free, then the job counts as waiting for parts, as the bench filter counts it', async () => {
    const before = await home(buyer);
    const job = await makeJob(staff, family.id);
    expect(
      (await machinist.put(`/api/jobs/${job.id}/cylinders/1/readings`, { readings: WORN_READINGS }))
        .status,
    ).toBe(200);
    expect(
      (
        await machinist.patch(`/api/jobs/${job.id}/cylinders/1`, {
          stepId: family.steps['+0.040 in'],
        })
      ).status,
    ).toBe(200);
    const after = await home(buyer);
    expect(after.waitingForParts!.total).toBe(before.waitingForParts!.total + 1);
    const bench = await buyer.get('/api/jobs?state=open&waiting=true&pageSize=1');
    expect(after.waitingForParts!.total).toBe(bench.body.total);
  });

  it('when an estimate is sent and unanswered, then its job waits for approval until the customer agrees', async () => {
    await makeLabour(owner);
    const before = await home(staff);
    const job = await makePricedJob(owner, staff, machinist, {
      customerEmail: 'quill.amberley@example.test',
    });
    expect((await staff.post(`/api/jobs/${job.id}/estimate/send`)).status).toBe(200);
    const sent = await home(staff);
    expect(sent.waitingForApproval!.total).toBe(before.waitingForApproval!.total + 1);
    if (sent.waitingForApproval!.total <= HOME_LIST_LENGTH)
      expect(sent.waitingForApproval!.items.map((j) => j.id)).toContain(job.id);

    const agreed = await staff.post(`/api/jobs/${job.id}/estimate/approval`, {
      how: 'phone',
      note: 'agreed on the phone',
    });
    expect(agreed.status).toBe(200);
    expect((await home(staff)).waitingForApproval!.total).toBe(before.waitingForApproval!.total);
  });

  it('when an order is sent out, then it is on the way with what is still to come, late when its date has passed', async () => {
    const before = await home(staff);
    const supplier = await buyer.post('/api/suppliers', {
      name: uniq('Supplier'),
      currency: 'USD',
      leadDays: 5,
      email: 'orders@larkspur-rings.example.test',
    });
    expect(supplier.status).toBe(201);
    const part = await makePart(owner, family, '+0.020 in', 'rings', '30.00');
    const order = await buyer.post('/api/purchase-orders', {
      supplierId: supplier.body.id,
      expectedOn: shift(before.today, -2),
      lines: [{ partId: part, quantity: 3, unitPrice: '21.00' }],
    });
    expect(order.status).toBe(201);
    expect((await buyer.post(`/api/purchase-orders/${order.body.id}/send`)).status).toBe(200);

    const after = await home(staff);
    expect(after.ordersArriving!.total).toBe(before.ordersArriving!.total + 1);
    const mine = after.ordersArriving!.items.find((o) => o.id === order.body.id);
    if (after.ordersArriving!.total <= HOME_LIST_LENGTH || mine)
      expect(mine).toEqual(
        expect.objectContaining({
          number: order.body.number,
          supplierName: supplier.body.name,
          state: 'sent_out',
          late: true,
          outstanding: 3,
        }),
      );
  });

  it('when the owner asks, then alerts and orders on the way match the totals of their own pages', async () => {
    const body = await home(owner);
    const alerts = await owner.get('/api/alerts?state=open&pageSize=1');
    const orders = await owner.get('/api/purchase-orders?state=open&pageSize=1');
    expect(body.alerts!.total).toBe(alerts.body.total);
    expect(body.ordersArriving!.total).toBe(orders.body.total);
    expect(body.ordersArriving!.total).toBeGreaterThan(0);
    const expected = body.ordersArriving!.items.map((o) => o.expectedOn ?? '9999');
    expect(expected).toEqual([...expected].sort());
    for (const o of body.ordersArriving!.items) {
      expect(o.late).toBe(o.expectedOn !== null && o.expectedOn < body.today);
      expect(o.outstanding).toBeGreaterThan(0);
    }
  });
});
