// Deposits and payments against the real app, PostgreSQL, a real SMTP server on loopback and the
// local payment stand-in, driven through the payment service's own SDK: a deposit asked for, paid on
// the stand-in's page, the signed event marking it paid exactly once (the same event twice, and at
// a second app instance at the same moment), payments at the counter, refunds and the call-off.
// Bad signatures and bad amounts are refused with a clear 4xx and nothing written.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import Stripe from 'stripe';
import Decimal from 'decimal.js';
import { db } from '../../server/db/knex';
import { createApp, type CreatedApp } from '../../server/app';
import { startFakePayments, type FakePayments } from '../../server/payments/fake-payments';
import { takeEventsAt, useLocalPayments } from '../../server/payments/payment-client';
import { armFault, disarmFaults } from '../../server/testing-faults';
import { closeTestApp, everyRoleSignedIn, testApp, uniq } from '../support/api';
import { localMailbox } from '../support/mailbox';
import { makePricedJob, moneyShop, type PricedJob } from '../support/money-fixtures';

const smtp = localMailbox();
let fake: FakePayments;
let server: http.Server;
let second: CreatedApp;
const { owner, staff, machinist, buyer } = everyRoleSignedIn({ machinist: 'in' });

beforeAll(async () => {
  fake = await startFakePayments();
  useLocalPayments(fake);
  // The stand-in sends its events to a listening copy of the app, as it would to a server.
  server = http.createServer(testApp());
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  takeEventsAt(`http://127.0.0.1:${(server.address() as AddressInfo).port}`);
  second = createApp({ serveClient: false });
  await moneyShop(owner, {
    shopName: 'Fernhollow Cylinder Works',
    homeCurrency: 'EUR',
    depositPercent: '30',
  });
});
afterAll(async () => {
  takeEventsAt(null);
  useLocalPayments(null);
  await new Promise<void>((resolve) => server.close(() => resolve()));
  server.closeAllConnections();
  await second.close();
  await fake.stop();
  await closeTestApp();
});

async function pricedJob(): Promise<PricedJob & { email: string }> {
  const email = `${uniq('cust')}@example.test`;
  const job = await makePricedJob(owner, staff, machinist, { customerEmail: email });
  return { ...job, email };
}

const sessionPath = (url: string) => new URL(url).pathname;
const onFake = () => request(fake.url);
const counts = async (jobId: string) => ({
  payments: Number((await db('payments').where({ job_id: jobId }).count('* as n'))[0].n),
  sessions: fake.sessions.size,
  events: Number((await db('payment_events').count('* as n'))[0].n),
});

