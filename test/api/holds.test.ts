// Holding parts for a cylinder: the proposal, holds by unit and by count, releasing and moving,
// the race for the last free piston, and the expiry sweep. After every change the ledger, the
// levels and the units must tell the same story.
import pg from 'pg';
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp } from '../support/api';
import {
  benchShop,
  makeFamily,
  makeJob,
  makePart,
  receiveCounted,
  receivePistons,
  WORN_READINGS,
} from '../support/jobs-fixtures';

const { owner, machinist, staff, family, bin } = benchShop();

beforeAll(async () => {
  // The settings these tests rely on, whatever another test file left behind: the move to the bar
  // here is about held pistons, so it does not wait for the customer's approval (tested elsewhere).
  await saveSettings(null, {
    holdExpiryDays: 14,
    clearancePolicy: 'mid',
    timeZone: 'UTC',
    cutOnlyAfterApproval: false,
  });
});
afterAll(closeTestApp);

/** Ledger sums, levels and the units on the shelf must agree for a part. */
async function expectConsistent(partId: string) {
  const sums = await db('stock_ledger')
    .where({ part_id: partId })
    .select(db.raw('coalesce(sum(quantity), 0)::int AS on_hand'))
    .select(db.raw('coalesce(sum(held_delta), 0)::int AS held'))
    .first();
  const levels = await db('part_levels').where({ part_id: partId }).first();
  const part = await db('parts').where({ id: partId }).first();
  const activeHolds = await db('holds')
    .where({ part_id: partId })
    .whereNull('released_at')
    .select(db.raw('coalesce(sum(quantity), 0)::int AS held'))
    .first();
  expect({ onHand: levels.on_hand, held: levels.held }).toEqual({
    onHand: sums.on_hand,
    held: sums.held,
  });
  expect(activeHolds.held).toBe(levels.held);
  if (part.kind === 'piston') {
    const units = await db('piston_units')
      .where({ part_id: partId })
      .select(db.raw(`count(*) FILTER (WHERE status IN ('free', 'held'))::int AS on_hand`))
      .select(db.raw(`count(*) FILTER (WHERE status = 'held')::int AS held`))
      .first();
    expect({ onHand: units.on_hand, held: units.held }).toEqual({
      onHand: levels.on_hand,
      held: levels.held,
    });
  }
}

describe('GET /api/jobs/:id/cylinders/:n/proposal', () => {
  it('when pistons of the step are free, then the one whose skirt is nearest the nominal size comes first', async () => {
    const piston = await makePart(owner, family, '+0.010 in', 'piston');
    const rings = await makePart(owner, family, '+0.010 in', 'rings');
    // Nominal at +0.010 in: 2.5170 + 0.010 = 2.5270 in. Distances 0.0020, 0.0005, 0.0012 in.
    const units = await receivePistons(owner, piston, bin.id, [
      '2.5250 in',
      '2.5265 in',
      '2.5258 in',
    ]);
    await receivePistons(owner, piston, bin.id, ['2.5270 in']).then(async ([unmeasuredLater]) => {
      // A unit held elsewhere is never proposed.
      const other = await makeJob(staff, family.id);
      const r = await machinist.post(`/api/jobs/${other.id}/holds`, {
        cylinder: 1,
        unitId: unmeasuredLater.id,
      });
      expect(r.status).toBe(201);
    });
    await receiveCounted(owner, rings, bin.id, 2);
    const job = await makeJob(staff, family.id);
    const noStep = await machinist.get(`/api/jobs/${job.id}/cylinders/1/proposal`);
    expect(noStep.status).toBe(409);
    expect(noStep.body.error.code).toBe('no_step');

    const res = await machinist.get(
      `/api/jobs/${job.id}/cylinders/1/proposal?stepId=${family.steps['+0.010 in']}`,
    );
    expect(res.status).toBe(200);
    expect(res.body.step).toEqual({
      id: family.steps['+0.010 in'],
      label: '+0.010 in',
      nominalBore: { mm: '64.1858', in: '2.5270' },
    });
    expect(res.body.unit).toEqual(
      expect.objectContaining({ id: units[1].id, skirt: { mm: '64.1731', in: '2.5265' } }),
    );
    expect(res.body.others.map((u: { id: string }) => u.id)).toEqual([units[2].id, units[0].id]);
    expect(res.body.rings).toEqual([expect.objectContaining({ partId: rings, free: 2 })]);
    const denied = await staff.get(`/api/jobs/${job.id}/cylinders/1/proposal`);
    expect(denied.status).toBe(403);
  });
});

