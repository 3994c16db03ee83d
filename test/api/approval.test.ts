import { randomUUID } from 'node:crypto';
// The customer's approval before the cut, against the real app, database and a real SMTP server on
// loopback: the estimate e-mailed with its link, the public page opened without a session, agreed
// or turned down from it, an approval taken at the counter, and the cut refused until then. Wrong,
// foreign and expired links get 404 and say nothing about other jobs.
import request from 'supertest';
import { randomBytes } from 'node:crypto';
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, signedInClients, testApp, uniq } from '../support/api';
import { localMailbox } from '../support/mailbox';
import { makePricedJob, moneyShop } from '../support/money-fixtures';

const smtp = localMailbox();
const { owner, staff, machinist } = signedInClients({ owner: 'mm', staff: 'mm', machinist: 'in' });

beforeAll(async () => {
  await moneyShop(owner, {
    shopName: 'Fernhollow Cylinder Works',
  });
});
afterAll(closeTestApp);

/** Sends what the outbox holds and returns the token in the last message to this address. */
async function deliveredToken(to: string): Promise<string> {
  const mail = await smtp.deliveredTo(to);
  const m = /\/c\/([A-Za-z0-9_-]{43})/.exec(mail.text);
  if (!m) throw new Error(`no link in: ${mail.text}`);
  return m[1];
}

const anonymous = () => request(testApp());