/** Waits (up to 5 s) for something the stand-in does after answering. */
async function eventually<T>(probe: () => T | undefined | Promise<T | undefined>): Promise<T> {
  for (let i = 0; i < 100; i++) {
    const value = await probe();
    if (value) return value;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error('it did not happen within 5 s');
}

// The job of money-fixtures: labour 2 × 55.00 + 2 × 25.00 + 2 × 18.50 + 12.00 = 209.00, parts
// 2 × 89.00 + 2 × 34.50 = 247.00; subtotal 456.00, tax 20 % 91.20, total 547.20 (worked by hand).
// A 30 % deposit of 547.20 is 164.16 (by hand).
describe('a deposit asked for, paid on the payment page, marked paid once', () => {
  let job: PricedJob & { email: string };
  let paymentId: string;
  let url: string;
  let token: string;

  beforeAll(async () => {
    job = await pricedJob();
  });

  it('when staff ask for a deposit without an amount, then 201 with 30 % of the total, open, and the stand-in page', async () => {
    const res = await staff.post(`/api/jobs/${job.id}/payment-requests`, { purpose: 'deposit' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ purpose: 'deposit', amount: '164.16', state: 'open' });
    expect(Object.keys(res.body)).toEqual(expect.arrayContaining(['id', 'url']));
    expect(res.body.url.startsWith(`${fake.url}/pay/cs_test_`)).toBe(true);
    paymentId = res.body.id;
    url = res.body.url;
    const row = await db('payments').where({ id: paymentId }).first();
    expect(row).toMatchObject({
      method: 'online',
      amount: '164.16',
      currency: 'EUR',
      state: 'open',
    });
    // The session asks the service for 16416 cents in euros.
    const session = fake.sessions.get(row.checkout_id)!;
    expect(session).toMatchObject({ amount_total: 16416, currency: 'eur', status: 'open' });
  });

  it('when the outbox is sent, then the customer gets text and HTML with the pay link and their job page', async () => {
    const mail = await smtp.deliveredTo(job.email);
    expect(mail.subject).toContain('Fernhollow Cylinder Works');
    expect(mail.subject).toContain(job.number);
    expect(mail.text).toContain(url);
    expect(mail.text).toContain('164.16 EUR');
    expect(mail.html).toContain(url);
    const m = /\/c\/([A-Za-z0-9_-]{43})/.exec(mail.text);
    expect(m).not.toBeNull();
    token = m![1];
    expect(JSON.stringify(mail)).not.toContain(fake.secretKey);
  });

  it('when the customer opens their page, then the open link shows with its amount and url', async () => {
    const res = await request(testApp()).get(`/api/public/jobs/${token}`);
    expect(res.status).toBe(200);
    expect(res.body.payments).toEqual([
      { purpose: 'deposit', amount: '164.16', state: 'open', url },
    ]);
  });

  it('when the pay page is opened, then it names the shop, the job and the amount, with a Pay button', async () => {
    const res = await onFake().get(sessionPath(url));
    expect(res.status).toBe(200);
    expect(res.text).toContain('Fernhollow Cylinder Works');
    expect(res.text).toContain(job.number);
    expect(res.text).toMatch(/<button[^>]*>Pay 164\.16 EUR<\/button>/);
  });

  it('when the customer pays (POST to the url), then the signed event reaches the app and the deposit is paid', async () => {
    const res = await onFake().post(sessionPath(url));
    expect(res.status).toBe(303);
    expect(res.headers.location).toContain(`/c/${token}`);
    const event = fake.sent.at(-1)!;
    expect(event.type).toBe('checkout.session.completed');
    expect(event.answers).toEqual([200]);
    // The signature is the service's own: the SDK's check accepts it (outside reference: the
    // payment service's SDK, webhooks.constructEvent).
    const checked = new Stripe('sk_test_unused').webhooks.constructEvent(
      event.payload,
      event.signature,
      fake.webhookSecret,
    );
    expect(checked.id).toBe(event.id);
    const list = await staff.get(`/api/jobs/${job.id}/payments`);
    expect(list.status).toBe(200);
    expect(list.body.items).toEqual([
      expect.objectContaining({
        id: paymentId,
        purpose: 'deposit',
        method: 'online',
        amount: '164.16',
        state: 'paid',
      }),
    ]);
    // 547.20 − 164.16 = 383.04 (by hand).
    expect(list.body).toMatchObject({ paid: '164.16', balance: '383.04' });
    const page = await request(testApp()).get(`/api/public/jobs/${token}`);
    expect(page.body.payments).toEqual([
      { purpose: 'deposit', amount: '164.16', state: 'paid', url: null },
    ]);
  });

  it('when the same event arrives again, and at two app instances at once, then each answers 200 and it counts once', async () => {
    const event = fake.sent.at(-1)!;
    const send = (app: Parameters<typeof request>[0]) =>
      request(app)
        .post('/api/payments/webhook')
        .set('Content-Type', 'application/json; charset=utf-8')
        .set('Stripe-Signature', event.signature)
        .send(event.payload);
    const answers = await Promise.all([send(testApp()), send(second.app), send(second.app)]);
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200]);
    expect(answers.every((a) => a.body.duplicate === true)).toBe(true);
    expect(await db('payment_events').where({ event_id: event.id })).toHaveLength(1);
    const row = await db('payments').where({ id: paymentId }).first();
    expect(row).toMatchObject({ state: 'paid', paid_event: event.id });
    const events = await db('job_events')
      .where({ job_id: job.id })
      .where('text', 'like', '%paid online%');
    expect(events).toHaveLength(1);
    const audits = await db('audit_events').where({ action: 'payment.paid', entity_id: job.id });
    expect(audits).toHaveLength(1);
  });

  it('when the paid page is posted again, then nothing more is paid or sent', async () => {
    const before = fake.sent.length;
    const res = await onFake().post(sessionPath(url));
    expect(res.status).toBe(303);
    expect(fake.sent.length).toBe(before);
  });
});