describe('POST /api/jobs/:id/holds and DELETE /api/holds/:id', () => {
  let piston: string;
  let rings: string;
  let units: { id: string; label: string }[];

  beforeAll(async () => {
    piston = await makePart(owner, family, '+0.030 in', 'piston');
    rings = await makePart(owner, family, '+0.030 in', 'rings');
    units = await receivePistons(owner, piston, bin.id, ['2.5465 in', '2.5463 in']);
    await receiveCounted(owner, rings, bin.id, 2);
  });

  it('when a measured piston is held, then 201, the unit is held, held + 1 and a reservation row is written', async () => {
    const job = await makeJob(staff, family.id);
    const res = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: units[0].id,
    });
    expect(res.status).toBe(201);
    expect(res.body).toEqual(
      expect.objectContaining({
        id: expect.any(String),
        jobId: job.id,
        cylinder: 1,
        unitId: units[0].id,
        unitLabel: units[0].label,
        skirt: { mm: '64.6811', in: '2.5465' },
        quantity: 1,
        releasedAt: null,
      }),
    );
    // Default expiry from the shop's settings: 14 days.
    const days = (Date.parse(res.body.expiresAt) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(13.9);
    expect(days).toBeLessThan(14.1);
    const unit = await db('piston_units').where({ id: units[0].id }).first();
    expect(unit).toEqual(
      expect.objectContaining({
        status: 'held',
        held_for_job_id: job.id,
        held_cylinder: 1,
        hold_id: res.body.id,
      }),
    );
    const rows = await db('stock_ledger').where({ unit_id: units[0].id, kind: 'reservation' });
    expect(rows).toEqual([
      expect.objectContaining({ quantity: 0, held_delta: 1, job_id: job.id, ref: res.body.id }),
    ]);
    // Holding a piston settles the cylinder's step.
    const jobRes = await machinist.get(`/api/jobs/${job.id}`);
    expect(jobRes.body.cylinderDetails[0].step.label).toBe('+0.030 in');
    expect(jobRes.body.pistonsHeld).toBe(1);
    await expectConsistent(piston);

    const again = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: units[1].id,
    });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already has a piston held/);

    const released = await machinist.delete(`/api/holds/${res.body.id}`);
    expect(released.status).toBe(204);
    expect((await db('piston_units').where({ id: units[0].id }).first()).status).toBe('free');
    const release = await db('stock_ledger').where({ unit_id: units[0].id, kind: 'release' });
    expect(release).toEqual([expect.objectContaining({ held_delta: -1, job_id: job.id })]);
    await expectConsistent(piston);
    const twice = await machinist.delete(`/api/holds/${res.body.id}`);
    expect(twice.status).toBe(409);
    const unknown = await machinist.delete('/api/holds/00000000-0000-4000-8000-000000000000');
    expect(unknown.status).toBe(404);
  });

  it('when ring sets are held by count, then held grows; asking for more than are free gives 409 not_available', async () => {
    const job = await makeJob(staff, family.id);
    const one = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      partId: rings,
      quantity: 1,
    });
    expect(one.status).toBe(201);
    expect(one.body).toEqual(expect.objectContaining({ partId: rings, unitId: null, quantity: 1 }));
    const tooMany = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      partId: rings,
      quantity: 2,
    });
    expect(tooMany.status).toBe(409);
    expect(tooMany.body.error).toEqual(
      expect.objectContaining({ code: 'not_available', free: 1, nextBest: null }),
    );
    expect(tooMany.body.error.message).toMatch(/Only 1 .* free; 2 asked for/);
    await expectConsistent(rings);
    await machinist.delete(`/api/holds/${one.body.id}`);
    await expectConsistent(rings);
  });

  it('when a piston part is held by count, a piston of another step or family, or an unmeasured one, then a clear refusal', async () => {
    const job = await makeJob(staff, family.id);
    const byCount = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      partId: piston,
      quantity: 1,
    });
    expect(byCount.status).toBe(400);
    expect(byCount.body.error.message).toMatch(/by its unit/);

    await machinist.patch(`/api/jobs/${job.id}/cylinders/1`, {
      stepId: family.steps['+0.040 in'],
    });
    const wrongStep = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: units[1].id,
    });
    expect(wrongStep.status).toBe(409);
    expect(wrongStep.body.error.code).toBe('wrong_step');

    const otherFamily = await makeFamily(owner);
    const otherPart = await makePart(owner, otherFamily, '+0.040 in', 'piston');
    const [foreign] = await receivePistons(owner, otherPart, bin.id, ['2.5555 in']);
    const wrongFamily = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: foreign.id,
    });
    expect(wrongFamily.status).toBe(400);

    const step040 = await makePart(owner, family, '+0.040 in', 'piston');
    const receipt = await owner.post('/api/stock/receipts', {
      partId: step040,
      quantity: 1,
      binId: bin.id,
      unitCost: '40.00',
      units: [{}],
    });
    expect(receipt.status).toBe(201);
    const unmeasured = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: receipt.body.units[0].id,
    });
    expect(unmeasured.status).toBe(409);
    expect(unmeasured.body.error.code).toBe('not_measured');
    await expectConsistent(step040);
  });

  it('when the body names both or neither of unit and part, then 400', async () => {
    const job = await makeJob(staff, family.id);
    const neither = await machinist.post(`/api/jobs/${job.id}/holds`, { cylinder: 1 });
    expect(neither.status).toBe(400);
    const both = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: units[1].id,
      partId: rings,
      quantity: 1,
    });
    expect(both.status).toBe(400);
  });
});

