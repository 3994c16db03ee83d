// Finding a cylinder by the shop's mark on its tag, as a scanner or the camera reads it: everyone
// signed in may look, the mark matches whole and whatever its case, and a mark nobody carries is an
// empty answer rather than an error, so a search box can try it on every Enter.
import { closeTestApp, ok, signedInClients, uniq } from '../support/api';
import { familyAndBin } from '../support/jobs-fixtures';

const { owner, staff, buyer } = signedInClients({ owner: 'mm', staff: 'mm', buyer: 'mm' });
const { family } = familyAndBin(owner);

afterAll(closeTestApp);

async function markedCylinder(mark: string): Promise<{ id: string; customerId: string }> {
  const customer = ok<{ id: string }>(
    await staff.post('/api/customers', { name: `Oriel ${uniq('Fenwright')}` }),
    201,
    'customer',
  );
  const cylinder = ok<{ id: string }>(
    await staff.post(`/api/customers/${customer.id}/cylinders`, { mark, familyId: family.id }),
    201,
    'cylinder',
  );
  return { id: cylinder.id, customerId: customer.id };
}

describe('a cylinder found by the mark on its tag', () => {
  it('when the mark is asked for in another case, then the one cylinder carrying it answers', async () => {
    const mark = uniq('TG').toUpperCase();
    const cylinder = await markedCylinder(mark);
    const res = await buyer.get(`/api/cylinders?mark=${encodeURIComponent(mark.toLowerCase())}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      items: [{ id: cylinder.id, mark, customerId: cylinder.customerId }],
    });
  });

  it('when only part of a mark is given, or one nobody carries, then the answer is empty', async () => {
    const mark = uniq('TG').toUpperCase();
    await markedCylinder(mark);
    for (const asked of [mark.slice(0, -1), `${mark}-2`, uniq('NONE')]) {
      const res = await staff.get(`/api/cylinders?mark=${encodeURIComponent(asked)}`);
      expect([asked, res.status, res.body]).toEqual([asked, 200, { items: [] }]);
    }
  });

  it('when no mark is given, then 400 names the mark field', async () => {
    for (const query of ['', '?mark=', '?mark=%20%20']) {
      const res = await staff.get(`/api/cylinders${query}`);
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([expect.objectContaining({ field: 'mark' })]);
    }
  });
});
