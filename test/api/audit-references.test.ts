// The audit trail names the records a change is about the way people know them: a hold by its
// job number and cylinder, the job by number, the piston by label, the part by SKU, each with the
// page that shows it; ids it cannot name stay as they are.
import { closeTestApp, signedInClients } from '../support/api';
import { jobAtStep, pistonsOnShelf } from '../support/jobs-fixtures';

const { owner, machinist, staff } = signedInClients({ owner: 'mm', machinist: 'mm', staff: 'mm' });

afterAll(closeTestApp);

describe('audit trail references', () => {
  it('when a piston is held for a job, then its trail entry names the hold, job, piston and part with links', async () => {
    const { family, part, units } = await pistonsOnShelf(owner, '+0.020 in', ['2.5360 in']);
    const [unit] = units;
    const job = await jobAtStep(staff, machinist, family, '+0.020 in');
    const hold = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: unit.id,
    });
    expect(hold.status).toBe(201);

    const res = await owner.get(`/api/audit?entity=hold&entityId=${hold.body.id}`);
    expect(res.status).toBe(200);
    const [event] = res.body.items;
    expect(event.after).toMatchObject({ jobId: job.id, unitId: unit.id, partId: part });
    const parts = await owner.get(`/api/parts/${part}`);
    expect(res.body.refs).toEqual({
      [`hold:${hold.body.id}`]: {
        kind: 'hold',
        id: hold.body.id,
        label: `job ${job.number}, cylinder 1`,
        link: `/jobs/${job.id}`,
      },
      [`job:${job.id}`]: { kind: 'job', id: job.id, label: job.number, link: `/jobs/${job.id}` },
      [`piston_unit:${unit.id}`]: {
        kind: 'piston_unit',
        id: unit.id,
        label: unit.label,
        link: '/stock/ledger',
        query: { unitId: unit.id },
      },
      [`part:${part}`]: {
        kind: 'part',
        id: part,
        label: parts.body.sku,
        link: `/catalog/parts/${part}`,
      },
    });
  });

  it('when a change names a record that no longer exists or a kind it cannot read, then nothing is made up', async () => {
    const res = await owner.get('/api/audit?entity=settings');
    expect(res.status).toBe(200);
    for (const key of Object.keys(res.body.refs)) expect(key).not.toMatch(/^settings:/);
  });
});
