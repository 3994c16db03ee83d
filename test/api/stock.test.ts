// Stock API: receipts, adjustments, moves, scrapping, measuring, units, the ledger and bins, against
// the real app and database. Length checks rest on 1 in = 25.4 mm exactly (international yard and
// pound agreement of 1959, as stated in NIST Special Publication 811, appendix B).
import { randomUUID } from 'node:crypto';
import { db } from '../../server/db/knex';
import { armFault, disarmFaults } from '../../server/testing-faults';
import { closeTestApp, everyRoleSignedIn, uniq } from '../support/api';
import { makeBin, makeFamily, makePart, type Fixture } from '../support/catalog-fixtures';

const { owner, buyer, staff, machinist } = everyRoleSignedIn({ staff: 'in' });
let fx: Fixture;

beforeAll(async () => {
  fx = await makeFamily(owner);
});
afterEach(disarmFaults);
afterAll(closeTestApp);

/** A receipt into the fixture's bin at a unit cost; `more` adds fields (units, a note). */
function receipt(partId: string, quantity: number, unitCost: string, more: object = {}) {
  return { partId, quantity, binId: fx.binId, unitCost, ...more };
}

async function levels(partId: string) {
  return db('part_levels').where({ part_id: partId }).first();
}

async function ledgerSums(partId: string) {
  const row = await db('stock_ledger')
    .where({ part_id: partId })
    .select(
      db.raw(
        'coalesce(sum(quantity), 0)::int as q, coalesce(sum(held_delta), 0)::int as h, count(*)::int as n',
      ),
    )
    .first();
  return row as { q: number; h: number; n: number };
}

/**
 * A hold as the jobs feature makes it, in one transaction: the conditional UPDATE of a free unit
 * decides a race, then the hold row, held + 1 on the part, and a 'reservation' ledger row.
 */
async function holdUnit(unitId: string): Promise<boolean> {
  const unit = await db('piston_units as u')
    .join('parts as p', 'p.id', 'u.part_id')
    .select('u.part_id', 'p.family_id')
    .where('u.id', unitId)
    .first();
  const [job] = await db('jobs')
    .insert({ customer_name: 'Test customer', family_id: unit.family_id, cylinders: 1 })
    .returning(['id']);
  await db('job_cylinders').insert({ job_id: job.id, n: 1 });
  return db.transaction(async (trx) => {
    const holdId = randomUUID();
    const taken = await trx('piston_units')
      .update({ status: 'held', held_for_job_id: job.id, held_cylinder: 1, hold_id: holdId })
      .where({ id: unitId, status: 'free' });
    if (taken === 0) return false;
    await trx('holds').insert({
      id: holdId,
      job_id: job.id,
      cylinder: 1,
      part_id: unit.part_id,
      unit_id: unitId,
    });
    await trx('part_levels').increment('held', 1).where({ part_id: unit.part_id });
    await trx('stock_ledger').insert({
      part_id: unit.part_id,
      unit_id: unitId,
      job_id: job.id,
      kind: 'reservation',
      quantity: 0,
      held_delta: 1,
    });
    return true;
  });
}

