// Stock alerts keep one line per part while nobody has seen it: a part that falls to its reorder
// point, recovers (a hold let go) and falls again a minute later reopens its first alert instead
// of listing the part twice, and the buyers are mailed once. After someone has acknowledged it,
// the next fall is a new alert.
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, everyRoleSignedIn } from '../support/api';
import { jobAtStep, makeBin, makeFamily, makePart, receivePistons } from '../support/jobs-fixtures';

const { owner, buyer, machinist, staff } = everyRoleSignedIn();

beforeAll(async () => {
  await saveSettings(null, { holdExpiryDays: 14 });
});
afterAll(closeTestApp);

describe('one stock alert per part until it is seen', () => {
  it('when a part falls, recovers and falls again before anyone looks, then it is listed once and mailed once', async () => {
    const family = await makeFamily(owner, { cylinders: 1 });
    const bin = await makeBin(owner);
    const part = await makePart(owner, family, '+0.020 in', 'piston');
    expect(
      (await buyer.put(`/api/parts/${part}/reorder-rule`, { reorderPoint: 1, orderUpTo: 3 }))
        .status,
    ).toBe(200);
    await receivePistons(owner, part, bin, ['2.5360 in', '2.5361 in']);
    const job = await jobAtStep(staff, machinist, family, '+0.020 in');
    const units = await db('piston_units').where({ part_id: part }).orderBy('label');

    const alerts = async () =>
      (await buyer.get(`/api/alerts?partId=${part}&state=open`)).body as {
        items: { id: string; free: number }[];
        total: number;
      };
    const mails = async () =>
      db('outbox')
        .where({ template: 'reorder-alert' })
        .whereRaw(`data->>'alertId' = ANY(?)`, [
          (await db('alerts').where({ part_id: part }).select('id')).map((a) => a.id),
        ]);

    // Free 2 → 1: at the point, one alert.
    const first = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: units[0].id,
    });
    expect(first.status).toBe(201);
    expect((await alerts()).total).toBe(1);
    const mailedOnce = (await mails()).length;
    expect(mailedOnce).toBeGreaterThan(0);

    // Let go (free 2, recovered), then held again (free 1): still the one alert, no new mail.
    expect((await machinist.delete(`/api/holds/${first.body.id}`)).status).toBe(204);
    const again = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: units[0].id,
    });
    expect(again.status).toBe(201);
    const listed = await alerts();
    expect(listed.total).toBe(1);
    expect(listed.items[0].free).toBe(1);
    expect(await db('alerts').where({ part_id: part })).toHaveLength(1);
    expect((await mails()).length).toBe(mailedOnce);

    // Seen, recovered, fallen again: that is news, a new alert.
    expect((await buyer.post(`/api/alerts/${listed.items[0].id}/acknowledge`)).status).toBe(200);
    expect((await machinist.delete(`/api/holds/${again.body.id}`)).status).toBe(204);
    expect(
      (await machinist.post(`/api/jobs/${job.id}/holds`, { cylinder: 1, unitId: units[1].id }))
        .status,
    ).toBe(201);
    expect(await db('alerts').where({ part_id: part })).toHaveLength(2);
    expect((await alerts()).total).toBe(1);
  });
});
