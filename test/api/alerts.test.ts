// Reorder alerts: a movement that takes a part's free stock to its reorder point raises one alert
// and queues one e-mail per buyer who wants instant mail, in the same transaction; nothing more
// until the part recovers above the point. The mail is delivered to a real SMTP server on loopback
// and read back with mailparser. Also the daily digest, acknowledging, reorder rules and the
// customer's notice when a job is ready.
import { db } from '../../server/db/knex';
import { runDigestSweep } from '../../server/alerts/digest-sweep';
import { checkReorderCrossing } from '../../server/alerts/alerts-service';
import { saveSettings } from '../../server/settings/settings-service';
import { type Client, closeTestApp, everyRoleSignedIn, signedIn } from '../support/api';
import { localMailbox } from '../support/mailbox';
import {
  familyAndBin,
  makeJob,
  makePart,
  receiveCounted,
  receivePistons,
} from '../support/jobs-fixtures';

const smtp = localMailbox();
const { owner, buyer, machinist, staff } = everyRoleSignedIn();
const { family, bin } = familyAndBin(owner, { cylinders: 4 });
let digestBuyer: Client;

beforeAll(async () => {
  await saveSettings(null, {
    timeZone: 'UTC',
    shopName: 'Quarry Bend Cylinder Works',
    shopHours: 'Tue–Sat 9:00–16:00',
  });
  digestBuyer = await signedIn('buyer');
  expect((await digestBuyer.patch('/api/account', { mailMode: 'digest' })).status).toBe(200);
});
afterAll(closeTestApp);

function outboxFor(to: string, template: string) {
  return db('outbox').where({ to_address: to, template });
}

async function alertsOf(partId: string) {
  return db('alerts').where({ part_id: partId }).orderBy('raised_at');
}

async function hold(jobId: string, cylinder: number, unitId: string) {
  const res = await machinist.post(`/api/jobs/${jobId}/holds`, { cylinder, unitId });
  expect(res.status).toBe(201);
  return res.body as { id: string };
}

