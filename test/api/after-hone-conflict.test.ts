// After-honing sizes typed against an earlier state (a tablet offline at the hone, or two people
// at one cylinder) never overwrite newer ones: with `basedOn` (the sizes as last read) the server
// answers 409 with both when a size was stored differently since; without it, sizes are stored as
// before. Sizes in inches, 1 in = 25.4 mm exactly (NIST SP 811).
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp } from '../support/api';
import {
  benchShop,
  makeJob,
  makePart,
  receivePistons,
  WORN_READINGS,
} from '../support/jobs-fixtures';

const { owner, machinist, staff, family, bin } = benchShop({ cylinders: 1, machinistUnit: 'in' });

beforeAll(async () => {
  await saveSettings(null, { cutOnlyAfterApproval: false, clearancePolicy: 'min' });
});
afterAll(closeTestApp);

/** An open job whose only cylinder is cut, ready for its after-honing sizes. */
async function cutCylinder(): Promise<string> {
  const part = await makePart(owner, family, '+0.040 in', 'piston');
  const [unit] = await receivePistons(owner, part, bin.id, ['2.5555 in']);
  const job = await makeJob(staff, family.id);
  const cyl = `/api/jobs/${job.id}/cylinders/1`;
  expect((await machinist.put(`${cyl}/readings`, { readings: WORN_READINGS })).status).toBe(200);
  expect((await machinist.patch(cyl, { stepId: family.steps['+0.040 in'] })).status).toBe(200);
  expect(
    (await machinist.post(`/api/jobs/${job.id}/holds`, { cylinder: 1, unitId: unit.id })).status,
  ).toBe(201);
  expect((await machinist.post(`${cyl}/cut`)).status).toBe(200);
  return cyl;
}

describe('PATCH /api/jobs/:id/cylinders/:n with basedOn', () => {
  it('when the honed bore was recorded by someone else since, then 409 with both and nothing is overwritten', async () => {
    const cyl = await cutCylinder();
    // The tablet read the cylinder with no honed bore; meanwhile the desk records 2.5582 in.
    const desk = await machinist.patch(cyl, {
      measuredAfterHone: '2.5582 in',
      basedOn: { measuredAfterHone: null },
    });
    expect(desk.status).toBe(200);
    // 2.5582 in × 25.4 = 64.97828 mm, exactly.
    expect(desk.body.measuredAfterHone).toEqual({ mm: '64.97828', in: '2.5582' });

    const stale = await machinist.patch(cyl, {
      measuredAfterHone: '2.5590 in',
      basedOn: { measuredAfterHone: null },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_cylinder');
    expect(stale.body.error.stored.measuredAfterHone).toEqual({ mm: '64.97828', in: '2.5582' });
    // 2.5590 in × 25.4 = 64.9986 mm.
    expect(stale.body.error.yours.measuredAfterHone).toEqual({ mm: '64.9986', in: '2.5590' });
    expect(stale.body.error.yours.basedOn).toEqual({ measuredAfterHone: null });
    const jobId = cyl.split('/')[3];
    const row = await db('job_cylinders').where({ job_id: jobId, n: 1 }).first();
    // 2.5582 in = 25 582 × 2540 nm (0.0001 in = 2540 nm exactly).
    expect(row.measured_after_hone_nm).toBe(25_582 * 2540);

    // "Keep mine": sent again based on what is stored now, it is taken.
    const mine = await machinist.patch(cyl, {
      measuredAfterHone: '2.5590 in',
      basedOn: { measuredAfterHone: stale.body.error.stored.measuredAfterHone },
    });
    expect(mine.status).toBe(200);
    expect(mine.body.measuredAfterHone.in).toBe('2.5590');
  });

  it('when the stored size is already the one sent, or basedOn is left out, then it is stored as before; a malformed basedOn is refused by field', async () => {
    const cyl = await cutCylinder();
    expect((await machinist.patch(cyl, { ringGap: '0.0120 in' })).status).toBe(200);
    // Two people typing the same gap: nothing would be lost, so no conflict.
    const same = await machinist.patch(cyl, {
      ringGap: '0.0120 in',
      basedOn: { ringGap: null },
    });
    expect(same.status).toBe(200);
    expect((await machinist.patch(cyl, { ringGap: '0.0125 in' })).status).toBe(200);

    const bad = await machinist.patch(cyl, {
      ringGap: '0.0130 in',
      basedOn: { ringGap: '0.0125 in' },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toMatch(/^basedOn/);
    // basedOn alone changes nothing, which is refused as before.
    const nothing = await machinist.patch(cyl, { basedOn: { ringGap: null } });
    expect(nothing.status).toBe(400);
  });
});