describe('POST /api/stock/receipts', () => {
  it('when staff receives measured pistons, then 201 answers the ledger rows and the units, exactly', async () => {
    const piston = await makePart(owner, fx, 'piston', 1);
    const res = await staff.post(
      '/api/stock/receipts',
      receipt(piston.id, 3, '12.50', {
        note: 'Delivery 4471',
        units: [{ skirt: '2.5555 in' }, { skirt: '64.91 mm' }, {}],
      }),
    );
    expect(res.status).toBe(201);
    expect(res.body.ledger).toHaveLength(3);
    expect(res.body.ledger[0]).toMatchObject({
      partId: piston.id,
      kind: 'receipt',
      quantity: 1,
      reason: 'Delivery 4471',
      toBinId: fx.binId,
    });
    // Staff may not see costs: the cost is kept on the ledger row, not answered to them.
    expect(res.body.ledger[0]).not.toHaveProperty('unitCost');
    const rows = await db('stock_ledger').where({ part_id: piston.id, kind: 'receipt' });
    expect(rows.map((r) => r.unit_cost)).toEqual(['12.5000', '12.5000', '12.5000']);
    expect(res.body.units).toHaveLength(3);
    const bySkirt = res.body.units.map((u: { skirt: unknown }) => u.skirt);
    // 2.5555 in × 25.4 = 64.9097 mm; 64.91 mm ÷ 25.4 = 2.555511… in → 2.5555 at 0.0001 in.
    expect(bySkirt).toContainEqual({ mm: '64.9097', in: '2.5555' });
    expect(bySkirt).toContainEqual({ mm: '64.910', in: '2.5555' });
    expect(bySkirt).toContainEqual(null);
    for (const u of res.body.units) {
      expect(u).toMatchObject({
        status: 'free',
        partId: piston.id,
        binId: fx.binId,
        bin: fx.binCode,
      });
      expect(u.label).toMatch(/^PU-\d{6,}$/);
    }
    expect(res.body.levels).toEqual({ onHand: 3, held: 0, free: 3 });
    expect(await levels(piston.id)).toMatchObject({ on_hand: 3, held: 0 });
    expect((await ledgerSums(piston.id)).q).toBe(3);
    const stored = await db('piston_units')
      .where({ part_id: piston.id })
      .whereNotNull('skirt_nm')
      .pluck('skirt_nm');
    expect(stored.sort()).toEqual([64_909_700, 64_910_000]);
    const audit = await db('audit_events').where({
      entity: 'part',
      entity_id: piston.id,
      action: 'stock.receipt',
    });
    expect(audit).toHaveLength(1);
  });

  it('when a fault strikes right after the ledger insert, then nothing of the receipt remains', async () => {
    const piston = await makePart(owner, fx, 'piston', 2);
    armFault('stock.receipt.afterLedger');
    const res = await staff.post(
      '/api/stock/receipts',
      receipt(piston.id, 2, '30.00', {
        units: [{ skirt: '2.5180 in' }, { skirt: '2.5182 in' }],
      }),
    );
    expect(res.status).toBe(500);
    expect(res.body.error.message).not.toMatch(/Injected|stock_ledger|insert/i);
    expect(await db('stock_ledger').where({ part_id: piston.id })).toHaveLength(0);
    expect(await db('piston_units').where({ part_id: piston.id })).toHaveLength(0);
    expect(await levels(piston.id)).toMatchObject({ on_hand: 0, held: 0 });
    expect((await db('parts').where({ id: piston.id }).first()).average_cost).toBe('0.0000');
    expect(
      await db('audit_events').where({
        entity: 'part',
        entity_id: piston.id,
        action: 'stock.receipt',
      }),
    ).toHaveLength(0);
  });

  it('when a part is received at two prices, then its cost is the weighted average', async () => {
    // Weighted-average cost formula (IAS 2 Inventories, paragraph 27; perpetual moving average):
    // (10 × 10.00 + 30 × 14.00) / 40 = 520 / 40 = 13.00.
    const rings = await makePart(owner, fx, 'rings', 1);
    await staff.post('/api/stock/receipts', receipt(rings.id, 10, '10.00'));
    const res = await staff.post('/api/stock/receipts', receipt(rings.id, 30, '14.00'));
    expect(res.status).toBe(201);
    // Staff receive without seeing costs; the owner reads the average.
    expect(res.body.levels).toEqual({ onHand: 40, held: 0, free: 40 });
    expect(res.body.ledger).toEqual([expect.objectContaining({ quantity: 30 })]);
    expect((await owner.get(`/api/parts/${rings.id}`)).body.averageCost).toBe('13.00');
    expect((await db('parts').where({ id: rings.id }).first()).average_cost).toBe('13.0000');
  });

  it.each(['', 'abc', '-0.01 in', '9 m', '2.5 furlongs'])(
    'when a skirt is "%s", then 400 names units.1.skirt and nothing is written',
    async (bad) => {
      const piston = await makePart(owner, fx, 'piston', 3);
      const res = await staff.post(
        '/api/stock/receipts',
        receipt(piston.id, 2, '12.50', {
          units: [{ skirt: '2.5283 in' }, { skirt: bad }],
        }),
      );
      expect(res.status).toBe(400);
      expect(res.body.error.details.map((d: { field: string }) => d.field)).toEqual([
        'units.1.skirt',
      ]);
      expect(res.body.error.message).toMatch(/^units\.1\.skirt: /);
      expect(await db('piston_units').where({ part_id: piston.id })).toHaveLength(0);
      expect(await db('stock_ledger').where({ part_id: piston.id })).toHaveLength(0);
    },
  );

  it('when a skirt is typed in the wrong unit, then 400 says it is far from the nominal bore', async () => {
    const piston = await makePart(owner, fx, 'piston', 0);
    const res = await staff.post(
      '/api/stock/receipts',
      receipt(piston.id, 1, '12.50', {
        units: [{ skirt: '2.4985 mm' }],
      }),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ field: 'units.0.skirt' });
    expect(res.body.error.details[0].message).toMatch(/far from this step's nominal bore/);
  });

  it.each([
    [{ quantity: 0 }, 'quantity'],
    [{ quantity: 1.5 }, 'quantity'],
    [{ quantity: -2 }, 'quantity'],
    [{ quantity: '3' }, 'quantity'],
    [{ unitCost: '-1' }, 'unitCost'],
    [{ unitCost: '12.505001' }, 'unitCost'],
    [{ partId: '00000000-0000-4000-8000-000000000001' }, 'partId'],
    [{ partId: 'nope' }, 'partId'],
    [{ binId: '00000000-0000-4000-8000-000000000001' }, 'binId'],
  ])('when the receipt has %j, then 400 names %s', async (change, field) => {
    const rings = await makePart(owner, fx, 'rings', 2);
    const res = await staff.post(
      '/api/stock/receipts',
      receipt(rings.id, 2, '9.00', {
        ...change,
      }),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe(field);
    expect(await db('stock_ledger').where({ part_id: rings.id })).toHaveLength(0);
  });

  it('when pistons come without one entry per piston, then 400 names units', async () => {
    const piston = await makePart(owner, fx, 'piston', 4);
    const res = await staff.post(
      '/api/stock/receipts',
      receipt(piston.id, 3, '12.50', {
        units: [{ skirt: '2.5383 in' }],
      }),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('units');
  });

  it('when a machinist tries to receive, then 403', async () => {
    const res = await machinist.post('/api/stock/receipts', {});
    expect(res.status).toBe(403);
  });
});

describe('POST /api/stock/adjustments', () => {
  it('when an adjustment would take on-hand below what is held, then 409 not_available and nothing changes', async () => {
    const rings = await makePart(owner, fx, 'rings', 3);
    await staff.post('/api/stock/receipts', receipt(rings.id, 5, '8.00'));
    // Three ring sets held for jobs, written as the jobs feature will write them.
    await db.transaction(async (trx) => {
      await trx('part_levels').increment('held', 3).where({ part_id: rings.id });
      await trx('stock_ledger').insert({
        part_id: rings.id,
        kind: 'reservation',
        quantity: 0,
        held_delta: 3,
      });
    });
    const res = await buyer.post('/api/stock/adjustments', {
      partId: rings.id,
      quantity: -3,
      reason: 'Count found two',
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('not_available');
    expect(res.body.error.message).toMatch(/3 of the 5 on hand are held/);
    expect(await levels(rings.id)).toMatchObject({ on_hand: 5, held: 3 });

    const fine = await buyer.post('/api/stock/adjustments', {
      partId: rings.id,
      quantity: -2,
      reason: 'Count found three',
    });
    expect(fine.status).toBe(201);
    expect(fine.body.levels).toMatchObject({ onHand: 3, held: 3, free: 0 });
    expect(fine.body.ledger[0]).toMatchObject({
      kind: 'adjustment',
      quantity: -2,
      reason: 'Count found three',
    });
    const sums = await ledgerSums(rings.id);
    expect(sums).toMatchObject({ q: 3, h: 3 });
  });

  it('when 20 adjustments of -1 race for 10 on hand, then 10 succeed and the ledger sum equals on-hand', async () => {
    const clip = await makePart(owner, fx, 'other');
    await staff.post('/api/stock/receipts', receipt(clip.id, 10, '0.40'));
    const results = await Promise.all(
      Array.from({ length: 20 }, (_, i) =>
        owner.post('/api/stock/adjustments', {
          partId: clip.id,
          quantity: -1,
          reason: `race ${i}`,
        }),
      ),
    );
    const statuses = results.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 201)).toHaveLength(10);
    expect(statuses.filter((s) => s === 409)).toHaveLength(10);
    const lv = await levels(clip.id);
    const sums = await ledgerSums(clip.id);
    expect(lv.on_hand).toBe(0);
    expect(sums.q).toBe(lv.on_hand);
  });

  it('when 20 mixed adjustments run at once, then the ledger sum still equals on-hand', async () => {
    const clip = await makePart(owner, fx, 'other');
    await staff.post('/api/stock/receipts', receipt(clip.id, 50, '0.40'));
    const changes = Array.from({ length: 20 }, (_, i) => (i % 3 === 0 ? 4 : -3));
    const results = await Promise.all(
      changes.map((q) =>
        buyer.post('/api/stock/adjustments', { partId: clip.id, quantity: q, reason: 'count' }),
      ),
    );
    expect(results.every((r) => r.status === 201)).toBe(true);
    const expected = 50 + changes.reduce((a, b) => a + b, 0);
    expect((await levels(clip.id)).on_hand).toBe(expected);
    expect((await ledgerSums(clip.id)).q).toBe(expected);
  });

  it('when a piston part or a zero change is adjusted, then 400 explains', async () => {
    const piston = await makePart(owner, fx, 'piston', 1);
    const res = await owner.post('/api/stock/adjustments', {
      partId: piston.id,
      quantity: 1,
      reason: 'x',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/each one is a unit/);
    const zero = await owner.post('/api/stock/adjustments', {
      partId: piston.id,
      quantity: 0,
      reason: 'x',
    });
    expect(zero.status).toBe(400);
    expect(zero.body.error.details[0].field).toBe('quantity');
    const noReason = await owner.post('/api/stock/adjustments', { partId: piston.id, quantity: 2 });
    expect(noReason.body.error.details[0].field).toBe('reason');
  });

  it('when staff tries to adjust, then 403', async () => {
    expect((await staff.post('/api/stock/adjustments', {})).status).toBe(403);
  });
});

describe('piston units: hold, move, scrap, measure', () => {
  async function receiveOne(skirt?: string) {
    const piston = await makePart(owner, fx, 'piston', 2);
    const res = await staff.post(
      '/api/stock/receipts',
      receipt(piston.id, 1, '25.00', {
        units: [skirt ? { skirt } : {}],
      }),
    );
    expect(res.status).toBe(201);
    return { partId: piston.id, unit: res.body.units[0] as { id: string; label: string } };
  }

  it('when two holds race for one free piston, then exactly one wins and held is 1', async () => {
    const { partId, unit } = await receiveOne('2.5183 in');
    const wins = await Promise.all([holdUnit(unit.id), holdUnit(unit.id)]);
    expect(wins.filter(Boolean)).toHaveLength(1);
    expect(await levels(partId)).toMatchObject({ on_hand: 1, held: 1 });
    expect((await ledgerSums(partId)).h).toBe(1);
  });

  it('when a unit moves to another bin, then the unit shows the bin and the ledger a transfer', async () => {
    const { unit } = await receiveOne('2.5184 in');
    const bin = await makeBin(staff);
    const res = await staff.post('/api/stock/moves', { unitId: unit.id, toBinId: bin.id });
    expect(res.status).toBe(200);
    expect(res.body.unit).toMatchObject({ binId: bin.id, bin: bin.code });
    expect(res.body.ledger[0]).toMatchObject({
      kind: 'transfer',
      quantity: 0,
      fromBinId: fx.binId,
      toBinId: bin.id,
      unitLabel: unit.label,
    });
    const again = await staff.post('/api/stock/moves', { unitId: unit.id, toBinId: bin.id });
    expect(again.status).toBe(400);
    expect(again.body.error.details[0].field).toBe('toBinId');
  });

  it('when a counted part moves, then its bin changes; without unitId or partId, 400', async () => {
    const rings = await makePart(owner, fx, 'rings', 4);
    await staff.post('/api/stock/receipts', receipt(rings.id, 2, '5.00'));
    const bin = await makeBin(staff);
    const res = await buyer.post('/api/stock/moves', { partId: rings.id, toBinId: bin.id });
    expect(res.status).toBe(200);
    expect((await levels(rings.id)).bin_id).toBe(bin.id);
    const part = await owner.get(`/api/parts/${rings.id}`);
    expect(part.body).toMatchObject({ binId: bin.id, bin: bin.code });
    const neither = await buyer.post('/api/stock/moves', { toBinId: bin.id });
    expect(neither.status).toBe(400);
  });

  it('when a free unit is scrapped, then it leaves stock; a held one is refused with 409', async () => {
    const { partId, unit } = await receiveOne('2.5185 in');
    const res = await staff.post(`/api/stock/units/${unit.id}/scrap`, {
      reason: 'Dropped, skirt dented',
    });
    expect(res.status).toBe(200);
    expect(res.body.unit.status).toBe('scrapped');
    expect(res.body.levels).toMatchObject({ onHand: 0, held: 0 });
    expect(res.body.ledger[0]).toMatchObject({ kind: 'scrap', quantity: -1 });
    const scrapRow = await db('stock_ledger').where({ unit_id: unit.id, kind: 'scrap' }).first();
    expect(scrapRow.unit_cost).toBe('25.0000');
    expect((await ledgerSums(partId)).q).toBe(0);
    const twice = await staff.post(`/api/stock/units/${unit.id}/scrap`, { reason: 'again' });
    expect(twice.status).toBe(409);

    const held = await receiveOne('2.5186 in');
    expect(await holdUnit(held.unit.id)).toBe(true);
    const refused = await owner.post(`/api/stock/units/${held.unit.id}/scrap`, { reason: 'x' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('not_available');
    expect(await levels(held.partId)).toMatchObject({ on_hand: 1, held: 1 });
  });

  it('when a machinist measures a piston "to measure", then its skirt is stored exactly and logged', async () => {
    const { unit } = await receiveOne();
    const res = await machinist.post(`/api/stock/units/${unit.id}/measure`, {
      skirt: '2.51855 in',
    });
    expect(res.status).toBe(200);
    // 2.51855 in × 25.4 = 63.97117 mm; five inch decimals read back digit for digit.
    expect(res.body.unit.skirt).toEqual({ mm: '63.97117', in: '2.51855' });
    expect(res.body.ledger[0]).toMatchObject({ kind: 'measure', quantity: 0, heldDelta: 0 });
    const bad = await machinist.post(`/api/stock/units/${unit.id}/measure`, {
      skirt: '2.5 furlongs',
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('skirt');
  });

  it('when a held, measured piston is measured again, then 409: its job was worked out from that size', async () => {
    const { unit } = await receiveOne('2.5187 in');
    await holdUnit(unit.id);
    const res = await staff.post(`/api/stock/units/${unit.id}/measure`, { skirt: '2.5190 in' });
    expect(res.status).toBe(409);
  });
});

describe('reading units, the ledger and bins', () => {
  it('when a label is scanned, then by-label finds the unit whatever the case; an unknown one is 404', async () => {
    const piston = await makePart(owner, fx, 'piston', 1);
    const r = await staff.post(
      '/api/stock/receipts',
      receipt(piston.id, 2, '20.00', {
        units: [{ skirt: '2.5083 in' }, { skirt: '2.5081 in' }],
      }),
    );
    const label: string = r.body.units[0].label;
    const res = await machinist.get(`/api/stock/units/by-label/${label.toLowerCase()}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      label,
      partId: piston.id,
      familyCode: fx.familyCode,
      stepLabel: '+0.010 in',
    });
    expect(res.body.nominalBore).toEqual({ mm: '63.754', in: '2.5100' });
    expect((await machinist.get('/api/stock/units/by-label/PU-999999999')).status).toBe(404);

    const list = await machinist.get(`/api/stock/units?partId=${piston.id}&status=free&sort=skirt`);
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(2);
    expect(list.body.items.map((u: { skirt: { in: string } }) => u.skirt.in)).toEqual([
      '2.5081',
      '2.5083',
    ]);
    const byReceipt = await machinist.get(`/api/stock/units?receiptId=${r.body.receiptId}`);
    expect(byReceipt.body.total).toBe(2);
  });

  it('when the ledger is read for a part, then it lists its movements newest first', async () => {
    const rings = await makePart(owner, fx, 'rings', 0);
    await staff.post('/api/stock/receipts', receipt(rings.id, 4, '6.00'));
    await owner.post('/api/stock/adjustments', {
      partId: rings.id,
      quantity: -1,
      reason: 'Torn bag',
    });
    const res = await machinist.get(`/api/stock/ledger?partId=${rings.id}`);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(2);
    expect(res.body.items.map((l: { kind: string }) => l.kind)).toEqual(['adjustment', 'receipt']);
    expect(res.body.items[0].userName).toBe('Test owner');
  });

  it('when someone tries to change or delete a ledger row, then the database refuses', async () => {
    const [row] = await db('stock_ledger').select('id').limit(1);
    await expect(db('stock_ledger').update({ quantity: 99 }).where({ id: row.id })).rejects.toThrow(
      /append-only/,
    );
    await expect(db('stock_ledger').delete().where({ id: row.id })).rejects.toThrow(/append-only/);
  });

  it('when a bin is added, then the list answers {items,total}; a repeated code is 409', async () => {
    const code = uniq('BN').toUpperCase();
    const res = await staff.post('/api/bins', { code, name: 'Top shelf' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ code, name: 'Top shelf', units: 0, parts: 0 });
    const list = await machinist.get(`/api/bins?q=${code}`);
    expect(list.body).toEqual({ items: [expect.objectContaining({ code })], total: 1 });
    expect((await staff.post('/api/bins', { code: code.toLowerCase() })).status).toBe(409);
    expect((await staff.post('/api/bins', { code: 'has space' })).status).toBe(400);
  });
});
