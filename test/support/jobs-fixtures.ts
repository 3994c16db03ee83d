// Rows the job tests need, made through the catalog and stock API like a shop would: an imperial
// step series, an invented air-cooled two-stroke family, piston and ring parts per step, and
// measured pistons received into a bin.
import type { saveSettings } from '../../server/settings/settings-service';
import { everyRoleSignedIn, ok, uniq, type Client } from './api';

export interface Family {
  id: string;
  code: string;
  steps: Record<string, string>;
}

/**
 * Standard bore 2.5170 in, steps of 0.010 in to +0.040 in (nominal +0.040 = 2.5570 in), clearance
 * 0.0015–0.0025 in, hone allowance 0.0020 in, clean-up 0.0030 in, ring end gap 0.008–0.016 in.
 */
export async function makeFamily(
  owner: Client,
  opts: { cylinders?: number } = {},
): Promise<Family> {
  const series = ok(
    await owner.post('/api/step-series', {
      code: uniq('S'),
      name: 'Imperial tens to forty',
      unit: 'in',
      offsets: ['0.010', '0.020', '0.030', '0.040'],
    }),
    201,
    'step series',
  ) as { id: string; steps: { id: string; label: string }[] };
  const code = uniq('F').toUpperCase();
  const family = ok(
    await owner.post('/api/engine-families', {
      code,
      name: 'Invented single, air-cooled two-stroke',
      strokeType: 'two',
      cylinders: opts.cylinders ?? 2,
      cooling: 'air',
      standardBore: '2.5170 in',
      stroke: '2.2000 in',
      clearanceMin: '0.0015 in',
      clearanceMax: '0.0025 in',
      honeAllowance: '0.0020 in',
      cleanup: '0.0030 in',
      maxOversize: '0.040 in',
      stepSeriesId: series.id,
      maxTaper: '0.0040 in',
      maxOutOfRound: '0.0020 in',
      ringGapMin: '0.008 in',
      ringGapMax: '0.016 in',
    }),
    201,
    'engine family',
  ) as { id: string };
  const steps: Record<string, string> = {};
  for (const s of series.steps) steps[s.label] = s.id;
  return { id: family.id, code, steps };
}

export async function makePart(
  owner: Client,
  family: Family,
  step: string,
  kind: 'piston' | 'rings',
  salePrice = kind === 'piston' ? '89.00' : '34.50',
): Promise<string> {
  const body = kind === 'piston' ? { material: 'cast', ringCount: 2 } : {};
  const part = ok(
    await owner.post('/api/parts', {
      kind,
      sku: uniq(kind === 'piston' ? 'PST' : 'RNG').toUpperCase(),
      familyId: family.id,
      stepId: family.steps[step],
      description: `${kind === 'piston' ? 'Cast piston' : 'Ring set'} ${step}`,
      salePrice,
      ...body,
    }),
    201,
    'part',
  ) as { id: string };
  return part.id;
}

export async function makeBin(owner: Client): Promise<string> {
  const bin = ok(await owner.post('/api/bins', { code: uniq('B') }), 201, 'bin') as { id: string };
  return bin.id;
}

/**
 * The file's family (`makeFamily` with `opts`) and bin, made by the owner in a `beforeAll` this
 * registers and filled in place, so a file names them at the top; declare it after the owner's
 * sign-in (hooks run in the order they are declared).
 */
export function familyAndBin(
  owner: Client,
  opts: { cylinders?: number } = {},
): { family: Family; bin: { id: string } } {
  const rows = { family: { id: '', code: '', steps: {} } as Family, bin: { id: '' } };
  beforeAll(async () => {
    Object.assign(rows.family, await makeFamily(owner, opts));
    rows.bin.id = await makeBin(owner);
  });
  return rows;
}

/**
 * The bench files' shop: an owner, a buyer and staff reading millimetres, a machinist reading
 * `machinistUnit`, and the file's family and bin (`familyAndBin`), all made before its tests.
 */
export function benchShop(opts: { cylinders?: number; machinistUnit?: 'mm' | 'in' } = {}) {
  const clients = everyRoleSignedIn({ machinist: opts.machinistUnit ?? 'mm' });
  return { ...clients, ...familyAndBin(clients.owner, { cylinders: opts.cylinders }) };
}