describe('events with a missing or wrong signature', () => {
  const payloadFor = (id: string) =>
    JSON.stringify({
      id,
      object: 'event',
      type: 'checkout.session.completed',
      data: { object: { id: 'cs_test_none' } },
    });
  const sign = (payload: string, secret: string) =>
    new Stripe('sk_test_unused').webhooks.generateTestHeaderString({ payload, secret });
  const post = (payload: string, signature?: string) => {
    const r = request(testApp())
      .post('/api/payments/webhook')
      .set('Content-Type', 'application/json');
    if (signature) r.set('Stripe-Signature', signature);
    return r.send(payload);
  };

  it.each([
    ['no signature', () => undefined],
    ['signed with another secret', (p: string) => sign(p, 'whsec_someone_else')],
    ['a signature that is not one', () => 't=1,v1=00'],
    [
      'a changed body under a good signature',
      (p: string) => sign(p.replace('cs_test_none', 'x'), fake.webhookSecret),
    ],
  ])('when the event has %s, then 400 and nothing is written', async (_what, signature) => {
    const id = `evt_${uniq('bad')}`;
    const payload = payloadFor(id);
    const res = await post(payload, signature(payload));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toMatch(/bad_signature/);
    expect(JSON.stringify(res.body)).not.toContain(fake.webhookSecret);
    expect(await db('payment_events').where({ event_id: id })).toHaveLength(0);
  });

  it('when a good signature comes an old way (more than five minutes ago), then 400', async () => {
    const id = `evt_${uniq('old')}`;
    const payload = payloadFor(id);
    const header = new Stripe('sk_test_unused').webhooks.generateTestHeaderString({
      payload,
      secret: fake.webhookSecret,
      timestamp: Math.floor(Date.now() / 1000) - 3600,
    });
    expect((await post(payload, header)).status).toBe(400);
    expect(await db('payment_events').where({ event_id: id })).toHaveLength(0);
  });

  it('when a correctly signed event names no payment of ours, then 200 and only its id is kept', async () => {
    const id = `evt_${uniq('other')}`;
    const payload = payloadFor(id);
    const res = await post(payload, sign(payload, fake.webhookSecret));
    expect(res.status).toBe(200);
    expect(await db('payment_events').where({ event_id: id })).toHaveLength(1);
  });
});

