// Taking back "marked as cut", against the real app and database: the machinist who cut may within
// ten minutes, the owner at any time with a reason; everyone else is refused. Each undo leaves a
// job event and an audit row with the reason; a cylinder measured after honing keeps its cut.
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { type Client, closeTestApp, signedIn, signedInClients } from '../support/api';
import { makeLabour, makePricedJob } from '../support/money-fixtures';

const { owner, staff, machinist } = signedInClients({ owner: 'mm', staff: 'mm', machinist: 'in' });
let otherMachinist: Client;

beforeAll(async () => {
  otherMachinist = await signedIn('machinist');
  await saveSettings(null, { cutOnlyAfterApproval: false, maxCutPerPass: '0.020 in' });
  await makeLabour(owner);
});
afterAll(closeTestApp);

async function cutJob(): Promise<{ id: string; number: string }> {
  const job = await makePricedJob(owner, staff, machinist);
  const cut = await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut`);
  expect(cut.status).toBe(200);
  return job;
}

async function cylinder(jobId: string) {
  return db('job_cylinders').where({ job_id: jobId, n: 1 }).first();
}

async function undoAudits(jobId: string) {
  return db('audit_events')
    .where({ action: 'cylinder.cut_undo', entity: 'job', entity_id: jobId })
    .orderBy('id');
}

describe('taking back a cut', () => {
  it('when the machinist who cut takes it back at once, then the cut is gone, the job is back to parts set aside, and an event and an audit row say so', async () => {
    const job = await cutJob();
    expect((await db('jobs').where({ id: job.id }).first()).state).toBe('on_the_bar');
    const res = await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut/undo`, {});
    expect(res.status).toBe(200);
    expect(res.body.cutAt).toBeNull();
    const row = await cylinder(job.id);
    expect(row.cut_at).toBeNull();
    expect(row.cut_by).toBeNull();
    expect((await db('jobs').where({ id: job.id }).first()).state).toBe('parts_set_aside');
    const events = await db('job_events').where({ job_id: job.id }).orderBy('at').select('text');
    expect(events.map((e) => e.text)).toEqual(
      expect.arrayContaining([
        'Cut of cylinder 1 taken back; its readings and step may change again.',
        'On the bar → Parts set aside.',
      ]),
    );
    const audits = await undoAudits(job.id);
    expect(audits).toHaveLength(1);
    expect(audits[0].before).toMatchObject({ cylinder: 1 });
    expect(audits[0].after).toEqual({ cylinder: 1, cutAt: null, reason: null });
    // Taken back, it can be marked as cut again.
    const again = await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut`);
    expect(again.status).toBe(200);
  });

  it('when another machinist tries to take the cut back, then 403 says who may, and the cut stays', async () => {
    const job = await cutJob();
    const res = await otherMachinist.post(`/api/jobs/${job.id}/cylinders/1/cut/undo`, {});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('undo_not_allowed');
    expect(res.body.error.message).toMatch(/within 10 minutes; after that the owner may/);
    expect((await cylinder(job.id)).cut_at).not.toBeNull();
    expect(await undoAudits(job.id)).toHaveLength(0);
  });

  it('when the cutter asks after ten minutes, then 403 and the cut stays', async () => {
    const job = await cutJob();
    await db('job_cylinders')
      .where({ job_id: job.id, n: 1 })
      .update({ cut_at: db.raw(`now() - interval '11 minutes'`) });
    const res = await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut/undo`, {});
    expect(res.status).toBe(403);
    expect((await cylinder(job.id)).cut_at).not.toBeNull();
  });

  it('when the owner takes a cut back without a reason, then 400 names the reason field; with one, the cut is gone and the reason kept', async () => {
    const job = await cutJob();
    await db('job_cylinders')
      .where({ job_id: job.id, n: 1 })
      .update({ cut_at: db.raw(`now() - interval '3 days'`) });
    const bare = await owner.post(`/api/jobs/${job.id}/cylinders/1/cut/undo`, {});
    expect(bare.status).toBe(400);
    expect(bare.body.error.details).toEqual([{ field: 'reason', message: 'say why' }]);
    expect((await cylinder(job.id)).cut_at).not.toBeNull();

    const reason = 'Marked on the wrong cylinder; this one is still on the rack.';
    const res = await owner.post(`/api/jobs/${job.id}/cylinders/1/cut/undo`, { reason });
    expect(res.status).toBe(200);
    expect((await cylinder(job.id)).cut_at).toBeNull();
    const audits = await undoAudits(job.id);
    expect(audits.map((a) => a.after.reason)).toEqual([reason]);
    const events = await db('job_events').where({ job_id: job.id }).select('text');
    expect(events.map((e) => e.text)).toContain(`Cut of cylinder 1 taken back; reason: ${reason}`);
  });

  it('when staff ask, then 403 and nothing changes', async () => {
    const job = await cutJob();
    const res = await staff.post(`/api/jobs/${job.id}/cylinders/1/cut/undo`, {});
    expect(res.status).toBe(403);
    expect((await cylinder(job.id)).cut_at).not.toBeNull();
  });

  it('when the honed bore is already recorded, then 409 and the cut stays', async () => {
    const job = await cutJob();
    const honed = await machinist.patch(`/api/jobs/${job.id}/cylinders/1`, {
      measuredAfterHone: '2.5571 in',
    });
    expect(honed.status).toBe(200);
    const res = await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut/undo`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('measured_after');
    expect((await cylinder(job.id)).cut_at).not.toBeNull();
  });

  it('when a cylinder that is not cut is taken back, then 409', async () => {
    const job = await makePricedJob(owner, staff, machinist);
    const res = await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut/undo`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('not_cut');
  });
});
