// Catalog API: engine families, step series, the step ladder, exposure and parts, against the real
// app and database. Length checks rest on 1 in = 25.4 mm exactly (international yard and pound
// agreement of 1959, as stated in NIST Special Publication 811, appendix B).
import { db } from '../../server/db/knex';
import { type Client, closeTestApp, everyRoleSignedIn, uniq } from '../support/api';
import {
  makeBin,
  makeFamily,
  makePart,
  makeSeries,
  type Fixture,
} from '../support/catalog-fixtures';

const { owner, buyer, machinist, staff } = everyRoleSignedIn({ staff: 'in' });

afterAll(closeTestApp);

async function receive(
  client: Client,
  body: { partId: string; quantity: number; binId: string; unitCost?: string; units?: unknown[] },
) {
  const res = await client.post('/api/stock/receipts', { unitCost: '20.00', ...body });
  expect(res.status).toBe(201);
  return res.body;
}

describe('step series', () => {
  it('when a series is given offsets, then it answers every step with its exact offset, STD first', async () => {
    const series = await makeSeries(owner, 'in', ['0.010', '0.020', '0.030', '0.040', '0.060']);
    const res = await machinist.get('/api/step-series');
    expect(res.status).toBe(200);
    const found = res.body.items.find((s: { id: string }) => s.id === series.id);
    expect(found.steps.map((s: { label: string }) => s.label)).toEqual([
      'STD',
      '+0.010 in',
      '+0.020 in',
      '+0.030 in',
      '+0.040 in',
      '+0.060 in',
    ]);
    // 0.060 in × 25.4 mm/in = 1.524 mm exactly.
    expect(found.steps[5].offset).toEqual({ mm: '1.524', in: '0.0600' });
  });

  it('when the offsets do not go up, then 400 names the offsets', async () => {
    const res = await owner.post('/api/step-series', {
      code: uniq('S'),
      name: 'Bad',
      unit: 'mm',
      offsets: ['0.50', '0.25'],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('offsets');
  });
});

describe('engine families', () => {
  let fx: Fixture;
  beforeAll(async () => {
    fx = await makeFamily(owner);
  });

  it('when the list is read by any role, then it has the contract shape with lengths in both units', async () => {
    const res = await staff.get(`/api/engine-families?q=${fx.familyCode}`);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(1);
    const item = res.body.items[0];
    expect(item).toMatchObject({
      id: fx.familyId,
      code: fx.familyCode,
      strokeType: 'two',
      cylinders: 1,
      // 2.5 in × 25.4 = 63.5 mm; 0.0015 in = 0.0381 mm; 0.0025 in = 0.0635 mm; 0.040 in = 1.016 mm.
      standardBore: { mm: '63.500', in: '2.5000' },
      clearance: { min: { mm: '0.0381', in: '0.0015' }, max: { mm: '0.0635', in: '0.0025' } },
      honeAllowance: { mm: '0.0254', in: '0.0010' },
      maxOversize: { mm: '1.016', in: '0.0400' },
    });
    expect(typeof item.name).toBe('string');
  });

  it('when one family is read, then it answers the same shape; an unknown id is 404', async () => {
    const res = await machinist.get(`/api/engine-families/${fx.familyId}`);
    expect(res.status).toBe(200);
    expect(res.body.code).toBe(fx.familyCode);
    const missing = await machinist.get(
      '/api/engine-families/00000000-0000-4000-8000-000000000000',
    );
    expect(missing.status).toBe(404);
  });

  it.each(['', 'abc', '-0.01 in', '9 m', '2.5 furlongs'])(
    'when the standard bore is "%s", then 400 names standardBore and nothing is written',
    async (bad) => {
      const code = uniq('BAD');
      const res = await owner.post('/api/engine-families', {
        code,
        name: 'Bad bore',
        strokeType: 'four',
        cylinders: 2,
        cooling: 'liquid',
        standardBore: bad,
        stroke: '60 mm',
        clearanceMin: '0.03 mm',
        clearanceMax: '0.05 mm',
        honeAllowance: '0.02 mm',
        cleanup: '0.05 mm',
        maxOversize: '1 mm',
        stepSeriesId: fx.seriesId,
      });
      expect(res.status).toBe(400);
      expect(res.body.error.details.map((d: { field: string }) => d.field)).toContain(
        'standardBore',
      );
      expect(res.body.error.message).toMatch(/^standardBore: /);
      expect(await db('engine_families').where({ code }).first()).toBeUndefined();
    },
  );

  it('when the clearance range is upside down, then 400 names clearanceMax', async () => {
    const res = await owner.patch(`/api/engine-families/${fx.familyId}`, {
      clearanceMin: '0.0030 in',
      clearanceMax: '0.0020 in',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('clearanceMax');
  });

  it('when a buyer edits a family, then the change is stored exactly and audited', async () => {
    const res = await buyer.patch(`/api/engine-families/${fx.familyId}`, {
      maxTaper: '0.0020 in',
      ringGapMin: '0.20 mm',
      ringGapMax: '0.40 mm',
    });
    expect(res.status).toBe(200);
    expect(res.body.maxTaper).toEqual({ mm: '0.0508', in: '0.0020' });
    expect(res.body.ringGap.max).toEqual({ mm: '0.400', in: '0.0157' });
    const row = await db('engine_families').where({ id: fx.familyId }).first();
    expect(row.max_taper_nm).toBe(50_800);
    const audit = await db('audit_events')
      .where({ entity: 'engine_family', entity_id: fx.familyId, action: 'engine_family.update' })
      .first();
    expect(audit).toBeDefined();
  });

  it('when the code is already taken, then 409', async () => {
    const other = await makeFamily(owner);
    const res = await owner.patch(`/api/engine-families/${other.familyId}`, {
      code: fx.familyCode,
    });
    expect(res.status).toBe(409);
  });

  it('when staff tries to create a family, then 403', async () => {
    const res = await staff.post('/api/engine-families', { code: 'X' });
    expect(res.status).toBe(403);
  });
});

describe('step ladder', () => {
  it('when pistons are received, then the ladder shows every step with counts, units and nominal bores', async () => {
    const fx = await makeFamily(owner);
    const piston = await makePart(owner, fx, 'piston', 2);
    const rings = await makePart(owner, fx, 'rings', 2);
    await receive(staff, {
      partId: piston.id,
      quantity: 2,
      binId: fx.binId,
      units: [{ skirt: '2.5183 in' }, {}],
    });
    await receive(staff, { partId: rings.id, quantity: 4, binId: fx.binId });

    const res = await machinist.get(`/api/engine-families/${fx.familyId}/ladder`);
    expect(res.status).toBe(200);
    expect(res.body.family.id).toBe(fx.familyId);
    expect(res.body.steps).toHaveLength(5);
    const step = res.body.steps[2];
    expect(step).toMatchObject({
      stepId: fx.steps[2].id,
      label: '+0.020 in',
      // 2.500 in + 0.020 in = 2.520 in = 64.008 mm exactly.
      offset: { mm: '0.508', in: '0.0200' },
      nominalBore: { mm: '64.008', in: '2.5200' },
      // The piston still to measure is on hand but not free for a bore (the one rule of
      // stock/part-needs that the job bench uses too).
      pistons: { onHand: 2, held: 0, free: 1, onOrder: 0 },
      pistonsToMeasure: 1,
      rings: { onHand: 4, held: 0, free: 4, onOrder: 0 },
      nothingFree: false,
      missing: [],
    });
    // Measured first, then the one "to measure": free with no skirt.
    expect(step.units).toHaveLength(2);
    expect(step.units[0]).toMatchObject({
      partId: piston.id,
      skirt: { mm: '63.96482', in: '2.5183' },
      status: 'free',
      bin: fx.binCode,
    });
    expect(step.units[0].label).toMatch(/^PU-\d{6,}$/);
    expect(step.units[1]).toMatchObject({ skirt: null, status: 'free' });
    expect(res.body.steps[0]).toMatchObject({
      label: 'STD',
      nominalBore: { mm: '63.500', in: '2.5000' },
      pistons: { onHand: 0, held: 0, free: 0, onOrder: 0 },
      nothingFree: true,
      missing: ['piston', 'rings'],
      units: [],
    });
  });

  it('when a step has more pistons than the ladder shows, then it shows the 12 nearest its nominal bore, counts them all and pages the rest', async () => {
    const fx = await makeFamily(owner);
    const piston = await makePart(owner, fx, 'piston', 2);
    // 14 measured pistons from 2.5170 in to 2.5183 in, and one still to measure. The step's
    // nominal bore is 2.5200 in, so the nearest twelve are the largest twelve skirts.
    const skirts = Array.from({ length: 14 }, (_, i) => `${(2.517 + i / 10000).toFixed(4)} in`);
    await receive(staff, {
      partId: piston.id,
      quantity: 15,
      binId: fx.binId,
      units: [...skirts.map((skirt) => ({ skirt })), {}],
    });
    const res = await machinist.get(`/api/engine-families/${fx.familyId}/ladder`);
    expect(res.status).toBe(200);
    const step = res.body.steps[2];
    expect(step.unitsTotal).toBe(15);
    expect(step.units.map((u: { skirt: { in: string } }) => u.skirt.in)).toEqual(
      skirts.slice(2).map((s) => s.replace(' in', '')),
    );

    const url = `/api/engine-families/${fx.familyId}/ladder/steps/${fx.steps[2].id}/units`;
    const first = await machinist.get(`${url}?page=1&pageSize=10`);
    expect(first.status).toBe(200);
    expect(first.body.total).toBe(15);
    expect(first.body.items).toHaveLength(10);
    expect(first.body.items[0].skirt.in).toBe('2.5170');
    const second = await machinist.get(`${url}?page=2&pageSize=10`);
    expect(second.body.items).toHaveLength(5);
    expect(second.body.items[4]).toMatchObject({ skirt: null, status: 'free' });
    const unknown = await machinist.get(
      `/api/engine-families/00000000-0000-4000-8000-000000000000/ladder/steps/${fx.steps[2].id}/units`,
    );
    expect(unknown.status).toBe(404);
  });

  it('when the family allows less than the series offers, then steps past the largest oversize are left out', async () => {
    const fx = await makeFamily(owner, { maxOversize: '0.020 in' });
    const res = await owner.get(`/api/engine-families/${fx.familyId}/ladder`);
    expect(res.body.steps.map((s: { label: string }) => s.label)).toEqual([
      'STD',
      '+0.010 in',
      '+0.020 in',
    ]);
  });
});

describe('exposure', () => {
  it('when steps have nothing free, then they are listed, most issued first, and stocked steps are not', async () => {
    const prefix = uniq('EXP').toUpperCase();
    const a = await makeFamily(owner, { code: `${prefix}-A` });
    const b = await makeFamily(owner, { code: `${prefix}-B` });
    const pa = await makePart(owner, a, 'piston', 0);
    const pb = await makePart(owner, b, 'piston', 1);
    // A step is stocked only with a free piston and a free ring set.
    const ra = await makePart(owner, a, 'rings', 0);
    await receive(staff, { partId: ra.id, quantity: 1, binId: a.binId });
    await receive(staff, {
      partId: pa.id,
      quantity: 1,
      binId: a.binId,
      units: [{ skirt: '2.4985 in' }],
    });
    await receive(staff, {
      partId: pb.id,
      quantity: 1,
      binId: b.binId,
      units: [{ skirt: '2.5085 in' }],
    });

    // Issue family B's only +0.010 piston the way the jobs feature will: unit issued, on hand down,
    // an 'issue' row in the ledger, in one transaction.
    await db.transaction(async (trx) => {
      const unit = await trx('piston_units').where({ part_id: pb.id }).first();
      await trx('piston_units').update({ status: 'issued' }).where({ id: unit.id });
      await trx('part_levels').decrement('on_hand', 1).where({ part_id: pb.id });
      await trx('stock_ledger').insert({
        part_id: pb.id,
        unit_id: unit.id,
        kind: 'issue',
        quantity: -1,
      });
    });

    const res = await buyer.get(`/api/exposure?q=${prefix}&pageSize=100`);
    expect(res.status).toBe(200);
    const keys = res.body.items.map(
      (i: { familyCode: string; stepLabel: string }) => `${i.familyCode} ${i.stepLabel}`,
    );
    // A: STD is stocked, four steps empty. B: all five empty, +0.010 asked for once.
    expect(res.body.total).toBe(9);
    expect(keys[0]).toBe(`${prefix}-B +0.010 in`);
    expect(keys).not.toContain(`${prefix}-A STD`);
    expect(keys.slice(1, 5)).toEqual([
      `${prefix}-A +0.010 in`,
      `${prefix}-A +0.020 in`,
      `${prefix}-A +0.030 in`,
      `${prefix}-A +0.040 in`,
    ]);
    expect(res.body.items[0]).toMatchObject({
      issued: 1,
      pistonParts: 1,
      pistonsOnHand: 0,
      missing: ['piston', 'rings'],
    });
  });
});

describe('parts', () => {
  let fx: Fixture;
  beforeAll(async () => {
    fx = await makeFamily(owner, { unit: 'mm' });
  });

  it('when a part is created, then the list answers the contract shape with levels', async () => {
    const piston = await makePart(owner, fx, 'piston', 1, { reorderPoint: 2, orderUpTo: 6 });
    const res = await staff.get(`/api/parts?familyId=${fx.familyId}&kind=piston`);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(1);
    expect(res.body.items[0]).toMatchObject({
      id: piston.id,
      sku: piston.sku,
      kind: 'piston',
      familyId: fx.familyId,
      stepId: fx.steps[1].id,
      description: 'Test piston',
      onHand: 0,
      held: 0,
      free: 0,
    });
    const one = await staff.get(`/api/parts/${piston.id}`);
    expect(one.status).toBe(200);
    expect(one.body).toMatchObject({ free: 0, reorderPoint: 2, orderUpTo: 6, salePrice: '40.00' });
    // 64.00 mm + 0.25 mm.
    expect(one.body.step.nominalBore).toEqual({ mm: '64.250', in: '2.5295' });
  });

  it('when a GTIN has a wrong check digit, then 400 names gtin', async () => {
    // 4006381333931 is a valid EAN-13 (from memory: a widely printed example); its last digit changed.
    const res = await owner.post('/api/parts', {
      kind: 'other',
      sku: uniq('GT'),
      description: 'Clip',
      gtin: '4006381333932',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('gtin');
    expect(res.body.error.details[0].message).toMatch(/check digit/i);
  });

  it('when a UPC-A is scanned into the search, then the part stored with it as EAN-13 is found', async () => {
    // 036000291452 is a valid UPC-A (from memory: a widely printed example); as EAN-13 it is 0036000291452.
    await db('parts').where({ gtin: '00036000291452' }).update({ gtin: null });
    const part = await makePart(owner, fx, 'other', 0, { gtin: '0036000291452' });
    const res = await machinist.get('/api/parts?q=036000291452');
    expect(res.status).toBe(200);
    expect(res.body.items.map((p: { id: string }) => p.id)).toEqual([part.id]);
    expect(res.body.items[0].gtin).toBe('036000291452');
    const dup = await owner.post('/api/parts', {
      kind: 'other',
      sku: uniq('GT'),
      description: 'Same code',
      gtin: '036000291452',
    });
    expect(dup.status).toBe(409);
  });

  it('when a piston label is scanned into the search, then its part is found', async () => {
    const piston = await makePart(owner, fx, 'piston', 2);
    const receipt = await receive(staff, {
      partId: piston.id,
      quantity: 1,
      binId: fx.binId,
      units: [{ skirt: '64.455 mm' }],
    });
    const label: string = receipt.units[0].label;
    const res = await machinist.get(`/api/parts?q=${label.toLowerCase()}`);
    expect(res.body.items.map((p: { id: string }) => p.id)).toEqual([piston.id]);
  });

  it('when a piston has no material or a step of another series, then 400 names the field', async () => {
    const noMaterial = await owner.post('/api/parts', {
      kind: 'piston',
      sku: uniq('PI'),
      description: 'x',
      familyId: fx.familyId,
      stepId: fx.steps[0].id,
    });
    expect(noMaterial.status).toBe(400);
    expect(noMaterial.body.error.details[0].field).toBe('material');
    const other = await makeFamily(owner);
    const wrongStep = await owner.post('/api/parts', {
      kind: 'rings',
      sku: uniq('RI'),
      description: 'x',
      familyId: fx.familyId,
      stepId: other.steps[1].id,
    });
    expect(wrongStep.status).toBe(400);
    expect(wrongStep.body.error.details[0].field).toBe('stepId');
  });

  it('when a kit is read, then its free count is that of its scarcest component', async () => {
    const piston = await makePart(owner, fx, 'piston', 3);
    const rings = await makePart(owner, fx, 'rings', 3);
    const clip = await makePart(owner, fx, 'other');
    const bin = await makeBin(owner);
    await receive(staff, {
      partId: piston.id,
      quantity: 3,
      binId: bin.id,
      units: [{ skirt: '64.70 mm' }, { skirt: '64.71 mm' }, {}],
    });
    await receive(staff, { partId: rings.id, quantity: 5, binId: bin.id });
    await receive(staff, { partId: clip.id, quantity: 5, binId: bin.id });
    const kitRes = await owner.post('/api/parts', {
      kind: 'kit',
      sku: uniq('KT'),
      description: 'Piston kit',
      familyId: fx.familyId,
      stepId: fx.steps[3].id,
      components: [
        { partId: piston.id, quantity: 1 },
        { partId: rings.id, quantity: 1 },
        { partId: clip.id, quantity: 2 },
      ],
    });
    expect(kitRes.status).toBe(201);
    // min(3/1, 5/1, floor(5/2)) = 2
    expect(kitRes.body).toMatchObject({ kind: 'kit', onHand: 2, free: 2 });
    expect(kitRes.body.components).toHaveLength(3);
    const list = await owner.get(`/api/parts?familyId=${fx.familyId}&kind=kit`);
    expect(list.body.items[0]).toMatchObject({ id: kitRes.body.id, free: 2 });
    const ladder = await owner.get(`/api/engine-families/${fx.familyId}/ladder`);
    expect(ladder.body.steps[3].kitsFree).toBe(2);
  });

  it('when the list is sorted and paged, then each page holds the next parts in order', async () => {
    const fam = await makeFamily(owner, { unit: 'mm' });
    for (let i = 0; i < 5; i++) await makePart(owner, fam, 'rings', i);
    const page1 = await owner.get(
      `/api/parts?familyId=${fam.familyId}&sort=step&dir=desc&pageSize=2`,
    );
    const page2 = await owner.get(
      `/api/parts?familyId=${fam.familyId}&sort=step&dir=desc&pageSize=2&page=2`,
    );
    expect(page1.body.total).toBe(5);
    expect(page1.body.items.map((p: { stepId: string }) => p.stepId)).toEqual([
      fam.steps[4].id,
      fam.steps[3].id,
    ]);
    expect(page2.body.items.map((p: { stepId: string }) => p.stepId)).toEqual([
      fam.steps[2].id,
      fam.steps[1].id,
    ]);
    const bad = await owner.get('/api/parts?sort=colour');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('sort');
  });

  it('when a buyer changes the price and reorder rule, then they are stored and audited', async () => {
    const part = await makePart(owner, fx, 'rings', 4);
    const res = await buyer.patch(`/api/parts/${part.id}`, {
      salePrice: '55.5',
      reorderPoint: 3,
      orderUpTo: 8,
    });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ salePrice: '55.50', reorderPoint: 3, orderUpTo: 8 });
    const audit = await db('audit_events').where({
      entity: 'part',
      entity_id: part.id,
      action: 'part.update',
    });
    expect(audit).toHaveLength(1);
    const below = await buyer.patch(`/api/parts/${part.id}`, { orderUpTo: 1 });
    expect(below.status).toBe(400);
    expect(below.body.error.details[0].field).toBe('orderUpTo');
  });
});
