import { closeTestApp, signedIn } from '../support/api';
import { expectCarriedToSessions, expectRefusedAtField } from '../support/shop-settings';

afterAll(closeTestApp);

describe('the label stock setting (sheets or a label printer roll)', () => {
  it('when the owner picks the 62 × 29 mm roll, then every session carries it for the label pages', async () => {
    await expectCarriedToSessions('labelStock', 'roll-62x29', 'machinist');
  });

  it('when a roll size the shop does not offer is sent, then 400 names the field and nothing changes', async () => {
    await expectRefusedAtField(
      'labelStock',
      'roll-100x50',
      'must be sheet, roll-62x35, roll-62x29 or roll-50x25',
    );
  });

  it('when a machinist tries to change it, then 403 and nothing changes', async () => {
    const machinist = await signedIn('machinist');
    const res = await machinist.patch('/api/settings', { labelStock: 'roll-50x25' });
    expect(res.status).toBe(403);
  });
});
