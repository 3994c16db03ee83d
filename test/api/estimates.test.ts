// The labour price list and the job's estimate through the API against the real app and database:
// the estimate proposed from the job's bores and holds, lines added, changed and removed, a
// discount with a reason, and bad input refused with nothing written. Sums are hand arithmetic
// written beside each check (half-up per line, tax once on the subtotal).
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, everyRoleSignedIn } from '../support/api';
import { makeLabour, makePricedJob, type Labour, type PricedJob } from '../support/money-fixtures';

const { owner, staff, machinist, buyer } = everyRoleSignedIn({ machinist: 'in' });
let labour: Labour;
let job: PricedJob;

beforeAll(async () => {
  await saveSettings(null, {
    taxRate: '20',
    pricesIncludeTax: false,
    homeCurrency: 'EUR',
    clearancePolicy: 'min',
    maxCutPerPass: '0.020 in',
  });
  // Only this file's price list is proposed, whatever another file left active.
  await db('labour_operations').update({ active: false });
  labour = await makeLabour(owner);
  job = await makePricedJob(owner, staff, machinist);
});
afterAll(closeTestApp);

describe('the labour price list', () => {
  it('when anyone signed in lists it, then each operation has id, name, per, price (two decimals) and active', async () => {
    const res = await machinist.get('/api/labour-operations');
    expect(res.status).toBe(200);
    const bore = res.body.items.find((i: { id: string }) => i.id === labour.bore);
    expect(bore).toEqual(
      expect.objectContaining({ id: labour.bore, per: 'cylinder', price: '55.00', active: true }),
    );
  });

  it('when staff or a machinist try to change a price, then 403; the owner may', async () => {
    expect(
      (await staff.patch(`/api/labour-operations/${labour.clean}`, { price: '1.00' })).status,
    ).toBe(403);
    expect(
      (await machinist.post('/api/labour-operations', { name: 'x', per: 'job', price: '1' }))
        .status,
    ).toBe(403);
    const res = await owner.patch(`/api/labour-operations/${labour.clean}`, { price: 12 });
    expect(res.status).toBe(200);
    expect(res.body.price).toBe('12.00');
  });

  it.each([
    [{ name: 'Deglaze', per: 'hour', price: '10.00' }, 'per'],
    [{ name: 'Deglaze', per: 'job', price: '-10.00' }, 'price'],
    [{ name: 'Deglaze', per: 'job', price: 'NaN' }, 'price'],
    [{ name: '', per: 'job', price: '10.00' }, 'name'],
  ])('when the owner sends %j, then 400 naming %s and nothing is written', async (body, field) => {
    const before = await db('labour_operations').count<{ count: string }[]>('* as count');
    const res = await owner.post('/api/labour-operations', body);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe(field);
    const after = await db('labour_operations').count<{ count: string }[]>('* as count');
    expect(after[0].count).toBe(before[0].count);
  });
});