describe('amounts refused', () => {
  let job: PricedJob & { email: string };
  beforeAll(async () => {
    job = await pricedJob();
  });

  it.each([
    [{ purpose: 'deposit', amount: '-5.00' }, 'amount', /negative/],
    [{ purpose: 'deposit', amount: 'NaN' }, 'amount', /number/],
    [{ purpose: 'deposit', amount: '0' }, 'amount', /more than 0/],
    [{ purpose: 'deposit', amount: '12.345' }, 'amount', /2 decimals/],
    [
      { purpose: 'deposit', amount: '600.00' },
      'amount',
      /larger than the estimate's total of 547\.20 EUR/,
    ],
    [{ purpose: 'balance', amount: '547.21' }, 'amount', /more than the 547\.20 EUR/],
    [{ purpose: 'tip' }, 'purpose', /deposit or balance/],
  ])(
    'when staff ask for %j, then 400 naming %s, and nothing is written',
    async (body, field, message) => {
      const before = await counts(job.id);
      const res = await staff.post(`/api/jobs/${job.id}/payment-requests`, body);
      expect(res.status).toBe(400);
      expect(res.body.error.details[0].field).toBe(field);
      expect(res.body.error.message).toMatch(message);
      expect(await counts(job.id)).toEqual(before);
    },
  );

  it.each([
    [{ method: 'cash', amount: '-1' }, 'amount'],
    [{ method: 'cash', amount: 'NaN' }, 'amount'],
    [{ method: 'online', amount: '10.00' }, 'method'],
    [{ method: 'card', amount: '547.21' }, 'amount'],
  ])(
    'when staff record %j at the counter, then 400 naming %s, and nothing is written',
    async (body, field) => {
      const before = await counts(job.id);
      const res = await staff.post(`/api/jobs/${job.id}/payments`, body);
      expect(res.status).toBe(400);
      expect(res.body.error.details[0].field).toBe(field);
      expect(await counts(job.id)).toEqual(before);
    },
  );

  it('when the request fails after the link was opened, then 500, nothing is written and the link is ended', async () => {
    const before = await counts(job.id);
    armFault('payments.request.after-checkout');
    try {
      const res = await staff.post(`/api/jobs/${job.id}/payment-requests`, { purpose: 'deposit' });
      expect(res.status).toBe(500);
    } finally {
      disarmFaults();
    }
    expect(await db('payments').where({ job_id: job.id })).toHaveLength(before.payments);
    const opened = [...fake.sessions.values()].at(-1)!;
    expect(opened.metadata.jobId).toBe(job.id);
    expect(opened.status).toBe('expired');
    // Its "ended" event reaches the app and finds nothing to withdraw.
    await eventually(
      () =>
        fake.sent.find((e) => e.payload.includes(opened.id) && e.answers.length > 0) ?? undefined,
    );
  });

  it('when the payment service cannot be reached, then 502 without its key, and nothing is written', async () => {
    const gone = await startFakePayments();
    await gone.stop();
    useLocalPayments(gone);
    try {
      const before = await counts(job.id);
      const links = await db('public_links').where({ job_id: job.id });
      const res = await staff.post(`/api/jobs/${job.id}/payment-requests`, { purpose: 'deposit' });
      expect(res.status).toBe(502);
      expect(res.body.error.code).toBe('payment_service');
      expect(JSON.stringify(res.body)).not.toContain(gone.secretKey);
      expect(await counts(job.id)).toEqual(before);
      expect(await db('public_links').where({ job_id: job.id })).toHaveLength(links.length);
    } finally {
      useLocalPayments(fake);
    }
  });
});

