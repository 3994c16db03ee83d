// The owner's money figures against the real app and database: revenue by month from invoices
// (labour and parts apart, credit notes beside), estimates sent and approved by month of sending
// (rate, median days), balances still owed on handed-back jobs and deposits held on jobs without an
// invoice; CSV beside each; only the owner. Every expected figure is worked by hand in the test.
// Revenue and the lists are read before and after this file's own jobs (the API files run one
// after another), the estimates from moments set in 2025, far from any other test's rows.
import Decimal from 'decimal.js';
import { db } from '../../server/db/knex';
import { insertPayment } from '../../server/money/payments-repository';
import { getSettings, saveSettings } from '../../server/settings/settings-service';
import type {
  DepositsHeldAnswer,
  EstimatesAnswer,
  OutstandingAnswer,
  RevenueAnswer,
} from '../../shared/api/insights';
import { closeTestApp, signedInClients } from '../support/api';
import { makeFamily, makeJob } from '../support/jobs-fixtures';
import { makePricedJob, moneyShop } from '../support/money-fixtures';

// New Zealand keeps daylight time (UTC+13) until 03:00 on Sunday 6 April 2025 (IANA tz database,
// Pacific/Auckland), so 2025-03-31T20:00Z is 1 April there.
const ZONE = 'Pacific/Auckland';

const { owner, staff, machinist } = signedInClients({ owner: 'mm', staff: 'mm', machinist: 'in' });
let savedZone: string;
let family: Awaited<ReturnType<typeof makeFamily>>;

beforeAll(async () => {
  savedZone = (await getSettings()).timeZone;
  await moneyShop(owner, {
    homeCurrency: 'EUR',
    timeZone: ZONE,
  });
  family = await makeFamily(owner, { cylinders: 1 });
});
afterAll(async () => {
  await saveSettings(null, { timeZone: savedZone });
  await closeTestApp();
});

const minus = (a: string, b: string) => new Decimal(a).minus(b).toFixed(2);

/** A one-cylinder job whose estimate is one line typed by staff. */
async function jobWithLine(price: string, extra: Record<string, unknown> = {}) {
  const job = await makeJob(staff, family.id, extra);
  const line = await staff.post(`/api/jobs/${job.id}/estimate/lines`, {
    description: 'Skim the head face',
    quantity: '1',
    unitPrice: price,
  });
  expect(line.status).toBe(201);
  return job;
}

async function paid(jobId: string, purpose: 'deposit' | 'balance', amount: string) {
  await insertPayment(db, {
    job_id: jobId,
    purpose,
    method: 'cash',
    amount,
    currency: 'EUR',
    state: 'paid',
    paid_at: new Date(),
    created_by: null,
  });
}

