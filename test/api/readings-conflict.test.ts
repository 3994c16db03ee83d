// Readings typed against an earlier state (a tablet that was offline, or two people at one
// cylinder) never overwrite newer ones: with `basedOn` the server answers 409 with both versions
// when the stored readings changed since; without it, readings are stored as before.
import { db } from '../../server/db/knex';
import { closeTestApp, signedInClients } from '../support/api';
import { makeFamily, makeJob, WORN_READINGS, type Family } from '../support/jobs-fixtures';

const { owner, machinist } = signedInClients({ owner: 'mm', machinist: 'in' });
let family: Family;

beforeAll(async () => {
  family = await makeFamily(owner, { cylinders: 1 });
});
afterAll(closeTestApp);

const LATER = WORN_READINGS.map((r) =>
  r.depth === 'top' && r.axis === 'pin' ? { ...r, diameter: '2.5270 in' } : r,
);

describe('PUT /api/jobs/:id/cylinders/:n/readings with basedOn', () => {
  it('when readings were changed since the entry was typed, then 409 with both versions and nothing is overwritten', async () => {
    const job = await makeJob(machinist, family.id);
    const url = `/api/jobs/${job.id}/cylinders/1/readings`;
    // First readings, typed on a cylinder that had none.
    const first = await machinist.put(url, { readings: WORN_READINGS, basedOn: null });
    expect(first.status).toBe(200);
    const seen = first.body.cylinder.measuredAt as string;
    expect(seen).toEqual(expect.any(String));

    // Someone at the desk corrects the top reading, based on what they saw.
    const desk = await machinist.put(url, { readings: LATER, basedOn: seen });
    expect(desk.status).toBe(200);
    const now = desk.body.cylinder.measuredAt as string;
    expect(now).not.toBe(seen);

    // The tablet, offline since the first readings, sends its own set based on them.
    const stale = await machinist.put(url, { readings: WORN_READINGS, basedOn: seen });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_readings');
    expect(stale.body.error.stored.measuredAt).toBe(now);
    const top = (rs: { depth: string; axis: string; diameter: { in: string } }[]) =>
      rs.find((r) => r.depth === 'top' && r.axis === 'pin')?.diameter.in;
    expect(top(stale.body.error.stored.readings)).toBe('2.5270');
    expect(top(stale.body.error.yours.readings)).toBe('2.5260');
    expect(stale.body.error.yours.basedOn).toBe(seen);
    const kept = await db('bore_readings')
      .where({ job_id: job.id, n: 1, depth: 'top', axis: 'pin' })
      .first();
    expect(kept.diameter_nm).toBe(Math.round(2.527 * 25_400_000));

    // An entry that believed the cylinder had no readings is stale too.
    const blind = await machinist.put(url, { readings: WORN_READINGS, basedOn: null });
    expect(blind.status).toBe(409);
    expect(blind.body.error.code).toBe('stale_readings');
  });

  it('when basedOn is not a time, then 400 on basedOn; without it, readings are stored as before', async () => {
    const job = await makeJob(machinist, family.id);
    const url = `/api/jobs/${job.id}/cylinders/1/readings`;
    const bad = await machinist.put(url, { readings: WORN_READINGS, basedOn: 'yesterday' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('basedOn');
    expect((await machinist.put(url, { readings: WORN_READINGS })).status).toBe(200);
    expect((await machinist.put(url, { readings: LATER })).status).toBe(200);
  });
});
