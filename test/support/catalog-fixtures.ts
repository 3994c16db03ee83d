// Catalog rows for API tests, made through the API itself: a step series, an engine family, its
// piston and ring parts, and a bin. Every call makes fresh rows with unique codes.
import { ok, uniq, type Client } from './api';

export interface Fixture {
  seriesId: string;
  steps: { id: string; label: string }[];
  familyId: string;
  familyCode: string;
  binId: string;
  binCode: string;
}

export async function makeSeries(
  owner: Client,
  unit: 'mm' | 'in',
  offsets: string[],
): Promise<{ id: string; steps: { id: string; label: string }[] }> {
  return ok(
    await owner.post('/api/step-series', {
      code: uniq('S').toUpperCase(),
      name: `Test series ${unit}`,
      unit,
      offsets,
    }),
    201,
    'create series',
  );
}

export async function makeBin(client: Client): Promise<{ id: string; code: string }> {
  return ok(
    await client.post('/api/bins', { code: uniq('B').toUpperCase(), name: 'Test shelf' }),
    201,
    'create bin',
  );
}

/** An imperial two-stroke family on a 2.5000 in standard bore, steps STD … +0.040 in. */
export async function makeFamily(
  owner: Client,
  opts: { unit?: 'mm' | 'in'; code?: string; maxOversize?: string } = {},
): Promise<Fixture> {
  const unit = opts.unit ?? 'in';
  const series =
    unit === 'in'
      ? await makeSeries(owner, 'in', ['0', '0.010', '0.020', '0.030', '0.040'])
      : await makeSeries(owner, 'mm', ['0', '0.25', '0.50', '0.75', '1.00']);
  const code = opts.code ?? uniq('F').toUpperCase();
  const family = ok<{ id: string; code: string }>(
    await owner.post('/api/engine-families', {
      code,
      name: `Test family ${code}`,
      strokeType: 'two',
      cylinders: 1,
      cooling: 'air',
      standardBore: unit === 'in' ? '2.5000 in' : '64.00 mm',
      stroke: unit === 'in' ? '2.2500 in' : '58.00 mm',
      clearanceMin: unit === 'in' ? '0.0015 in' : '0.040 mm',
      clearanceMax: unit === 'in' ? '0.0025 in' : '0.060 mm',
      honeAllowance: unit === 'in' ? '0.0010 in' : '0.025 mm',
      cleanup: unit === 'in' ? '0.0020 in' : '0.05 mm',
      maxOversize: opts.maxOversize ?? (unit === 'in' ? '0.040 in' : '1.00 mm'),
      stepSeriesId: series.id,
    }),
    201,
    'create family',
  );
  const bin = await makeBin(owner);
  return {
    seriesId: series.id,
    steps: series.steps,
    familyId: family.id,
    familyCode: family.code,
    binId: bin.id,
    binCode: bin.code,
  };
}

export async function makePart(
  owner: Client,
  fixture: Fixture,
  kind: 'piston' | 'rings' | 'other',
  stepIndex = 0,
  extra: Record<string, unknown> = {},
): Promise<{ id: string; sku: string }> {
  const sized = kind !== 'other';
  return ok(
    await owner.post('/api/parts', {
      kind,
      sku: uniq(kind.slice(0, 2).toUpperCase()).toUpperCase(),
      description: `Test ${kind}`,
      ...(sized ? { familyId: fixture.familyId, stepId: fixture.steps[stepIndex].id } : {}),
      ...(kind === 'piston' ? { material: 'cast', ringCount: 2 } : {}),
      salePrice: '40.00',
      ...extra,
    }),
    201,
    `create ${kind}`,
  );
}