describe('reorder alerts', () => {
  let piston: string;
  let sku: string;
  let units: { id: string; label: string }[];
  let job: { id: string; number: string };

  beforeAll(async () => {
    piston = await makePart(owner, family, '+0.010 in', 'piston');
    sku = (await owner.get(`/api/parts/${piston}`)).body.sku;
    units = await receivePistons(owner, piston, bin.id, ['2.5268 in', '2.5266 in', '2.5271 in']);
    job = await makeJob(staff, family.id, { cylinders: 4 });
  });

  it('when the buyer sets a reorder rule, then 200 and the part shows free, reorderPoint and orderUpTo', async () => {
    const res = await buyer.put(`/api/parts/${piston}/reorder-rule`, {
      reorderPoint: 2,
      orderUpTo: 6,
    });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      partId: piston,
      reorderPoint: 2,
      orderUpTo: 6,
      effective: { reorderPoint: 2, orderUpTo: 6, source: 'part' },
    });
    const part = await buyer.get(`/api/parts/${piston}`);
    expect(part.body).toEqual(expect.objectContaining({ free: 3, reorderPoint: 2, orderUpTo: 6 }));
    // Free 3 is above the point: no alert yet.
    expect(await alertsOf(piston)).toHaveLength(0);
    const audit = await db('audit_events').where({
      action: 'reorder_rule.update',
      entity_id: piston,
    });
    expect(audit).toHaveLength(1);
  });

  it('when a hold takes free stock to the reorder point, then exactly one e-mail is queued for the buyer and the SMTP server receives it', async () => {
    const me = buyer.user?.email as string;
    await hold(job.id, 1, units[0].id);

    const alerts = await alertsOf(piston);
    expect(alerts).toHaveLength(1);
    expect(alerts[0]).toEqual(
      expect.objectContaining({
        kind: 'reorder_point',
        free_at_raise: 2,
        reorder_point: 2,
        recovered_at: null,
      }),
    );
    const queued = await outboxFor(me, 'reorder-alert');
    expect(queued).toHaveLength(1);
    expect(queued[0].data).toEqual({ alertId: alerts[0].id });
    // The buyer who chose a daily digest gets no instant message.
    expect(await outboxFor(digestBuyer.user?.email as string, 'reorder-alert')).toHaveLength(0);

    await smtp.deliver();
    const got = smtp.received.filter((m) => m.to.includes(me) && m.subject.includes(sku));
    expect(got).toHaveLength(1);
    expect(got[0].subject).toBe(`Running low: ${sku} is down to 2 free (reorder point 2)`);
    expect(got[0].text).toContain(`${sku} has reached its reorder point`);
    expect(got[0].text).toContain('Quarry Bend Cylinder Works');
    expect(got[0].text).toMatch(/http:\/\/[^\s]+\/alerts/);
    expect(got[0].html).toContain(sku);
    expect((await outboxFor(me, 'reorder-alert'))[0].status).toBe('sent');

    const list = await buyer.get('/api/alerts?state=open');
    expect(list.status).toBe(200);
    const mine = list.body.items.find((a: { partId: string }) => a.partId === piston);
    expect(mine).toEqual(
      expect.objectContaining({
        id: alerts[0].id,
        partId: piston,
        kind: 'reorder_point',
        raisedAt: expect.any(String),
        sku,
        freeAtRaise: 2,
        reorderPoint: 2,
        free: 2,
        acknowledgedAt: null,
      }),
    );
    expect(list.body.total).toBeGreaterThanOrEqual(1);
  });

  it('when a second hold takes it further below, then no new alert and nothing more is sent', async () => {
    const me = buyer.user?.email as string;
    await hold(job.id, 2, units[1].id);
    expect(await alertsOf(piston)).toHaveLength(1);
    expect(
      await outboxFor(me, 'reorder-alert').whereRaw(
        `data->>'alertId' IN (SELECT id::text FROM alerts WHERE part_id = ?)`,
        [piston],
      ),
    ).toHaveLength(1);
    await smtp.deliver();
    expect(smtp.received.filter((m) => m.to.includes(me) && m.subject.includes(sku))).toHaveLength(
      1,
    );
  });

  it('when the alert was seen, stock recovers above the point and falls again, then that second crossing raises a second alert', async () => {
    // Unseen, a fall after a recovery reopens the same alert (alert-dedupe.test.ts); once someone
    // has acknowledged it, the next crossing is news.
    const [open] = await alertsOf(piston);
    expect((await owner.post(`/api/alerts/${open.id}/acknowledge`)).status).toBe(200);
    await receivePistons(owner, piston, bin.id, ['2.5269 in', '2.5267 in']);
    // Free 1 + 2 = 3 > 2: the crossing is over.
    let alerts = await alertsOf(piston);
    expect(alerts[0].recovered_at).toBeInstanceOf(Date);
    const fresh = await db('piston_units')
      .where({ part_id: piston, status: 'free' })
      .orderBy('label');
    await hold(job.id, 3, fresh[0].id);
    alerts = await alertsOf(piston);
    expect(alerts).toHaveLength(2);
    expect(alerts[1]).toEqual(expect.objectContaining({ free_at_raise: 2, recovered_at: null }));
  });

  it('when a counted part is adjusted down to its point, then an alert is raised too', async () => {
    const rings = await makePart(owner, family, '+0.010 in', 'rings');
    await receiveCounted(owner, rings, bin.id, 4);
    expect(
      (await buyer.put(`/api/parts/${rings}/reorder-rule`, { reorderPoint: 3, orderUpTo: 8 }))
        .status,
    ).toBe(200);
    const res = await owner.post('/api/stock/adjustments', {
      partId: rings,
      quantity: -1,
      reason: 'counted 3 on the shelf',
    });
    expect(res.status).toBe(201);
    expect(await alertsOf(rings)).toHaveLength(1);
  });

  it('when a service calls checkReorderCrossing in its transaction, then it raises the alert once and then finds nothing to do', async () => {
    const other = await makePart(owner, family, '+0.020 in', 'piston');
    await receivePistons(owner, other, bin.id, ['2.5368 in']);
    // Set the rule underneath the API, so no trigger on parts has already looked at it.
    await db('parts').where({ id: other }).update({ order_up_to: 4 });
    await db.raw('ALTER TABLE parts DISABLE TRIGGER parts_reorder_watch');
    try {
      await db('parts').where({ id: other }).update({ reorder_point: 1 });
    } finally {
      await db.raw('ALTER TABLE parts ENABLE TRIGGER parts_reorder_watch');
    }
    expect(await alertsOf(other)).toHaveLength(0);
    const first = await db.transaction((trx) => checkReorderCrossing(trx, other));
    const second = await db.transaction((trx) => checkReorderCrossing(trx, other));
    expect(first).toEqual(expect.any(String));
    expect(second).toBeNull();
    expect(await alertsOf(other)).toHaveLength(1);
  });

  it('when a buyer acknowledges an alert, then it leaves the open list; a second acknowledgement is 409', async () => {
    // The part's one alert nobody has seen yet (an earlier one was acknowledged above).
    const first = (await alertsOf(piston)).find((a) => a.acknowledged_at === null);
    if (!first) throw new Error('no unacknowledged alert for the piston');
    const res = await buyer.post(`/api/alerts/${first.id}/acknowledge`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual(
      expect.objectContaining({
        id: first.id,
        acknowledgedAt: expect.any(String),
        acknowledgedBy: 'Test buyer',
      }),
    );
    const open = await buyer.get(`/api/alerts?state=open&partId=${piston}`);
    expect(open.body.items.map((a: { id: string }) => a.id)).not.toContain(first.id);
    const seen = await owner.get(`/api/alerts?state=acknowledged&partId=${piston}`);
    expect(seen.body.items.map((a: { id: string }) => a.id)).toContain(first.id);
    expect((await buyer.post(`/api/alerts/${first.id}/acknowledge`)).status).toBe(409);
    expect(
      (await buyer.post('/api/alerts/00000000-0000-4000-8000-000000000000/acknowledge')).status,
    ).toBe(404);
    expect((await staff.get('/api/alerts')).status).toBe(403);
    expect((await buyer.get('/api/alerts?state=shut')).status).toBe(400);
  });

  it('when a buyer asks how alerts reach them, then the mail mode they chose under their account comes back', async () => {
    expect((await digestBuyer.get('/api/alerts/mail-mode')).body).toEqual({
      mailMode: 'digest',
      alertsByMail: true,
    });
    expect((await buyer.get('/api/alerts/mail-mode')).body).toEqual({
      mailMode: 'instant',
      alertsByMail: true,
    });
    expect((await owner.get('/api/alerts/mail-mode')).body.alertsByMail).toBe(false);
  });

  it('when the digest sweep runs after 07:00 shop time, then a digest buyer gets one summary a day listing the new alerts', async () => {
    const me = digestBuyer.user?.email as string;
    const early = await runDigestSweep(new Date(Date.UTC(2031, 0, 6, 5, 0)));
    expect(early.claimed).toBe(0);
    // A moment after the alerts above, on a day where it is already past 07:00 (UTC is the shop's zone here).
    let now = new Date(Date.now() + 60_000);
    if (now.getUTCHours() < 7) {
      now = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate(), 7, 30));
    }
    const result = await runDigestSweep(now);
    expect(result.claimed).toBeGreaterThanOrEqual(1);
    const digests = await db('outbox')
      .where({ to_address: me })
      .whereLike('dedupe_key', 'alert-digest:%');
    expect(digests).toHaveLength(1);
    expect(digests[0].body_text).toContain(sku);
    const again = await runDigestSweep(new Date(now.getTime() + 60_000));
    expect(again.claimed).toBe(0);
    expect(
      await db('outbox').where({ to_address: me }).whereLike('dedupe_key', 'alert-digest:%'),
    ).toHaveLength(1);
  });
});