/** Receives measured pistons (one per skirt) and returns their unit ids in order. */
export async function receivePistons(
  owner: Client,
  partId: string,
  binId: string,
  skirts: string[],
  unitCost = '41.20',
): Promise<{ id: string; label: string }[]> {
  const receipt = ok(
    await owner.post('/api/stock/receipts', {
      partId,
      quantity: skirts.length,
      binId,
      unitCost,
      units: skirts.map((skirt) => ({ skirt })),
    }),
    201,
    'piston receipt',
  ) as { units: { id: string; label: string }[] };
  return receipt.units.map((u) => ({ id: u.id, label: u.label }));
}

export async function receiveCounted(
  owner: Client,
  partId: string,
  binId: string,
  quantity: number,
  unitCost = '12.40',
): Promise<void> {
  ok(
    await owner.post('/api/stock/receipts', { partId, quantity, binId, unitCost }),
    201,
    'counted receipt',
  );
}

export async function makeJob(
  client: Client,
  familyId: string,
  extra: Record<string, unknown> = {},
): Promise<{ id: string; number: string; state: string }> {
  return ok(
    await client.post('/api/jobs', {
      customerName: 'Odile Farrant',
      customerPhone: '555 0142',
      customerEmail: 'odile@example.test',
      familyId,
      cylinders: 1,
      ...extra,
    }),
    201,
    'job',
  ) as { id: string; number: string; state: string };
}

/**
 * The cut settings the bench figures of the job tests are worked out with: the least clearance,
 * passes of 0.001 to 0.020 in with no truing or finishing pass of their own, a bar read to
 * 0.0001 in, the first step that cleans up, and UTC. Spread into the file's `saveSettings`.
 */
export const CUT_SETTINGS = {
  clearancePolicy: 'min',
  maxCutPerPass: '0.020 in',
  finishPass: '',
  truingPass: '',
  minCutPerPass: '0.001 in',
  barResolution: '0.0001 in',
  stepPolicy: 'first-that-cleans',
  timeZone: 'UTC',
} satisfies Parameters<typeof saveSettings>[1];

/** Six readings in inches, worst 2.5260 in at the top along the pin axis. */
export const WORN_READINGS = [
  { depth: 'top', axis: 'pin', diameter: '2.5260 in' },
  { depth: 'top', axis: 'thrust', diameter: '2.5248 in' },
  { depth: 'middle', axis: 'pin', diameter: '2.5231 in' },
  { depth: 'middle', axis: 'thrust', diameter: '2.5227 in' },
  { depth: 'bottom', axis: 'pin', diameter: '2.5205 in' },
  { depth: 'bottom', axis: 'thrust', diameter: '2.5204 in' },
];

/**
 * A one-cylinder job taken in by `staff` (`makeJob` with `extra`), its cylinder measured with
 * `WORN_READINGS` and set to `step` by `machinist`; a refused call fails at once.
 */
export async function jobAtStep(
  staff: Client,
  machinist: Client,
  family: Family,
  step: string,
  extra: Record<string, unknown> = {},
): Promise<{ id: string; number: string; state: string }> {
  const job = await makeJob(staff, family.id, extra);
  const cylinder = `/api/jobs/${job.id}/cylinders/1`;
  ok(await machinist.put(`${cylinder}/readings`, { readings: WORN_READINGS }), 200, 'readings');
  ok(await machinist.patch(cylinder, { stepId: family.steps[step] }), 200, 'step');
  return job;
}

/**
 * A fresh one-cylinder family with a bin and a piston part at `step`, and measured pistons of
 * that part received into the bin, one per skirt.
 */
export async function pistonsOnShelf(
  owner: Client,
  step: string,
  skirts: string[],
): Promise<{ family: Family; part: string; units: { id: string; label: string }[] }> {
  const family = await makeFamily(owner, { cylinders: 1 });
  const binId = await makeBin(owner);
  const part = await makePart(owner, family, step, 'piston');
  return { family, part, units: await receivePistons(owner, part, binId, skirts) };
}
