import { closeTestApp, signedIn } from '../support/api';

afterAll(closeTestApp);

describe('the label stock setting (sheets or a label printer roll)', () => {
  it('when the owner picks the 62 × 29 mm roll, then every session carries it for the label pages', async () => {
    const owner = await signedIn('owner');
    const before = (await owner.get('/api/settings')).body.labelStock as string;
    try {
      const saved = await owner.patch('/api/settings', { labelStock: 'roll-62x29' });
      expect(saved.status).toBe(200);
      expect(saved.body.labelStock).toBe('roll-62x29');
      const machinist = await signedIn('machinist');
      const session = await machinist.get('/api/session');
      expect(session.body.shop).toMatchObject({ labelStock: 'roll-62x29' });
    } finally {
      await owner.patch('/api/settings', { labelStock: before });
    }
  });

  it('when a roll size the shop does not offer is sent, then 400 names the field and nothing changes', async () => {
    const owner = await signedIn('owner');
    const before = (await owner.get('/api/settings')).body.labelStock as string;
    const res = await owner.patch('/api/settings', { labelStock: 'roll-100x50' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      { field: 'labelStock', message: 'must be sheet, roll-62x35, roll-62x29 or roll-50x25' },
    ]);
    expect((await owner.get('/api/settings')).body.labelStock).toBe(before);
  });

  it('when a machinist tries to change it, then 403 and nothing changes', async () => {
    const machinist = await signedIn('machinist');
    const res = await machinist.patch('/api/settings', { labelStock: 'roll-50x25' });
    expect(res.status).toBe(403);
  });
});