describe('the counter, the balance, refunds and calling the job off', () => {
  let job: PricedJob & { email: string };
  let online: { id: string; url: string };

  beforeAll(async () => {
    job = await pricedJob();
    const res = await staff.post(`/api/jobs/${job.id}/payment-requests`, {
      purpose: 'deposit',
      amount: '100.00',
    });
    online = res.body;
    expect((await onFake().post(sessionPath(online.url))).status).toBe(303);
  });

  it('when cash is taken at the counter, then 201 paid, and the sums add up', async () => {
    const res = await owner.post(`/api/jobs/${job.id}/payments`, {
      method: 'cash',
      amount: '50.00',
      purpose: 'deposit',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      purpose: 'deposit',
      method: 'cash',
      amount: '50.00',
      state: 'paid',
    });
    const list = (await machinist.get(`/api/jobs/${job.id}/payments`)).body;
    // 547.20 − 100.00 − 50.00 = 397.20 (by hand).
    expect(list).toMatchObject({ paid: '150.00', balance: '397.20' });
  });

  it('when the balance is asked for, then it is what is still owed, and a second ask finds nothing left', async () => {
    const res = await staff.post(`/api/jobs/${job.id}/payment-requests`, { purpose: 'balance' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ purpose: 'balance', amount: '397.20', state: 'open' });
    const again = await staff.post(`/api/jobs/${job.id}/payment-requests`, { purpose: 'balance' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/Nothing is left to ask for/);
  });

  it('when a cash payment is refunded with a reason, then it is refunded at the counter and no longer counts', async () => {
    const cash = (await staff.get(`/api/jobs/${job.id}/payments`)).body.items.find(
      (p: { method: string }) => p.method === 'cash',
    );
    const res = await staff.post(`/api/jobs/${job.id}/payments/${cash.id}/refund`, {
      reason: 'Paid twice by mistake',
    });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ state: 'refunded', refundReason: 'Paid twice by mistake' });
    const twice = await staff.post(`/api/jobs/${job.id}/payments/${cash.id}/refund`, {
      reason: 'again',
    });
    expect(twice.status).toBe(409);
    expect((await staff.get(`/api/jobs/${job.id}/payments`)).body.paid).toBe('100.00');
  });

  it('when the job is called off, then the online deposit is refunded through the service and the open link withdrawn', async () => {
    await owner.post(`/api/jobs/${job.id}/payments`, {
      method: 'transfer',
      amount: '20.00',
      purpose: 'deposit',
    });
    const open = (await db('payments').where({ job_id: job.id, state: 'open' }).first())
      .checkout_id;
    const res = await staff.post(`/api/jobs/${job.id}/cancel`);
    expect(res.status).toBe(200);
    const rows = await db('payments').where({ job_id: job.id }).orderBy('created_at');
    expect(rows.map((r) => [r.method, r.state])).toEqual([
      ['online', 'refunded'],
      ['cash', 'refunded'],
      ['transfer', 'refunded'],
    ]);
    const paidOnline = rows[0];
    expect(paidOnline.refund_reason).toBe(`job ${job.number} was called off`);
    const refund = fake.refunds.find((r) => r.payment_intent === paidOnline.provider_payment);
    expect(refund).toMatchObject({ amount: 10000, currency: 'eur', status: 'succeeded' });
    expect(paidOnline.refund_ref).toBe(refund!.id);
    expect(fake.sessions.get(open)!.status).toBe('expired');
    expect((await onFake().post(`/pay/${open}`)).status).toBe(410);
    const event = await db('job_events')
      .where({ job_id: job.id, kind: 'state' })
      .orderBy('at', 'desc')
      .first();
    expect(event.text).toMatch(/refunded through the payment service/);
    expect(event.text).toMatch(/withdrawn/);
    // The service tells of the ended link afterwards; the link is already gone, so nothing changes.
    const ended = await eventually(() =>
      fake.sent.find((e) => e.type === 'checkout.session.expired' && e.payload.includes(open)),
    );
    await eventually(() => ended.answers.length > 0 || undefined);
    expect(ended.answers).toEqual([200]);
    expect(
      await db('job_events').where({ job_id: job.id }).where('text', 'like', '%ended unpaid%'),
    ).toHaveLength(0);
    const after = await staff.post(`/api/jobs/${job.id}/payment-requests`, { purpose: 'deposit' });
    expect(after.status).toBe(409);
  });
});

describe('a link that ends unpaid at the service', () => {
  it('when the service ends an unpaid link, then its event withdraws it and the job says so', async () => {
    const job = await pricedJob();
    const res = await staff.post(`/api/jobs/${job.id}/payment-requests`, {
      purpose: 'deposit',
      amount: '30.00',
    });
    expect(res.status).toBe(201);
    const row = await db('payments').where({ id: res.body.id }).first();
    const sdk = new Stripe(fake.secretKey, {
      host: '127.0.0.1',
      port: fake.port,
      protocol: 'http',
    });
    await sdk.checkout.sessions.expire(row.checkout_id);
    await eventually(
      async () => !(await db('payments').where({ id: row.id }).first()) || undefined,
    );
    const history = await db('job_events')
      .where({ job_id: job.id })
      .where('text', 'like', '%ended unpaid%');
    expect(history).toHaveLength(1);
    expect(history[0].text).toContain('30.00 EUR');
    const list = (await staff.get(`/api/jobs/${job.id}/payments`)).body;
    expect(list.items).toEqual([]);
  });
});