describe('PUT /api/parts/:id/reorder-rule', () => {
  it('when the order-up-to level is below the point, then 400 naming orderUpTo', async () => {
    const part = await makePart(owner, family, '+0.030 in', 'piston');
    const res = await buyer.put(`/api/parts/${part}/reorder-rule`, {
      reorderPoint: 5,
      orderUpTo: 2,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('orderUpTo');
  });

  it('when a machinist tries, then 403; an unknown part is 404; a negative point is 400', async () => {
    const part = await makePart(owner, family, '+0.030 in', 'rings');
    expect(
      (await machinist.put(`/api/parts/${part}/reorder-rule`, { reorderPoint: 1, orderUpTo: 2 }))
        .status,
    ).toBe(403);
    expect(
      (
        await owner.put('/api/parts/00000000-0000-4000-8000-000000000000/reorder-rule', {
          reorderPoint: 1,
          orderUpTo: 2,
        })
      ).status,
    ).toBe(404);
    const negative = await owner.put(`/api/parts/${part}/reorder-rule`, {
      reorderPoint: -1,
      orderUpTo: 2,
    });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details[0].field).toBe('reorderPoint');
  });

  it('when a family default is set, then a part without its own rule is watched by it', async () => {
    const part = await makePart(owner, family, '+0.040 in', 'rings');
    await receiveCounted(owner, part, bin.id, 2);
    const res = await buyer.put('/api/reorder-defaults', {
      familyId: family.id,
      stepId: family.steps['+0.040 in'],
      kind: 'rings',
      reorderPoint: 2,
      orderUpTo: 5,
    });
    expect(res.status).toBe(200);
    const rule = await buyer.get(`/api/parts/${part}/reorder-rule`);
    expect(rule.body.effective).toEqual({ reorderPoint: 2, orderUpTo: 5, source: 'step' });
    // Setting a default that the free stock already reaches is a crossing: one alert.
    expect(await alertsOf(part)).toHaveLength(1);
    const list = await buyer.get(`/api/reorder?familyId=${family.id}`);
    expect(list.body.items).toEqual(
      expect.arrayContaining([
        expect.objectContaining({
          partId: part,
          free: 2,
          reorderPoint: 2,
          orderUpTo: 5,
          ruleSource: 'step',
          low: true,
          suggestedQuantity: 3,
        }),
      ]),
    );
    expect((await buyer.delete(`/api/reorder-defaults/${res.body.id}`)).status).toBe(204);
    expect((await buyer.get(`/api/parts/${part}/reorder-rule`)).body.effective.source).toBe('none');
  });
});

describe('customer notice when a job is ready', () => {
  it('when a job with an e-mail address becomes ready, then the customer gets one notice with the job number and the shop hours', async () => {
    const job = await makeJob(staff, family.id, { customerEmail: 'halloran.vey@example.test' });
    const res = await machinist.patch(`/api/jobs/${job.id}`, { state: 'ready_to_go' });
    expect(res.status).toBe(200);
    const rows = await db('outbox').where({ dedupe_key: `job-ready:${job.id}` });
    expect(rows).toEqual([
      expect.objectContaining({ to_address: 'halloran.vey@example.test', template: 'job-ready' }),
    ]);
    await smtp.deliver();
    const got = smtp.received.filter((m) => m.subject.includes(job.number));
    expect(got).toHaveLength(1);
    expect(got[0].to).toEqual(['halloran.vey@example.test']);
    expect(got[0].text).toContain(`Job number: ${job.number}`);
    expect(got[0].text).toContain('Tue–Sat 9:00–16:00');
  });

  it('when the machinist turned the notice off, then nothing is queued', async () => {
    const job = await makeJob(staff, family.id, { customerEmail: 'quiet.customer@example.test' });
    expect((await machinist.patch(`/api/jobs/${job.id}`, { notifyCustomer: false })).status).toBe(
      200,
    );
    expect((await machinist.patch(`/api/jobs/${job.id}`, { state: 'ready_to_go' })).status).toBe(
      200,
    );
    expect(await db('outbox').where({ dedupe_key: `job-ready:${job.id}` })).toHaveLength(0);
  });
});