describe('sending the estimate and the customer answering from the link', () => {
  let job: { id: string; number: string };
  let email: string;
  let token: string;

  beforeAll(async () => {
    email = `${uniq('cust')}@example.test`;
    job = await makePricedJob(owner, staff, machinist, { customerEmail: email });
  });

  it('when a cylinder is cut before the customer agreed, then 409 naming the approval, and nothing is cut', async () => {
    const res = await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('not_approved');
    expect(res.body.error.message).toMatch(/approval/);
    const cyl = await db('job_cylinders').where({ job_id: job.id, n: 1 }).first();
    expect(cyl.cut_at).toBeNull();
    const toBar = await machinist.patch(`/api/jobs/${job.id}`, { state: 'on_the_bar' });
    expect(toBar.status).toBe(409);
  });

  it('when staff send it, then 200 {state: sent} and the customer receives text and HTML with the link /c/<token>', async () => {
    const res = await staff.post(`/api/jobs/${job.id}/estimate/send`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ state: 'sent' });
    token = await deliveredToken(email);
    const mail = smtp.received.filter((m) => m.to.includes(email)).at(-1)!;
    expect(mail.subject).toContain('Fernhollow Cylinder Works');
    expect(mail.subject).toContain(job.number);
    expect(mail.text).toContain(`/c/${token}`);
    expect(mail.html).toContain(`/c/${token}`);
    // 256 random bits as base64url: 43 characters; only its SHA-256 is stored.
    expect(token).toHaveLength(43);
    const stored = await db('public_links').where({ job_id: job.id });
    expect(stored).toHaveLength(1);
    expect(stored[0].token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(JSON.stringify(stored)).not.toContain(token);
    // The Mailbox shows it too.
    const box = await owner.get('/api/mailbox');
    expect(JSON.stringify(box.body)).toContain(job.number);
  });

  it('when the link is opened without a session, then the shop, job and estimate show; nothing about staff', async () => {
    const res = await anonymous().get(`/api/public/jobs/${token}`);
    expect(res.status).toBe(200);
    expect(res.body.shop.name).toBe('Fernhollow Cylinder Works');
    expect(res.body.job).toMatchObject({ number: job.number, state: 'parts_set_aside' });
    expect(res.body.estimate).toMatchObject({ state: 'sent', total: '547.20', currency: 'EUR' });
    expect(res.body.payments).toEqual([]);
    expect(JSON.stringify(res.body)).not.toMatch(/customer_email|@example\.test/);
  });

  it('when the customer agrees from the link (no session, no XSRF cookie), then 200 and the cut is allowed', async () => {
    const res = await anonymous().post(`/api/public/jobs/${token}/approve`).send({});
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ state: 'approved' });
    const again = await anonymous().post(`/api/public/jobs/${token}/approve`).send({});
    expect(again.status).toBe(200);
    const cut = await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut`);
    expect(cut.status).toBe(200);
    const est = (await staff.get(`/api/jobs/${job.id}/estimate`)).body;
    expect(est.approval).toMatchObject({ how: 'link' });
    expect(est.approvedVersion).toMatchObject({ version: 1, total: '547.20' });
  });

  it('when the estimate changes after approval, then it is a new draft, the approved copy is kept, and the next cut waits', async () => {
    const add = await staff.post(`/api/jobs/${job.id}/estimate/lines`, {
      description: 'Deglaze the second bore',
      quantity: 1,
      unitPrice: '14.00',
    });
    expect(add.status).toBe(201);
    const est = (await staff.get(`/api/jobs/${job.id}/estimate`)).body;
    expect(est).toMatchObject({ state: 'draft', version: 2 });
    expect(est.approvedVersion).toMatchObject({ version: 1, total: '547.20' });
    const cut = await machinist.post(`/api/jobs/${job.id}/cylinders/2/cut`);
    expect(cut.status).toBe(409);
    expect(cut.body.error.message).toMatch(/changed since the last approval/);
    // The old link cannot approve the new version unseen.
    const stale = await anonymous().post(`/api/public/jobs/${token}/approve`).send({});
    expect(stale.status).toBe(409);
  });

  it('when staff record an approval taken by phone with a note, then the cut goes ahead; a machinist may not record one', async () => {
    expect(
      (await machinist.post(`/api/jobs/${job.id}/estimate/approval`, { note: 'x' })).status,
    ).toBe(403);
    const res = await staff.post(`/api/jobs/${job.id}/estimate/approval`, {
      note: 'Agreed to the deglaze on the phone',
      how: 'phone',
    });
    expect(res.status).toBe(200);
    const est = (await staff.get(`/api/jobs/${job.id}/estimate`)).body;
    expect(est).toMatchObject({ state: 'approved', version: 2 });
    expect(est.approval).toMatchObject({
      how: 'phone',
      note: 'Agreed to the deglaze on the phone',
    });
    // 547.20 + 14.00 × 1.2 = 547.20 + 16.80 = 564.00.
    expect(est.approvedVersion).toMatchObject({ version: 2, total: '564.00' });
    expect((await machinist.post(`/api/jobs/${job.id}/cylinders/2/cut`)).status).toBe(200);
  });
});

describe('links that must open nothing', () => {
  it('when a job has no customer e-mail, then sending is 409 and nothing is queued', async () => {
    // A customer of their own: a job typed with a known name and phone joins that customer's record.
    const job = await makePricedJob(owner, staff, machinist, {
      customerName: `Wynn Castellane ${randomUUID().slice(0, 8)}`,
      customerPhone: null,
      customerEmail: null,
    });
    const before = await db('outbox').count<{ count: string }[]>('* as count');
    const res = await staff.post(`/api/jobs/${job.id}/estimate/send`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('no_email');
    const after = await db('outbox').count<{ count: string }[]>('* as count');
    expect(after[0].count).toBe(before[0].count);
    expect(await db('public_links').where({ job_id: job.id })).toHaveLength(0);
  });

  it('when a made-up, malformed, expired or closed-job token is used, then 404 with no job named', async () => {
    const email = `${uniq('cust')}@example.test`;
    const job = await makePricedJob(owner, staff, machinist, { customerEmail: email });
    await staff.post(`/api/jobs/${job.id}/estimate/send`);
    const token = await deliveredToken(email);
    const madeUp = randomBytes(32).toString('base64url');
    // One character changed: a 32-byte token's last base64url character is 'A' one time in 16.
    const oneOff = `${token.slice(0, 42)}${token.endsWith('A') ? 'E' : 'A'}`;
    for (const t of [madeUp, 'not-a-token', oneOff]) {
      const res = await anonymous().get(`/api/public/jobs/${t}`);
      expect(res.status).toBe(404);
      expect(JSON.stringify(res.body)).not.toContain(job.number);
      expect((await anonymous().post(`/api/public/jobs/${t}/approve`).send({})).status).toBe(404);
    }
    await db('public_links')
      .where({ job_id: job.id })
      .update({
        created_at: db.raw("now() - interval '61 days'"),
        expires_at: db.raw("now() - interval '1 day'"),
      });
    expect((await anonymous().get(`/api/public/jobs/${token}`)).status).toBe(404);
    expect((await anonymous().post(`/api/public/jobs/${token}/approve`).send({})).status).toBe(404);
    expect((await db('estimates').where({ job_id: job.id }).first()).state).toBe('sent');
  });

  it("when one job's link is used, then only that job shows, and closing the job ends the link", async () => {
    const [a, b] = [`${uniq('a')}@example.test`, `${uniq('b')}@example.test`];
    const jobA = await makePricedJob(owner, staff, machinist, { customerEmail: a });
    const jobB = await makePricedJob(owner, staff, machinist, { customerEmail: b });
    await staff.post(`/api/jobs/${jobA.id}/estimate/send`);
    await staff.post(`/api/jobs/${jobB.id}/estimate/send`);
    const tokenB = await deliveredToken(b);
    const res = await anonymous().get(`/api/public/jobs/${tokenB}`);
    expect(res.body.job.number).toBe(jobB.number);
    expect(JSON.stringify(res.body)).not.toContain(jobA.number);
    // Declined from B's link: A stays as it was.
    expect((await anonymous().post(`/api/public/jobs/${tokenB}/decline`).send({})).body).toEqual({
      state: 'declined',
    });
    expect((await db('estimates').where({ job_id: jobA.id }).first()).state).toBe('sent');
    const cut = await machinist.post(`/api/jobs/${jobB.id}/cylinders/1/cut`);
    expect(cut.body.error.message).toMatch(/turned it down/);
    expect((await staff.post(`/api/jobs/${jobB.id}/cancel`)).status).toBe(200);
    expect((await anonymous().get(`/api/public/jobs/${tokenB}`)).status).toBe(404);
  });

  it('when the shop turns the rule off, then a cut needs no approval', async () => {
    const job = await makePricedJob(owner, staff, machinist);
    await saveSettings(null, { cutOnlyAfterApproval: false });
    try {
      expect((await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut`)).status).toBe(200);
    } finally {
      await saveSettings(null, { cutOnlyAfterApproval: true });
    }
  });
});
