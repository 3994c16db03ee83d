// The job bench marks the jobs whose estimate is with the customer, unanswered: the list and the
// job itself say awaitingApproval from sending until the customer (or the counter) answers.
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, signedInClients, uniq } from '../support/api';
import { makeLabour, makePricedJob } from '../support/money-fixtures';

const { owner, staff, machinist } = signedInClients({ owner: 'mm', staff: 'mm', machinist: 'in' });

beforeAll(async () => {
  await saveSettings(null, { cutOnlyAfterApproval: true, maxCutPerPass: '0.020 in' });
  await makeLabour(owner);
});
afterAll(async () => {
  await closeTestApp();
});

async function flags(job: { id: string; number: string }) {
  const list = await machinist.get(`/api/jobs?state=open&q=${encodeURIComponent(job.number)}`);
  expect(list.status).toBe(200);
  const item = (list.body.items as { id: string; awaitingApproval: boolean }[]).find(
    (i) => i.id === job.id,
  );
  const one = await machinist.get(`/api/jobs/${job.id}`);
  expect(one.status).toBe(200);
  return { list: item?.awaitingApproval, job: one.body.awaitingApproval as boolean };
}

it('when the estimate is sent, then the bench marks the job until the approval is recorded', async () => {
  const job = await makePricedJob(owner, staff, machinist, {
    customerEmail: `${uniq('bench')}@example.test`,
  });
  expect(await flags(job)).toEqual({ list: false, job: false });

  expect((await staff.post(`/api/jobs/${job.id}/estimate/send`)).status).toBe(200);
  expect(await flags(job)).toEqual({ list: true, job: true });

  const agreed = await staff.post(`/api/jobs/${job.id}/estimate/approval`, { note: 'by phone' });
  expect(agreed.status).toBe(200);
  expect(await flags(job)).toEqual({ list: false, job: false });
});