describe('revenue, balances owed and deposits held', () => {
  let before: { revenue: RevenueAnswer; owed: OutstandingAnswer; held: DepositsHeldAnswer };
  let after: typeof before;
  const ids: Record<string, string> = {};

  const read = async () => ({
    revenue: (await owner.get('/api/insights/revenue')).body as RevenueAnswer,
    owed: (await owner.get('/api/insights/balances-owed')).body as OutstandingAnswer,
    held: (await owner.get('/api/insights/deposits-held')).body as DepositsHeldAnswer,
  });

  beforeAll(async () => {
    before = await read();
    // A: the priced twin (labour 209.00, parts 247.00, tax 91.20, total 547.20), deposit 100.00.
    const a = await makePricedJob(owner, staff, machinist);
    expect((await staff.post(`/api/jobs/${a.id}/estimate/approval`, {})).status).toBe(200);
    await paid(a.id, 'deposit', '100.00');
    // Every job also gets the fixture's "clean and inspect" labour, 12.00 per job.
    // B: a typed line of 40.00 + 12.00 = 52.00, tax 10.40, total 62.40; later a credit note of
    // 10.00 (+2.00 tax).
    const b = await jobWithLine('40.00');
    // C: 20.00 + 12.00 = 32.00, tax 6.40, total 38.40, paid in full.
    const c = await jobWithLine('20.00');
    await paid(c.id, 'balance', '38.40');
    for (const j of [a, b, c])
      expect((await staff.post(`/api/jobs/${j.id}/collect`)).status).toBe(200);
    const credit = await staff.post(`/api/jobs/${b.id}/invoice/credit-notes`, {
      reason: 'Face skimmed once, not twice',
      amount: '10.00',
    });
    expect(credit.status).toBe(201);
    // D: open, deposit 50.00 held. E: called off (calling off refunds what was paid then), and a
    // deposit of 30.00 paid in after that: held, to give back.
    // F: open, its deposit refunded: not held.
    const d = await jobWithLine('80.00');
    await paid(d.id, 'deposit', '50.00');
    const e = await jobWithLine('90.00');
    expect((await staff.post(`/api/jobs/${e.id}/cancel`)).status).toBe(200);
    await paid(e.id, 'deposit', '30.00');
    const f = await jobWithLine('70.00');
    await insertPayment(db, {
      job_id: f.id,
      purpose: 'deposit',
      method: 'cash',
      amount: '25.00',
      currency: 'EUR',
      state: 'refunded',
      paid_at: new Date(),
      refunded_at: new Date(),
      refund_reason: 'Customer changed their mind',
      created_by: null,
    });
    Object.assign(ids, { a: a.id, b: b.id, c: c.id, d: d.id, e: e.id, f: f.id });
    after = await read();
  });

  it('when jobs were invoiced this month, then the month gains their labour, parts, other lines, tax and credit notes', () => {
    const now = after.revenue.months.at(-1);
    const then = before.revenue.months.at(-1);
    if (!now || !then) throw new Error('no months');
    expect(now.month).toBe(then.month);
    // Labour 209.00 + 12.00 + 12.00 (A, B, C); parts 247.00 (A); other 40.00 + 20.00 (B, C);
    // tax 91.20 + 10.40 + 6.40; invoiced 547.20 + 62.40 + 38.40; credited 10.00 + 2.00 tax.
    expect({
      invoices: now.invoices - then.invoices,
      labour: minus(now.labour, then.labour),
      parts: minus(now.parts, then.parts),
      other: minus(now.other, then.other),
      tax: minus(now.tax, then.tax),
      invoiced: minus(now.invoiced, then.invoiced),
      credited: minus(now.credited, then.credited),
    }).toEqual({
      invoices: 3,
      labour: '233.00',
      parts: '247.00',
      other: '60.00',
      tax: '108.00',
      invoiced: '648.00',
      credited: '12.00',
    });
    expect(minus(after.revenue.totals.invoiced, before.revenue.totals.invoiced)).toBe('648.00');
    expect(after.revenue.currency).toBe('EUR');
  });

  it('when invoices are not paid off, then they are owed with what was paid and credited; a paid one is not', () => {
    const of = (id: string) => after.owed.items.find((i) => i.jobId === id);
    // A: 547.20 − 100.00 deposit = 447.20. B: 62.40 − 12.00 credited = 50.40. C: paid off.
    expect(of(ids.a)).toEqual(
      expect.objectContaining({
        total: '547.20',
        paid: '100.00',
        credited: '0.00',
        balance: '447.20',
        daysOwed: 0,
      }),
    );
    expect(of(ids.b)).toEqual(
      expect.objectContaining({
        total: '62.40',
        paid: '0.00',
        credited: '12.00',
        balance: '50.40',
      }),
    );
    expect(of(ids.c)).toBeUndefined();
    expect(minus(after.owed.totalBalance, before.owed.totalBalance)).toBe('497.60');
  });

  it('when deposits are paid on jobs without an invoice, then they are held; a called-off job’s is to give back', () => {
    const of = (id: string) => after.held.items.find((i) => i.jobId === id);
    expect(of(ids.d)).toEqual(expect.objectContaining({ amount: '50.00', toGiveBack: false }));
    expect(of(ids.e)).toEqual(
      expect.objectContaining({ amount: '30.00', toGiveBack: true, jobState: 'called_off' }),
    );
    expect(of(ids.a)).toBeUndefined();
    expect(of(ids.f)).toBeUndefined();
    expect(minus(after.held.totalHeld, before.held.totalHeld)).toBe('80.00');
  });

  it('when the tables are downloaded, then each is a CSV with the page’s rows', async () => {
    const revenue = await owner.get('/api/insights/revenue.csv');
    expect(revenue.status).toBe(200);
    expect(revenue.headers['content-type']).toMatch(/^text\/csv/);
    const lines = revenue.text
      .replace(/^\uFEFF/, '')
      .trim()
      .split('\r\n');
    expect(lines[0]).toBe(
      'Month,Invoices,Labour (EUR),Parts (EUR),Other lines (EUR),Tax (EUR),Invoiced (EUR),Credit notes (EUR)',
    );
    expect(lines.at(-1)).toMatch(/^Total,\d+,/);
    const owed = await owner.get('/api/insights/balances-owed.csv');
    const jobA = after.owed.items.find((i) => i.jobId === ids.a);
    expect(owed.text).toContain(`,${jobA?.invoiceNumber},`);
    expect(owed.text).toContain(',547.20,0.00,100.00,447.20,');
    const held = await owner.get('/api/insights/deposits-held.csv');
    expect(held.text).toMatch(/,called_off,30\.00,[^,]*,yes/);
  });

  it('when someone other than the owner asks, then 403', async () => {
    for (const path of ['revenue', 'estimates', 'balances-owed', 'deposits-held.csv'])
      expect((await staff.get(`/api/insights/${path}`)).status).toBe(403);
  });
});

