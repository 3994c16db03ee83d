import { closeTestApp, signedIn } from '../support/api';

afterAll(closeTestApp);

describe('the shop locale (how dates are written)', () => {
  it('when the owner sets the locale to en-US, then every session carries it for the pages', async () => {
    const owner = await signedIn('owner');
    const before = (await owner.get('/api/settings')).body.locale as string;
    try {
      const saved = await owner.patch('/api/settings', { locale: 'en-US' });
      expect(saved.status).toBe(200);
      expect(saved.body.locale).toBe('en-US');
      const staff = await signedIn('staff');
      const session = await staff.get('/api/session');
      expect(session.body.shop).toMatchObject({ locale: 'en-US' });
    } finally {
      await owner.patch('/api/settings', { locale: before });
    }
  });

  it('when a locale that is no locale is sent, then 400 names the field and nothing changes', async () => {
    const owner = await signedIn('owner');
    const before = (await owner.get('/api/settings')).body.locale as string;
    const res = await owner.patch('/api/settings', { locale: 'not a locale' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      { field: 'locale', message: 'must be a locale such as "en-GB" or "en-US"' },
    ]);
    expect((await owner.get('/api/settings')).body.locale).toBe(before);
  });
});
