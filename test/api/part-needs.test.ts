// One definition of a free part, an empty step and a job waiting for parts: the job bench and its
// filter, a job's page, the step ladder, a family's empty-step count, Empty steps and Ran short
// must all say the same thing about the same shelf, and name the part that is missing.
import { closeTestApp } from '../support/api';
import {
  benchShop,
  jobAtStep,
  makePart,
  receiveCounted,
  receivePistons,
} from '../support/jobs-fixtures';

const { owner, machinist, staff, family, bin } = benchShop({ cylinders: 1 });
const jobs: Record<'ringsShort' | 'pistonShort' | 'stocked', string> = {
  ringsShort: '',
  pistonShort: '',
  stocked: '',
};

async function hold(jobId: string, body: Record<string, unknown>) {
  const res = await machinist.post(`/api/jobs/${jobId}/holds`, { cylinder: 1, ...body });
  expect(res.status).toBe(201);
}

beforeAll(async () => {
  // Every step has a piston part and a ring-set part in the catalog.
  const parts: Record<string, { piston: string; rings: string }> = {};
  for (const step of Object.keys(family.steps)) {
    parts[step] = {
      piston: await makePart(owner, family, step, 'piston'),
      rings: await makePart(owner, family, step, 'rings'),
    };
  }
  // +0.020 in: two measured pistons, no ring set at all.
  const at20 = await receivePistons(owner, parts['+0.020 in'].piston, bin.id, [
    '2.5350 in',
    '2.5351 in',
  ]);
  // +0.030 in: one piston not yet measured, two ring sets.
  const unmeasured = await owner.post('/api/stock/receipts', {
    partId: parts['+0.030 in'].piston,
    quantity: 1,
    binId: bin.id,
    unitCost: '41.20',
    units: [{ skirt: null }],
  });
  expect(unmeasured.status).toBe(201);
  await receiveCounted(owner, parts['+0.030 in'].rings, bin.id, 2);
  // +0.040 in: two measured pistons and two ring sets.
  const at40 = await receivePistons(owner, parts['+0.040 in'].piston, bin.id, [
    '2.5550 in',
    '2.5551 in',
  ]);
  await receiveCounted(owner, parts['+0.040 in'].rings, bin.id, 2);

  // Has its piston; no ring set is free or held: waits for rings.
  jobs.ringsShort = (await jobAtStep(staff, machinist, family, '+0.020 in')).id;
  await hold(jobs.ringsShort, { unitId: at20[0].id });
  // Ring sets are free; the only piston is still to measure: waits for a piston.
  jobs.pistonShort = (await jobAtStep(staff, machinist, family, '+0.030 in')).id;
  // Piston and ring set held: waits for nothing.
  jobs.stocked = (await jobAtStep(staff, machinist, family, '+0.040 in')).id;
  await hold(jobs.stocked, { unitId: at40[0].id });
  await hold(jobs.stocked, { partId: parts['+0.040 in'].rings, quantity: 1 });
});
afterAll(closeTestApp);

