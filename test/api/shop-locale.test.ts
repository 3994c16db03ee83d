import { closeTestApp } from '../support/api';
import { expectCarriedToSessions, expectRefusedAtField } from '../support/shop-settings';

afterAll(closeTestApp);

describe('the shop locale (how dates are written)', () => {
  it('when the owner sets the locale to en-US, then every session carries it for the pages', async () => {
    await expectCarriedToSessions('locale', 'en-US', 'staff');
  });

  it('when a locale that is no locale is sent, then 400 names the field and nothing changes', async () => {
    await expectRefusedAtField(
      'locale',
      'not a locale',
      'must be a locale such as "en-GB" or "en-US"',
    );
  });
});
