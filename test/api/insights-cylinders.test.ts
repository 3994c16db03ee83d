// The owner's insight "cylinders near their last step": marked cylinders whose bores leave at most
// a given number of steps before a sleeve, with the customer to tell, as JSON and as CSV.
import { closeTestApp, uniq } from '../support/api';
import { benchShop, makePart, receivePistons, WORN_READINGS } from '../support/jobs-fixtures';

const { owner, machinist, staff, buyer, family, bin } = benchShop({
  cylinders: 1,
  machinistUnit: 'in',
});

afterAll(closeTestApp);

function expectStatus(res: { status: number; body: unknown }, status: number, what: string) {
  if (res.status !== status) {
    throw new Error(`${what}: expected ${status}, got ${res.status} ${JSON.stringify(res.body)}`);
  }
}

/** A customer's cylinder under a fresh mark, bored once to `step` and honed to `honed`. */
async function boredCylinder(
  name: string,
  step: '+0.020 in' | '+0.030 in' | '+0.040 in',
  skirt: string,
  honed: string,
) {
  const customer = await staff.post('/api/customers', { name, phone: '555 0142' });
  expectStatus(customer, 201, 'customer');
  const mark = uniq('N').toUpperCase();
  const cylinder = await staff.post(`/api/customers/${customer.body.id}/cylinders`, {
    mark,
    familyId: family.id,
  });
  expectStatus(cylinder, 201, 'cylinder');
  const job = await staff.post('/api/jobs', {
    customerId: customer.body.id,
    familyId: family.id,
    cylinders: 1,
    cylinderIds: [cylinder.body.id],
  });
  expectStatus(job, 201, 'job');
  const id = job.body.id as string;
  expectStatus(
    await machinist.put(`/api/jobs/${id}/cylinders/1/readings`, { readings: WORN_READINGS }),
    200,
    'readings',
  );
  expectStatus(
    await machinist.patch(`/api/jobs/${id}/cylinders/1`, { stepId: family.steps[step] }),
    200,
    'step',
  );
  const part = await makePart(owner, family, step, 'piston');
  const [unit] = await receivePistons(owner, part, bin.id, [skirt]);
  expectStatus(
    await machinist.post(`/api/jobs/${id}/holds`, { cylinder: 1, unitId: unit.id }),
    201,
    'hold',
  );
  // The shop cuts only after the customer agreed to the estimate (the default setting).
  expectStatus(
    await staff.post(`/api/jobs/${id}/estimate/approval`, { how: 'phone', note: 'agreed' }),
    200,
    'approval',
  );
  expectStatus(await machinist.post(`/api/jobs/${id}/cylinders/1/cut`, {}), 200, 'cut');
  expectStatus(
    await machinist.patch(`/api/jobs/${id}/cylinders/1`, { measuredAfterHone: honed }),
    200,
    'honed bore',
  );
  return { customerId: customer.body.id as string, mark, jobNumber: job.body.number as string };
}

type Item = {
  mark: string;
  customerName: string;
  phone: string | null;
  familyCode: string;
  bores: number;
  stepsLeft: number;
  lastBore: { stepLabel: string; finishedBore: { mm: string; in: string }; jobNumber: string };
};