describe('the race for the last free piston', () => {
  it('when 50 holds reach for the last free unit at once, then exactly one 201 and 49 × 409, and ledger, levels and unit agree', async () => {
    const fam = await makeFamily(owner);
    const piston = await makePart(owner, fam, '+0.020 in', 'piston');
    const [last, spare] = await receivePistons(owner, piston, bin.id, ['2.5365 in', '2.5360 in']);
    // The spare is held already, so `last` is the last free one and nothing is next best.
    const holder = await makeJob(staff, fam.id);
    expect(
      (await machinist.post(`/api/jobs/${holder.id}/holds`, { cylinder: 1, unitId: spare.id }))
        .status,
    ).toBe(201);
    const jobs = [];
    for (let i = 0; i < 50; i++) jobs.push(await makeJob(staff, fam.id));

    const results = await Promise.all(
      jobs.map((job) =>
        machinist.post(`/api/jobs/${job.id}/holds`, { cylinder: 1, unitId: last.id }),
      ),
    );
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(49);
    for (const loser of results.filter((r) => r.status === 409)) {
      expect(loser.body.error.code).toBe('not_available');
      expect(loser.body.error.message).toMatch(/no longer free/);
      expect(loser.body.error.nextBest).toBeNull();
    }
    const winner = results.find((r) => r.status === 201);
    // Each refused job is noted once as short at that step, for the owner's exposure figures.
    const shortJobs = jobs.filter((j) => j.id !== winner?.body.jobId).map((j) => j.id);
    const shortages = await db('step_shortages')
      .whereIn('job_id', shortJobs)
      .andWhere({ source: 'hold', step_id: fam.steps['+0.020 in'] });
    expect(shortages).toHaveLength(49);
    const unit = await db('piston_units').where({ id: last.id }).first();
    expect(unit.status).toBe('held');
    expect(unit.held_for_job_id).toBe(winner?.body.jobId);
    expect(await db('holds').where({ unit_id: last.id }).whereNull('released_at')).toHaveLength(1);
    expect(await db('stock_ledger').where({ unit_id: last.id, kind: 'reservation' })).toHaveLength(
      1,
    );
    const levels = await db('part_levels').where({ part_id: piston }).first();
    expect(levels).toEqual(expect.objectContaining({ on_hand: 2, held: 2 }));
    await expectConsistent(piston);
  });

  it('when a hold loses and another piston of the step is free, then the 409 names the next best', async () => {
    const fam = await makeFamily(owner);
    const piston = await makePart(owner, fam, '+0.020 in', 'piston');
    // Nominal 2.5370 in: the 2.5364 in piston is nearer than the 2.5351 in one.
    const [taken, far, near] = await receivePistons(owner, piston, bin.id, [
      '2.5366 in',
      '2.5351 in',
      '2.5364 in',
    ]);
    const first = await makeJob(staff, fam.id);
    await machinist.post(`/api/jobs/${first.id}/holds`, { cylinder: 1, unitId: taken.id });
    const second = await makeJob(staff, fam.id);
    const res = await machinist.post(`/api/jobs/${second.id}/holds`, {
      cylinder: 1,
      unitId: taken.id,
    });
    expect(res.status).toBe(409);
    expect(res.body.error).toEqual(
      expect.objectContaining({
        code: 'not_available',
        message: expect.stringMatching(/already held for a job/),
        nextBest: expect.objectContaining({ id: near.id, skirt: { mm: '64.42456', in: '2.5364' } }),
      }),
    );
    expect(far.id).not.toBe(near.id);
  });
});