describe('estimates sent and approved', () => {
  const PERIOD = 'from=2025-03-01&to=2025-04-30';

  beforeAll(async () => {
    // Moments in UTC; months and days as the shop in Pacific/Auckland sees them.
    const fixtures: Array<{ sent: string | null; approved: string | null; state: string }> = [
      { sent: '2025-03-03T09:00:00Z', approved: '2025-03-04T09:00:00Z', state: 'sent' }, // 1.0 day
      { sent: '2025-03-10T09:00:00Z', approved: '2025-03-12T21:00:00Z', state: 'sent' }, // 2.5 days
      { sent: '2025-03-15T09:00:00Z', approved: '2025-03-21T09:00:00Z', state: 'sent' }, // 6.0 days
      { sent: '2025-03-20T09:00:00Z', approved: null, state: 'declined' },
      { sent: '2025-03-31T20:00:00Z', approved: '2025-04-03T20:00:00Z', state: 'sent' }, // April; 3.0
      { sent: '2025-04-10T00:00:00Z', approved: null, state: 'sent' }, // waiting
      { sent: null, approved: '2025-04-15T00:00:00Z', state: 'draft' }, // at the counter, never sent
    ];
    for (const f of fixtures) {
      const job = await jobWithLine('10.00');
      await db('estimates')
        .update({ first_sent_at: f.sent, first_approved_at: f.approved, state: f.state })
        .where({ job_id: job.id });
    }
  });

  it('when estimates were sent in March and April 2025, then each month has its counts, rate and median days', async () => {
    const res = await owner.get(`/api/insights/estimates?${PERIOD}`);
    expect(res.status).toBe(200);
    const answer = res.body as EstimatesAnswer;
    // March: 4 sent, 3 approved (1.0, 2.5, 6.0 days: median 2.5), 1 declined; rate 3/4.
    // April: 2 sent (the 31 March 20:00 UTC one is 1 April in Auckland), 1 approved after 3.0 days,
    // 1 waiting; rate 1/2. Whole period: 6 sent, 4 approved, rate 4/6 = 0.6667, median of
    // 1.0, 2.5, 3.0, 6.0 = (2.5 + 3.0) / 2 = 2.75, rounded half away from zero to 2.8.
    expect(answer.months).toEqual([
      {
        month: '2025-03',
        sent: 4,
        approved: 3,
        declined: 1,
        waiting: 0,
        approvalRate: '0.7500',
        medianDaysToApprove: '2.5',
      },
      {
        month: '2025-04',
        sent: 2,
        approved: 1,
        declined: 0,
        waiting: 1,
        approvalRate: '0.5000',
        medianDaysToApprove: '3.0',
      },
    ]);
    expect(answer.totals).toEqual({
      sent: 6,
      approved: 4,
      declined: 1,
      waiting: 1,
      approvalRate: '0.6667',
      medianDaysToApprove: '2.8',
      approvedWithoutSending: 1,
    });
    const csv = await owner.get(`/api/insights/estimates.csv?${PERIOD}`);
    expect(csv.text).toContain('2025-03,4,3,1,0,0.7500,2.5');
    expect(csv.text).toContain('Total,6,4,1,1,0.6667,2.8');
  });

  it('when a month has nothing sent, then its rate and median are empty, not zero', async () => {
    const res = await owner.get('/api/insights/estimates?from=2025-01-01&to=2025-01-31');
    expect(res.body.months).toEqual([
      {
        month: '2025-01',
        sent: 0,
        approved: 0,
        declined: 0,
        waiting: 0,
        approvalRate: null,
        medianDaysToApprove: null,
      },
    ]);
    expect(res.body.totals.approvalRate).toBeNull();
  });

  it('when an estimate is sent, changed and sent again, then its first sending is kept', async () => {
    const job = await jobWithLine('15.00', { customerEmail: 'first-send@example.test' });
    expect((await staff.post(`/api/jobs/${job.id}/estimate/send`)).status).toBe(200);
    const first = await db('estimates').where({ job_id: job.id }).first('first_sent_at', 'sent_at');
    expect(first.first_sent_at).toEqual(first.sent_at);
    await staff.post(`/api/jobs/${job.id}/estimate/lines`, {
      description: 'Deglaze',
      quantity: '1',
      unitPrice: '5.00',
    });
    const changed = await db('estimates')
      .where({ job_id: job.id })
      .first('first_sent_at', 'sent_at');
    expect(changed.sent_at).toBeNull();
    expect(changed.first_sent_at).toEqual(first.first_sent_at);
    expect((await staff.post(`/api/jobs/${job.id}/estimate/send`)).status).toBe(200);
    const again = await db('estimates').where({ job_id: job.id }).first('first_sent_at', 'sent_at');
    expect(again.first_sent_at).toEqual(first.first_sent_at);
    expect(again.sent_at.getTime()).toBeGreaterThanOrEqual(first.sent_at.getTime());
  });
});