describe('GET /api/insights/cylinders-near-last-step', () => {
  // Worked by hand for the family of the fixtures (standard bore 2.5170 in, clean-up 0.0030 in,
  // steps +0.010 … +0.040 in, largest oversize 0.040 in); a rebore must finish at or above the
  // last finished bore + 0.0030 in:
  //  - honed 2.5372 in after +0.020: floor 2.5402; +0.030 (2.5470) and +0.040 (2.5570) → 2 left;
  //  - honed 2.5472 in after +0.030: floor 2.5502; only +0.040 (2.5570) → 1 left;
  //  - honed 2.5572 in after +0.040: floor 2.5602; nothing within 0.040 in → 0 left (a sleeve).
  // 2.5472 in × 25.4 = 64.69888 mm and 2.5572 in × 25.4 = 64.95288 mm (1 in = 25.4 mm exactly,
  // NIST SP 811).
  let two: Awaited<ReturnType<typeof boredCylinder>>;
  let one: Awaited<ReturnType<typeof boredCylinder>>;
  let none: Awaited<ReturnType<typeof boredCylinder>>;

  beforeAll(async () => {
    two = await boredCylinder(`Oriel ${uniq('Fenwright')}`, '+0.020 in', '2.5352 in', '2.5372 in');
    one = await boredCylinder(`Sabeth ${uniq('Loamgrave')}`, '+0.030 in', '2.5452 in', '2.5472 in');
    none = await boredCylinder(`Tobin ${uniq('Quarrel')}`, '+0.040 in', '2.5552 in', '2.5572 in');
    // Marked and never bored: never near its last step.
    const fresh = await staff.post('/api/customers', { name: `Ulla ${uniq('Brackenridge')}` });
    await staff.post(`/api/customers/${fresh.body.id}/cylinders`, {
      mark: uniq('F').toUpperCase(),
      familyId: family.id,
    });
  });

  const ours = (items: Item[]) => items.filter((i) => i.familyCode === family.code);

  it('when asked with the default of one step, then the cylinder with none left comes first, then the one with one left', async () => {
    const res = await owner.get('/api/insights/cylinders-near-last-step');
    expect(res.status).toBe(200);
    expect(res.body.within).toBe(1);
    const items = ours(res.body.items);
    expect(items.map((i) => [i.mark, i.stepsLeft])).toEqual([
      [none.mark, 0],
      [one.mark, 1],
    ]);
    expect(items[0]).toMatchObject({
      bores: 1,
      phone: '555 0142',
      lastBore: {
        stepLabel: '+0.040 in',
        finishedBore: { in: '2.5572', mm: '64.95288' },
        jobNumber: none.jobNumber,
      },
    });
    expect(items[1].lastBore.finishedBore).toEqual({ in: '2.5472', mm: '64.69888' });
    // The headline counts cover every family (other tests may add their own): at least ours.
    expect(res.body.sleevesToExpect).toBeGreaterThanOrEqual(1);
    expect(res.body.lastStepNext).toBeGreaterThanOrEqual(1);
  });

  it('when asked within two steps, then the cylinder with two left joins the end of the list', async () => {
    const res = await owner.get('/api/insights/cylinders-near-last-step?within=2');
    expect(res.status).toBe(200);
    expect(ours(res.body.items).map((i: Item) => [i.mark, i.stepsLeft])).toEqual([
      [none.mark, 0],
      [one.mark, 1],
      [two.mark, 2],
    ]);
  });

  it('when asked within zero steps, then only the sleeves to expect are listed', async () => {
    const res = await owner.get('/api/insights/cylinders-near-last-step?within=0');
    expect(ours(res.body.items).map((i: Item) => i.mark)).toEqual([none.mark]);
    expect(res.body.items.every((i: Item) => i.stepsLeft === 0)).toBe(true);
  });

  it('when downloaded as CSV, then each listed cylinder is a line with its customer and steps left', async () => {
    const res = await owner.get('/api/insights/cylinders-near-last-step.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const text = String(res.text);
    expect(text.split('\r\n')[0]).toContain('Steps left');
    const line = text.split('\r\n').find((l) => l.startsWith(none.mark));
    expect(line).toBeDefined();
    expect(line).toContain('2.5572');
    expect(line?.endsWith(',0')).toBe(true);
  });

  it('when the window is not a whole number from 0 to 3, then 400 names the field', async () => {
    for (const within of ['4', '-1', 'x', '1.5']) {
      const res = await owner.get(`/api/insights/cylinders-near-last-step?within=${within}`);
      expect(res.status).toBe(400);
      expect(res.body.error.details[0]).toMatchObject({ field: 'within' });
    }
  });

  it('when someone other than the owner asks, then 403', async () => {
    for (const client of [staff, machinist, buyer]) {
      expect((await client.get('/api/insights/cylinders-near-last-step')).status).toBe(403);
    }
  });
});