describe('the estimate', () => {
  it('when a two-stroke twin is bored with pistons and rings held, then labour and parts are proposed: 456.00 + 20 % = 547.20', async () => {
    const res = await buyer.get(`/api/jobs/${job.id}/estimate`);
    expect(res.status).toBe(200);
    expect(res.body.state).toBe('draft');
    expect(res.body.currency).toBe('EUR');
    const byKind = (kind: string) =>
      res.body.lines
        .filter((l: { kind: string }) => l.kind === kind)
        .map((l: { total: string }) => l.total);
    // Bore 2 × 55.00 = 110.00, hone 2 × 25.00 = 50.00, chamfer 2 × 18.50 = 37.00, clean 12.00.
    expect(byKind('labour').sort()).toEqual(['110.00', '12.00', '37.00', '50.00']);
    // Two pistons at 89.00 and two ring sets at 34.50.
    expect(byKind('part').sort()).toEqual(['34.50', '34.50', '89.00', '89.00']);
    // 110 + 50 + 37 + 12 + 178 + 69 = 456.00; tax 456.00 × 20 % = 91.20.
    expect(res.body).toMatchObject({ subtotal: '456.00', tax: '91.20', total: '547.20' });
    for (const l of res.body.lines) {
      expect(Object.keys(l)).toEqual(
        expect.arrayContaining(['id', 'kind', 'description', 'quantity', 'unitPrice', 'total']),
      );
    }
    // Asking again proposes nothing twice.
    const again = await buyer.get(`/api/jobs/${job.id}/estimate`);
    expect(again.body.lines).toHaveLength(8);
  });

  it('when staff add a line, then 201 with its total; a removed proposed line stays removed', async () => {
    const add = await staff.post(`/api/jobs/${job.id}/estimate/lines`, {
      description: 'Skim the head face',
      quantity: '1.5',
      unitPrice: '30.15',
    });
    expect(add.status).toBe(201);
    // 1.5 × 30.15 = 45.225 → 45.23 half-up.
    expect(add.body).toMatchObject({
      kind: 'other',
      quantity: '1.5',
      unitPrice: '30.15',
      total: '45.23',
    });
    const est = (await staff.get(`/api/jobs/${job.id}/estimate`)).body;
    const clean = est.lines.find(
      (l: { total: string; kind: string }) => l.kind === 'labour' && l.total === '12.00',
    );
    expect((await staff.delete(`/api/jobs/${job.id}/estimate/lines/${clean.id}`)).status).toBe(204);
    const after = (await staff.get(`/api/jobs/${job.id}/estimate`)).body;
    expect(after.lines.some((l: { id: string }) => l.id === clean.id)).toBe(false);
    // 456.00 − 12.00 + 45.23 = 489.23; tax 97.846 → 97.85; total 587.08.
    expect(after).toMatchObject({ subtotal: '489.23', tax: '97.85', total: '587.08' });
  });

  it('when a discount is given with a reason, then it is a negative line; more than the subtotal is refused', async () => {
    const res = await staff.post(`/api/jobs/${job.id}/estimate/discount`, {
      amount: '9.23',
      reason: 'Regular customer',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ total: '-9.23', description: 'Discount: Regular customer' });
    const est = (await staff.get(`/api/jobs/${job.id}/estimate`)).body;
    // 489.23 − 9.23 = 480.00; tax 96.00; total 576.00.
    expect(est).toMatchObject({ subtotal: '480.00', tax: '96.00', total: '576.00' });
    const tooMuch = await staff.post(`/api/jobs/${job.id}/estimate/discount`, {
      amount: '480.01',
      reason: 'Oops',
    });
    expect(tooMuch.status).toBe(400);
    expect(tooMuch.body.error.details[0].field).toBe('amount');
    const noReason = await staff.post(`/api/jobs/${job.id}/estimate/discount`, { amount: '1.00' });
    expect(noReason.status).toBe(400);
  });

  it.each([
    [{ description: 'x', quantity: 1, unitPrice: '-5.00' }, 'unitPrice'],
    [{ description: 'x', quantity: 1, unitPrice: 'NaN' }, 'unitPrice'],
    [{ description: 'x', quantity: 0, unitPrice: '5.00' }, 'quantity'],
    [{ description: '', quantity: 1, unitPrice: '5.00' }, 'description'],
    [{ description: 'x', quantity: 1, unitPrice: '5.00', kind: 'part' }, 'body'],
  ])(
    'when staff send the line %j, then 400 naming %s and nothing is written',
    async (body, field) => {
      const before = await db('estimate_lines')
        .where({ job_id: job.id })
        .count<{ count: string }[]>('* as count');
      const res = await staff.post(`/api/jobs/${job.id}/estimate/lines`, body);
      expect(res.status).toBe(400);
      expect(res.body.error.details[0].field).toBe(field);
      const after = await db('estimate_lines')
        .where({ job_id: job.id })
        .count<{ count: string }[]>('* as count');
      expect(after[0].count).toBe(before[0].count);
    },
  );

  it('when a machinist or the buyer try to add a line, then 403', async () => {
    const body = { description: 'x', quantity: 1, unitPrice: '5.00' };
    expect((await machinist.post(`/api/jobs/${job.id}/estimate/lines`, body)).status).toBe(403);
    expect((await buyer.post(`/api/jobs/${job.id}/estimate/lines`, body)).status).toBe(403);
  });

  it('when prices include tax, then the same lines hold 480.00 × 20 / 120 = 80.00 of tax and the total is 480.00', async () => {
    await saveSettings(null, { pricesIncludeTax: true });
    try {
      const est = (await staff.get(`/api/jobs/${job.id}/estimate`)).body;
      expect(est).toMatchObject({
        subtotal: '480.00',
        tax: '80.00',
        total: '480.00',
        pricesIncludeTax: true,
      });
    } finally {
      await saveSettings(null, { pricesIncludeTax: false });
    }
  });

  it('when a line of another job or an unknown job is named, then 404', async () => {
    const other = await makePricedJob(owner, staff, machinist);
    const est = (await staff.get(`/api/jobs/${other.id}/estimate`)).body;
    const res = await staff.delete(`/api/jobs/${job.id}/estimate/lines/${est.lines[0].id}`);
    expect(res.status).toBe(404);
    const unknown = await staff.get('/api/jobs/00000000-0000-4000-8000-000000000000/estimate');
    expect(unknown.status).toBe(404);
  });
});
