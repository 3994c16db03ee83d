// The bore sheet's "Done" ticks kept with the cylinder: how many passes are done, in order. A tick
// made against an older count (a tablet offline at the bar, or two people) is refused with both
// counts; without `basedOn` the count is set as asked.
import { db } from '../../server/db/knex';
import { closeTestApp, signedInClients } from '../support/api';
import { makeFamily, makeJob, WORN_READINGS, type Family } from '../support/jobs-fixtures';

const { owner, machinist, staff } = signedInClients({ owner: 'mm', machinist: 'in', staff: 'mm' });
let family: Family;

beforeAll(async () => {
  family = await makeFamily(owner, { cylinders: 1 });
});
afterAll(closeTestApp);

async function passesDone(jobId: string): Promise<number> {
  const row = await db('job_cylinders').where({ job_id: jobId, n: 1 }).first();
  return row.passes_done;
}

describe('PUT /api/jobs/:id/cylinders/:n/passes-done', () => {
  it('when passes are ticked on the count last seen, then they are kept; a tick made against an older count is refused with both and changes nothing', async () => {
    const job = await makeJob(staff, family.id);
    const url = `/api/jobs/${job.id}/cylinders/1/passes-done`;
    await machinist.put(`/api/jobs/${job.id}/cylinders/1/readings`, { readings: WORN_READINGS });

    const first = await machinist.put(url, { done: 1, basedOn: 0 });
    expect(first.status).toBe(200);
    expect(first.body).toEqual({ passesDone: 1 });
    expect((await machinist.put(url, { done: 2, basedOn: 1 })).body).toEqual({ passesDone: 2 });

    // The tablet, offline since the first tick, ticks the second pass again from its old count.
    const stale = await machinist.put(url, { done: 3, basedOn: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_passes');
    expect(stale.body.error.stored).toEqual({ passesDone: 2 });
    expect(stale.body.error.yours).toEqual({ basedOn: 1, passesDone: 3 });
    expect(await passesDone(job.id)).toBe(2);

    // Already where the tick would put it: nothing to refuse.
    expect((await machinist.put(url, { done: 2, basedOn: 1 })).status).toBe(200);
    const sheetJob = await machinist.get(`/api/jobs/${job.id}`);
    expect(sheetJob.status).toBe(200);
    const events = await db('job_events').where({ job_id: job.id }).select('text');
    expect(events.map((e) => e.text)).toEqual(
      expect.arrayContaining(['Cylinder 1: 1 pass done.', 'Cylinder 1: 2 passes done.']),
    );
  });

  it('when the count is not a whole number from 0 to 100, or staff tick, then it is refused', async () => {
    const job = await makeJob(staff, family.id);
    const url = `/api/jobs/${job.id}/cylinders/1/passes-done`;
    for (const done of [-1, 101, 1.5, '2']) {
      const res = await machinist.put(url, { done });
      expect([done, res.status]).toEqual([done, 400]);
      expect(res.body.error.details[0].field).toBe('done');
    }
    expect((await staff.put(url, { done: 1 })).status).toBe(403);
    expect(await passesDone(job.id)).toBe(0);
  });
});
