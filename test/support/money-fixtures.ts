// Rows the money tests need: a priced labour list (invented prices) and a job on a two-stroke twin
// with both cylinders measured, a step chosen and the measured piston and a ring set held for each.
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { ok, uniq, type Client } from './api';
import {
  makeBin,
  makeFamily,
  makeJob,
  makePart,
  receiveCounted,
  receivePistons,
  WORN_READINGS,
  type Family,
} from './jobs-fixtures';

export interface Labour {
  bore: string;
  hone: string;
  chamfer: string;
  clean: string;
}

/** Bore 55.00 and hone 25.00 per bored cylinder, chamfer 18.50 per two-stroke cylinder, clean 12.00 per job. */
export async function makeLabour(owner: Client): Promise<Labour> {
  const add = async (name: string, per: string, price: string, proposeFor: string) =>
    (
      ok(
        await owner.post('/api/labour-operations', {
          name: `${name} ${uniq('')}`,
          per,
          price,
          proposeFor,
        }),
        201,
        'labour operation',
      ) as { id: string }
    ).id;
  return {
    bore: await add('Bore one cylinder', 'cylinder', '55.00', 'bored'),
    hone: await add('Hone one cylinder', 'cylinder', '25.00', 'bored'),
    chamfer: await add('Chamfer the port edges', 'cylinder', '18.50', 'bored_two_stroke'),
    clean: await add('Clean and inspect', 'job', '12.00', 'every_job'),
  };
}

/**
 * The shop the money files share: tax 20 % added to the prices, the cut waiting for the customer's
 * approval, the least clearance and cuts of 0.020 in a pass, with `settings` over those; then
 * only `makeLabour`'s prices are active, whatever another file left. Returns those prices.
 */
export async function moneyShop(
  owner: Client,
  settings: Parameters<typeof saveSettings>[1] = {},
): Promise<Labour> {
  await saveSettings(null, {
    taxRate: '20',
    pricesIncludeTax: false,
    cutOnlyAfterApproval: true,
    clearancePolicy: 'min',
    maxCutPerPass: '0.020 in',
    ...settings,
  });
  await db('labour_operations').update({ active: false });
  return makeLabour(owner);
}

export interface PricedJob {
  id: string;
  number: string;
  family: Family;
}

/** A two-cylinder job, both bored to +0.040 in with a piston (89.00) and a ring set (34.50) held each. */
export async function makePricedJob(
  owner: Client,
  staff: Client,
  machinist: Client,
  extra: Record<string, unknown> = {},
): Promise<PricedJob> {
  const family = await makeFamily(owner, { cylinders: 2 });
  const binId = await makeBin(owner);
  const piston = await makePart(owner, family, '+0.040 in', 'piston', '89.00');
  const rings = await makePart(owner, family, '+0.040 in', 'rings', '34.50');
  const units = await receivePistons(owner, piston, binId, ['2.5555 in', '2.5556 in']);
  await receiveCounted(owner, rings, binId, 2);
  const job = await makeJob(staff, family.id, { cylinders: 2, ...extra });
  for (const n of [1, 2]) {
    ok(
      await machinist.put(`/api/jobs/${job.id}/cylinders/${n}/readings`, {
        readings: WORN_READINGS,
      }),
      200,
      'readings',
    );
    ok(
      await machinist.patch(`/api/jobs/${job.id}/cylinders/${n}`, {
        stepId: family.steps['+0.040 in'],
      }),
      200,
      'step',
    );
    ok(
      await machinist.post(`/api/jobs/${job.id}/holds`, { cylinder: n, unitId: units[n - 1].id }),
      201,
      'piston hold',
    );
    ok(
      await machinist.post(`/api/jobs/${job.id}/holds`, {
        cylinder: n,
        partId: rings,
        quantity: 1,
      }),
      201,
      'ring hold',
    );
  }
  return { id: job.id, number: job.number, family };
}