describe('what placing a hold asks of the database', () => {
  it('when a piston is held, then the session and its user are one read, and the hold is BEGIN, the job lock, one read, one write and COMMIT', async () => {
    const fam = await makeFamily(owner);
    const piston = await makePart(owner, fam, '+0.020 in', 'piston');
    const [unit] = await receivePistons(owner, piston, bin.id, ['2.5362 in']);
    const job = await makeJob(staff, fam.id);
    // The session's once-a-minute touch happens on this request, not on the hold's.
    expect((await machinist.get('/api/session')).status).toBe(200);
    const statements: string[] = [];
    const onQuery = (q: { sql: string }) => statements.push(q.sql);
    // The session store has its own pg pool; Knex's connections never go through Pool.query.
    const storeQueries = jest.spyOn(pg.Pool.prototype, 'query');
    db.on('query', onQuery);
    let holdId = '';
    let storeSql: string[] = [];
    try {
      const res = await machinist.post(`/api/jobs/${job.id}/holds`, {
        cylinder: 1,
        unitId: unit.id,
      });
      expect(res.status).toBe(201);
      expect(res.body.jobNumber).toBe(job.number);
      holdId = res.body.id;
    } finally {
      db.off('query', onQuery);
      storeSql = storeQueries.mock.calls.map((call) => {
        const query = call[0] as unknown;
        return typeof query === 'string' ? query : String((query as { text?: string }).text);
      });
      storeQueries.mockRestore();
    }
    expect(storeSql).toHaveLength(1);
    expect(storeSql[0]).toMatch(/FROM sessions s\s+LEFT JOIN users u/);
    expect(
      statements.map((sql) => sql.trim().split(/\s+/)[0].replace(';', '').toUpperCase()),
    ).toEqual(['BEGIN', 'SELECT', 'SELECT', 'WITH', 'COMMIT']);
    expect(statements.join('\n')).not.toMatch(/from "?users"?/i);
    // The one write did everything: the step settled, the notes, the audit row, the state.
    // (The job's first note is its intake's.)
    const notes = (await db('job_events').where({ job_id: job.id }).orderBy('id')).slice(-2);
    expect(notes.map((e: { kind: string }) => e.kind)).toEqual(['hold', 'state']);
    expect(notes[0].text).toMatch(/^Held .* for cylinder 1\.$/);
    expect(notes[1].text).toBe('Booked in → Parts set aside.');
    const audit = await db('audit_events').where({ entity: 'hold', entity_id: holdId });
    expect(audit).toEqual([
      expect.objectContaining({
        action: 'hold.create',
        after: expect.objectContaining({ jobId: job.id, cylinder: 1, unitId: unit.id }),
      }),
    ]);
    expect((await db('jobs').where({ id: job.id }).first()).state).toBe('parts_set_aside');
    await expectConsistent(piston);
  });
});

