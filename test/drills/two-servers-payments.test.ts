// Drill: payments across real server processes. A process without payment keys starts its own
// local payment stand-in (as `npm start` does): a deposit asked for there is paid on the stand-in's
// page and its signed event comes back to that process. Two processes that share the webhook
// secret then receive the same signed event ten times at once: each answers 200 and the payment is
// marked paid exactly once, because the event id is recorded in the database, not in a process.
// No process writes a key, the signing secret or a signature into its log.
import Stripe from 'stripe';
import {
  drillDatabase,
  HttpSession,
  insertUser,
  sqlClient,
  startServer,
  stockFixture,
  type DrillDatabase,
  type ServerProcess,
} from './support';
import { startFakePayments, type FakePayments } from '../../server/payments/fake-payments';

jest.setTimeout(180_000);

let database: DrillDatabase;
let fake: FakePayments;
let alone: ServerProcess;
let pair: ServerProcess[] = [];

beforeAll(async () => {
  database = await drillDatabase('payments');
  fake = await startFakePayments();
  const keys = {
    LOG_LEVEL: 'info',
    PAYMENTS_SECRET_KEY: fake.secretKey,
    PAYMENTS_WEBHOOK_SECRET: fake.webhookSecret,
  };
  [alone, ...pair] = await Promise.all([
    startServer(database.url, { LOG_LEVEL: 'info' }),
    startServer(database.url, keys),
    startServer(database.url, keys),
  ]);
});

afterAll(async () => {
  await Promise.all([alone, ...pair].filter(Boolean).map((s) => s.stop()));
  await fake?.stop();
  await database?.drop();
});

async function newJob(): Promise<string> {
  const client = await sqlClient(database.url);
  try {
    const stock = await stockFixture(client, 1);
    const job = await client.query(
      `insert into jobs (customer_name, family_id, cylinders) values ('Drill customer', $1, 1) returning id`,
      [stock.familyId],
    );
    const jobId = job.rows[0].id as string;
    await client.query(`insert into job_cylinders (job_id, n) values ($1, 1)`, [jobId]);
    return jobId;
  } finally {
    await client.end();
  }
}

async function staffOn(server: ServerProcess): Promise<HttpSession> {
  const client = await sqlClient(database.url);
  try {
    const session = new HttpSession(server.url);
    await session.signIn(await insertUser(client, 'staff'));
    return session;
  } finally {
    await client.end();
  }
}

describe('payments across server processes', () => {
  it('when a process has no payment keys, then its own stand-in takes the deposit and its event comes back to it', async () => {
    const jobId = await newJob();
    const staff = await staffOn(alone);
    const line = await staff.post(`/api/jobs/${jobId}/estimate/lines`, {
      description: 'Bore one cylinder',
      quantity: '1',
      unitPrice: '100.00',
    });
    expect(line.status).toBe(201);
    const asked = await staff.post(`/api/jobs/${jobId}/payment-requests`, {
      purpose: 'deposit',
      amount: '25.00',
    });
    expect(asked.status).toBe(201);
    const { url } = asked.body as { url: string };
    expect(url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/pay\/cs_test_/);
    expect(new URL(url).port).not.toBe(new URL(alone.url).port);
    const page = await fetch(url);
    expect(page.status).toBe(200);
    expect(await page.text()).toMatch(/Pay 25\.00 EUR/);
    const paid = await fetch(url, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    const list = await staff.get(`/api/jobs/${jobId}/payments`);
    expect(list.body).toMatchObject({
      items: [expect.objectContaining({ amount: '25.00', method: 'online', state: 'paid' })],
      paid: '25.00',
    });
    expect(alone.log()).toMatch(/local test payment service/);
  });

  it('when two processes get the same signed event ten times at once, then all answer 200 and it is paid once', async () => {
    const jobId = await newJob();
    // The checkout is opened on the stand-in through the SDK, the payment row as the service
    // would have written it; the stand-in sends nothing by itself (no address given).
    const sdk = new Stripe(fake.secretKey, {
      host: '127.0.0.1',
      port: fake.port,
      protocol: 'http',
    });
    const session = await sdk.checkout.sessions.create({
      mode: 'payment',
      success_url: `${pair[0].url}/c/none`,
      line_items: [
        {
          quantity: 1,
          price_data: { currency: 'eur', unit_amount: 4250, product_data: { name: 'Deposit' } },
        },
      ],
    });
    const client = await sqlClient(database.url);
    try {
      const row = await client.query(
        `insert into payments (job_id, purpose, method, amount, currency, checkout_id, url)
         values ($1, 'deposit', 'online', 42.50, 'EUR', $2, $3) returning id`,
        [jobId, session.id, session.url],
      );
      const paymentId = row.rows[0].id as string;
      expect((await fetch(session.url!, { method: 'POST', redirect: 'manual' })).status).toBe(303);
      const event = fake.sent.at(-1)!;
      expect(event.type).toBe('checkout.session.completed');

      const deliver = (server: ServerProcess, signature = event.signature) =>
        fetch(`${server.url}/api/payments/webhook`, {
          method: 'POST',
          headers: {
            'content-type': 'application/json; charset=utf-8',
            'stripe-signature': signature,
          },
          body: event.payload,
        }).then(async (r) => ({
          status: r.status,
          body: (await r.json()) as { duplicate?: boolean },
        }));
      const answers = await Promise.all(Array.from({ length: 10 }, (_, i) => deliver(pair[i % 2])));
      expect(answers.map((a) => a.status)).toEqual(Array(10).fill(200));
      expect(answers.filter((a) => a.body.duplicate === false)).toHaveLength(1);

      const forged = await deliver(pair[1], event.signature.replace(/v1=[0-9a-f]{4}/, 'v1=0000'));
      expect(forged.status).toBe(400);

      const paid = await client.query(`select state, paid_event from payments where id = $1`, [
        paymentId,
      ]);
      expect(paid.rows[0]).toEqual({ state: 'paid', paid_event: event.id });
      const events = await client.query(
        `select count(*)::int as n from payment_events where event_id = $1`,
        [event.id],
      );
      expect(events.rows[0].n).toBe(1);
      const history = await client.query(
        `select count(*)::int as n from job_events where job_id = $1 and text like '%paid online%'`,
        [jobId],
      );
      expect(history.rows[0].n).toBe(1);

      // The request lines carry the headers, so the signature would be there but for redaction.
      expect(pair[0].log()).toContain('"stripe-signature":"[Redacted]"');
      const v1 = /v1=([0-9a-f]+)/.exec(event.signature)![1];
      for (const server of [alone, ...pair]) {
        const log = server.log();
        expect(log).toContain('/api/payments/webhook');
        for (const secret of [
          fake.secretKey,
          fake.webhookSecret,
          v1,
          'sk_test_local_',
          'whsec_local_',
        ]) {
          expect({ server: server.url, leaked: log.includes(secret) }).toEqual({
            server: server.url,
            leaked: false,
          });
        }
      }
    } finally {
      await client.end();
    }
  });
});