describe('after the hand-back', () => {
  it('when the job is handed back, then its payments owe what the invoice says, and the balance can be paid at the counter', async () => {
    const job = await pricedJob();
    expect((await staff.get(`/api/jobs/${job.id}/estimate`)).body.total).toBe('547.20');
    await staff.post(`/api/jobs/${job.id}/payments`, { method: 'card', amount: '200.00' });
    expect((await staff.post(`/api/jobs/${job.id}/collect`)).status).toBe(200);
    const invoice = (await staff.get(`/api/jobs/${job.id}/invoice`)).body;
    const list = (await staff.get(`/api/jobs/${job.id}/payments`)).body;
    expect(list).toMatchObject({ paid: '200.00', balance: invoice.balance });
    const over = await staff.post(`/api/jobs/${job.id}/payments`, {
      method: 'cash',
      amount: new Decimal(invoice.balance).plus(1).toFixed(2),
    });
    expect(over.status).toBe(400);
    const rest = await staff.post(`/api/jobs/${job.id}/payments`, {
      method: 'cash',
      amount: invoice.balance,
    });
    expect(rest.status).toBe(201);
    expect(rest.body.purpose).toBe('balance');
    expect((await staff.get(`/api/jobs/${job.id}/payments`)).body.balance).toBe('0.00');
    expect((await staff.get(`/api/jobs/${job.id}/invoice`)).body.balance).toBe('0.00');
  });
});

describe('public payment links', () => {
  it('when a token is unknown, malformed, expired or of a closed job, then 404 and nothing about any job', async () => {
    const a = await pricedJob();
    const b = await pricedJob();
    await staff.post(`/api/jobs/${a.id}/payment-requests`, { purpose: 'deposit' });
    await staff.post(`/api/jobs/${b.id}/payment-requests`, { purpose: 'deposit', amount: '10.00' });
    const tokenA = /\/c\/([A-Za-z0-9_-]{43})/.exec((await smtp.deliveredTo(a.email)).text)![1];
    const tokenB = /\/c\/([A-Za-z0-9_-]{43})/.exec((await smtp.deliveredTo(b.email)).text)![1];
    const pageB = (await request(testApp()).get(`/api/public/jobs/${tokenB}`)).body;
    expect(pageB.job.number).toBe(b.number);
    expect(pageB.payments).toEqual([expect.objectContaining({ amount: '10.00', state: 'open' })]);
    expect(JSON.stringify(pageB)).not.toContain(a.number);
    const oneOff = `${tokenA.slice(0, 42)}${tokenA.endsWith('A') ? 'B' : 'A'}`;
    for (const bad of ['x'.repeat(43), 'short', oneOff]) {
      const res = await request(testApp()).get(`/api/public/jobs/${bad}`);
      expect(res.status).toBe(404);
      expect(JSON.stringify(res.body)).not.toMatch(new RegExp(`${a.number}|${b.number}`));
    }
    await db('public_links')
      .where({ job_id: a.id })
      .update({
        created_at: db.raw("now() - interval '61 days'"),
        expires_at: db.raw("now() - interval '1 day'"),
      });
    expect((await request(testApp()).get(`/api/public/jobs/${tokenA}`)).status).toBe(404);
    await staff.post(`/api/jobs/${b.id}/cancel`);
    expect((await request(testApp()).get(`/api/public/jobs/${tokenB}`)).status).toBe(404);
  });
});

describe('who may do what with payments', () => {
  it('when machinists and buyers read payments they may, and asking for or taking money is refused', async () => {
    const job = await pricedJob();
    for (const who of [machinist, buyer]) {
      expect((await who.get(`/api/jobs/${job.id}/payments`)).status).toBe(200);
      expect(
        (await who.post(`/api/jobs/${job.id}/payment-requests`, { purpose: 'deposit' })).status,
      ).toBe(403);
      expect(
        (await who.post(`/api/jobs/${job.id}/payments`, { method: 'cash', amount: '1.00' })).status,
      ).toBe(403);
    }
    expect(await db('payments').where({ job_id: job.id })).toHaveLength(0);
  });
});