describe('POST /api/holds/:id/move', () => {
  it('when a hold moves to another job, then the unit stays held, for the new job, with a release and a reservation row', async () => {
    const fam = await makeFamily(owner);
    const piston = await makePart(owner, fam, '+0.020 in', 'piston');
    const [unit] = await receivePistons(owner, piston, bin.id, ['2.5362 in']);
    const from = await makeJob(staff, fam.id);
    const to = await makeJob(staff, fam.id, { cylinders: 2 });
    const hold = await machinist.post(`/api/jobs/${from.id}/holds`, {
      cylinder: 1,
      unitId: unit.id,
    });
    const res = await machinist.post(`/api/holds/${hold.body.id}/move`, {
      jobId: to.id,
      cylinder: 2,
    });
    expect(res.status).toBe(200);
    expect(res.body).toEqual(
      expect.objectContaining({ jobId: to.id, cylinder: 2, unitId: unit.id }),
    );
    expect(res.body.id).not.toBe(hold.body.id);
    const u = await db('piston_units').where({ id: unit.id }).first();
    expect(u).toEqual(
      expect.objectContaining({
        status: 'held',
        held_for_job_id: to.id,
        held_cylinder: 2,
        hold_id: res.body.id,
      }),
    );
    const old = await db('holds').where({ id: hold.body.id }).first();
    expect(old.release_reason).toBe('moved');
    const rows = await db('stock_ledger').where({ unit_id: unit.id }).orderBy('id');
    expect(rows.map((r: { kind: string }) => r.kind)).toEqual([
      'receipt',
      'reservation',
      'release',
      'reservation',
    ]);
    await expectConsistent(piston);
    const fromJob = await machinist.get(`/api/jobs/${from.id}`);
    expect(fromJob.body.events[0].text).toMatch(/Moved .* to job/);
    const back = await machinist.post(`/api/holds/${res.body.id}/move`, {
      jobId: to.id,
      cylinder: 2,
    });
    expect(back.status).toBe(400);
  });
});