describe('one rule for waiting, empty steps and shortages', () => {
  it('when a job has its piston but no ring set is free, then the bench, its filter and the job page say it waits for rings', async () => {
    const waiting = await staff.get(`/api/jobs?state=open&waiting=true&familyId=${family.id}`);
    expect(waiting.status).toBe(200);
    const byId = Object.fromEntries(
      (waiting.body.items as { id: string; waitingFor: string[] }[]).map((j) => [j.id, j]),
    );
    expect(Object.keys(byId).sort()).toEqual([jobs.ringsShort, jobs.pistonShort].sort());
    expect(byId[jobs.ringsShort]).toMatchObject({ waitingForParts: true, waitingFor: ['rings'] });
    expect(byId[jobs.pistonShort]).toMatchObject({ waitingForParts: true, waitingFor: ['piston'] });

    const all = await staff.get(`/api/jobs?state=open&familyId=${family.id}`);
    const stocked = all.body.items.find((j: { id: string }) => j.id === jobs.stocked);
    expect(stocked).toMatchObject({ waitingForParts: false, waitingFor: [] });

    const page = await staff.get(`/api/jobs/${jobs.ringsShort}`);
    expect(page.body).toMatchObject({ waitingForParts: true, waitingFor: ['rings'] });
  });

  it('when the shelf is as above, then the ladder, the family count and Empty steps name the same empty steps and the part each lacks', async () => {
    const ladder = await machinist.get(`/api/engine-families/${family.id}/ladder`);
    expect(ladder.status).toBe(200);
    const steps = Object.fromEntries(
      (
        ladder.body.steps as {
          label: string;
          missing: string[];
          nothingFree: boolean;
          pistons: { free: number };
          pistonsToMeasure: number;
          rings: { free: number };
        }[]
      ).map((s) => [s.label, s]),
    );
    expect(steps['STD'].missing).toEqual(['piston', 'rings']);
    expect(steps['+0.010 in'].missing).toEqual(['piston', 'rings']);
    // One of two pistons is held: one free, but no ring set — still empty.
    expect(steps['+0.020 in']).toMatchObject({
      missing: ['rings'],
      nothingFree: true,
      pistons: expect.objectContaining({ free: 1 }),
    });
    // A piston still to measure is on hand but not free for a bore.
    expect(steps['+0.030 in']).toMatchObject({
      missing: ['piston'],
      pistonsToMeasure: 1,
      pistons: expect.objectContaining({ free: 0 }),
      rings: expect.objectContaining({ free: 2 }),
    });
    expect(steps['+0.040 in']).toMatchObject({ missing: [], nothingFree: false });
    const emptyOnLadder = Object.values(steps).filter((s) => s.nothingFree).length;
    expect(emptyOnLadder).toBe(4);

    const fam = await machinist.get(`/api/engine-families/${family.id}`);
    expect(fam.body.stock.emptySteps).toBe(emptyOnLadder);

    const empty = await machinist.get(`/api/exposure?familyId=${family.id}&pageSize=50`);
    expect(empty.status).toBe(200);
    expect(empty.body.total).toBe(emptyOnLadder);
    const listed = Object.fromEntries(
      (empty.body.items as { stepLabel: string; missing: string[] }[]).map((i) => [
        i.stepLabel,
        i.missing,
      ]),
    );
    expect(listed).toEqual({
      STD: ['piston', 'rings'],
      '+0.010 in': ['piston', 'rings'],
      '+0.020 in': ['rings'],
      '+0.030 in': ['piston'],
    });
  });

  it('when jobs wait, then Ran short counts the same jobs as the bench filter and names the part', async () => {
    const res = await owner.get('/api/insights/exposure');
    expect(res.status).toBe(200);
    const mine = (
      res.body.items as {
        familyId: string;
        stepLabel: string;
        stillWaiting: number;
        waitingFor: string[];
        partsShort: string[];
      }[]
    ).filter((i) => i.familyId === family.id);
    const byStep = Object.fromEntries(mine.map((i) => [i.stepLabel, i]));
    expect(byStep['+0.020 in']).toMatchObject({
      stillWaiting: 1,
      waitingFor: ['rings'],
      partsShort: ['rings'],
    });
    expect(byStep['+0.030 in']).toMatchObject({
      stillWaiting: 1,
      waitingFor: ['piston'],
      partsShort: ['piston'],
    });
    // +0.040 in had both parts free when its step was chosen: never short.
    expect(byStep['+0.040 in']).toBeUndefined();

    const bench = await staff.get(`/api/jobs?state=open&waiting=true&familyId=${family.id}`);
    expect(mine.reduce((n, i) => n + i.stillWaiting, 0)).toBe(bench.body.total);
    expect(res.body.jobsWaitingNow).toBeGreaterThanOrEqual(bench.body.total);
  });

  it('when the missing ring set arrives, then the job stops waiting everywhere at once', async () => {
    const ladder = await machinist.get(`/api/engine-families/${family.id}/ladder`);
    const step = ladder.body.steps.find((s: { label: string }) => s.label === '+0.020 in');
    const parts = await owner.get(`/api/parts?familyId=${family.id}&kind=rings&pageSize=50`);
    const rings = parts.body.items.find((p: { stepId: string }) => p.stepId === step.stepId);
    await receiveCounted(owner, rings.id, bin.id, 1);

    const waiting = await staff.get(`/api/jobs?state=open&waiting=true&familyId=${family.id}`);
    expect(waiting.body.items.map((j: { id: string }) => j.id)).toEqual([jobs.pistonShort]);
    const after = await machinist.get(`/api/engine-families/${family.id}/ladder`);
    expect(
      after.body.steps.find((s: { label: string }) => s.label === '+0.020 in').missing,
    ).toEqual([]);
    const short = await owner.get('/api/insights/exposure');
    const row = short.body.items.find(
      (i: { familyId: string; stepLabel: string }) =>
        i.familyId === family.id && i.stepLabel === '+0.020 in',
    );
    expect(row).toMatchObject({ stillWaiting: 0, waitingFor: [], partsShort: ['rings'] });
  });
});