describe('expiry and the sweep', () => {
  it('when a hold is past its expiry, then the sweep releases it with a ledger row and a note on the job', async () => {
    const fam = await makeFamily(owner);
    const piston = await makePart(owner, fam, '+0.020 in', 'piston');
    const rings = await makePart(owner, fam, '+0.020 in', 'rings');
    const [unit, keep] = await receivePistons(owner, piston, bin.id, ['2.5362 in', '2.5360 in']);
    await receiveCounted(owner, rings, bin.id, 1);
    const job = await makeJob(staff, fam.id, { cylinders: 2 });
    const expiring = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: unit.id,
      expiresInDays: 1,
    });
    const ringHold = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      partId: rings,
      quantity: 1,
      expiresInDays: 1,
    });
    const forever = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 2,
      unitId: keep.id,
      expiresInDays: null,
    });
    expect(forever.body.expiresAt).toBeNull();
    // Two days pass.
    await db('holds')
      .whereIn('id', [expiring.body.id, ringHold.body.id])
      .update({ expires_at: db.raw(`now() - interval '1 day'`) });

    const denied = await machinist.post('/api/holds/sweep', {});
    expect(denied.status).toBe(403);
    const res = await owner.post('/api/holds/sweep', {});
    expect(res.status).toBe(200);
    expect(res.body.ran).toBe(true);
    expect(res.body.released).toBeGreaterThanOrEqual(2);

    expect((await db('piston_units').where({ id: unit.id }).first()).status).toBe('free');
    expect((await db('piston_units').where({ id: keep.id }).first()).status).toBe('held');
    const ended = await db('holds').whereIn('id', [expiring.body.id, ringHold.body.id]);
    expect(ended.map((h: { release_reason: string }) => h.release_reason)).toEqual([
      'expired',
      'expired',
    ]);
    const rows = await db('stock_ledger').where({ job_id: job.id, kind: 'release' });
    expect(rows).toHaveLength(2);
    expect(rows[0].reason).toMatch(/expired/);
    const events = await db('job_events').where({ job_id: job.id, kind: 'system' });
    expect(events.map((e: { text: string }) => e.text).join(' ')).toMatch(
      /expired and was released/,
    );
    await expectConsistent(piston);
    await expectConsistent(rings);

    const nothing = await owner.post('/api/holds/sweep', {});
    expect(nothing.body).toEqual({ ran: true, released: 0 });
  });

  it('when another process is sweeping, then a second sweep does nothing', async () => {
    const trx = await db.transaction();
    try {
      await trx.raw(`SELECT pg_advisory_xact_lock(hashtext('stepstock:hold-sweep'))`);
      const res = await owner.post('/api/holds/sweep', {});
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ ran: false, released: 0 });
    } finally {
      await trx.rollback();
    }
  });
});

describe('holds and the job state', () => {
  it('when every stepped cylinder has its piston, then the job may go to the bar; readings move it to gauged', async () => {
    const fam = await makeFamily(owner);
    const piston = await makePart(owner, fam, '+0.020 in', 'piston');
    const [a, b] = await receivePistons(owner, piston, bin.id, ['2.5362 in', '2.5361 in']);
    const job = await makeJob(staff, fam.id, { cylinders: 2 });
    await machinist.put(`/api/jobs/${job.id}/cylinders/1/readings`, { readings: WORN_READINGS });
    await machinist.put(`/api/jobs/${job.id}/cylinders/2/readings`, { readings: WORN_READINGS });
    for (const n of [1, 2]) {
      await machinist.patch(`/api/jobs/${job.id}/cylinders/${n}`, {
        stepId: fam.steps['+0.020 in'],
      });
    }
    await machinist.post(`/api/jobs/${job.id}/holds`, { cylinder: 1, unitId: a.id });
    let state = (await machinist.get(`/api/jobs/${job.id}`)).body;
    expect(state.state).toBe('gauged');
    const early = await machinist.patch(`/api/jobs/${job.id}`, { state: 'on_the_bar' });
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/Cylinder 2 has no piston held/);
    await machinist.post(`/api/jobs/${job.id}/holds`, { cylinder: 2, unitId: b.id });
    state = (await machinist.get(`/api/jobs/${job.id}`)).body;
    expect(state.state).toBe('parts_set_aside');
    const toBar = await machinist.patch(`/api/jobs/${job.id}`, { state: 'on_the_bar' });
    expect(toBar.status).toBe(200);
    expect(toBar.body.state).toBe('on_the_bar');
  });

  it('when a step is chosen and no piston of it is free, then the job shows as waiting for parts', async () => {
    const fam = await makeFamily(owner);
    const job = await makeJob(staff, fam.id, { customerName: 'Ysolde Brack' });
    await machinist.patch(`/api/jobs/${job.id}/cylinders/1`, { stepId: fam.steps['+0.030 in'] });
    const list = await machinist.get('/api/jobs?state=open&waiting=true&q=Ysolde');
    expect(list.body.items.map((j: { id: string }) => j.id)).toEqual([job.id]);
    expect(list.body.items[0].waitingForParts).toBe(true);
  });
});
