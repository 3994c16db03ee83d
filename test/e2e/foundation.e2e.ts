// Each demo role signs in and sees its own navigation; the owner adds a user who then signs in.
import {
  browserTestFile,
  DEMO,
  type DemoRole,
  screenshot,
  seriousA11yViolations,
  signIn,
} from './support';

const env = browserTestFile();

// The navigation's named groups each role sees, in order; a group with nothing for the role is left out.
const NAV: Record<DemoRole, { groups: string[]; sees: string[]; hidden: string[] }> = {
  owner: {
    groups: ['Daily work', 'Shelf and stock', 'Buying', 'Figures', 'Shop and account'],
    sees: ['Home', 'Users', 'My account'],
    hidden: [],
  },
  buyer: {
    groups: ['Daily work', 'Shelf and stock', 'Buying', 'Figures', 'Shop and account'],
    sees: ['Home', 'My account'],
    hidden: ['Users'],
  },
  machinist: {
    groups: ['Daily work', 'Shelf and stock', 'Buying', 'Shop and account'],
    sees: ['Home', 'My account'],
    hidden: ['Users', 'What sits'],
  },
  staff: {
    groups: ['Daily work', 'Shelf and stock', 'Buying', 'Shop and account'],
    sees: ['Home', 'My account'],
    hidden: ['Users', 'What sits'],
  },
};

// The sections of each role's home page, in order.
const HOME: Record<DemoRole, string[]> = {
  owner: [
    'Due today',
    'Waiting for parts',
    'Waiting for the customer’s approval',
    'Stock alerts',
    'Orders on the way',
  ],
  buyer: ['Waiting for parts', 'Stock alerts', 'Orders on the way'],
  machinist: ['Due today', 'Waiting for parts', 'Waiting for the customer’s approval'],
  staff: ['Due today', 'Waiting for the customer’s approval', 'Orders on the way'],
};

describe('signing in', () => {
  it('when the sign-in page opens, then it has no serious accessibility problems', async () => {
    await env.page.goto(`${env.baseUrl}/sign-in`);
    await env.page.getByRole('button', { name: 'Sign in' }).waitFor();
    await screenshot(env.page, 'foundation-sign-in');
    expect(await seriousA11yViolations(env.page)).toEqual([]);
  });

  it.each(Object.keys(DEMO) as DemoRole[])(
    'when the demo %s signs in, then the navigation shows only what the role may use',
    async (role) => {
      const page = env.page;
      await env.signInAs(role);
      const nav = page.getByRole('navigation', { name: /main/i });
      for (const label of NAV[role].sees) await nav.getByRole('link', { name: label }).waitFor();
      const toggles = nav.getByRole('heading', { level: 2 }).getByRole('button');
      expect(
        (await toggles.allTextContents()).map((t) => t.replace(/expand_\w+/, '').trim()),
      ).toEqual(NAV[role].groups);
      // Every group is open on a new device, so a hidden entry is absent, not merely folded away.
      for (const toggle of await toggles.all())
        expect(await toggle.getAttribute('aria-expanded')).toBe('true');
      for (const label of NAV[role].hidden)
        expect(await nav.getByRole('link', { name: label }).count()).toBe(0);
      // Home is the role's day's work, not a second copy of the navigation.
      const main = page.getByRole('main');
      await main.locator('.panel').first().waitFor();
      expect(await main.getByRole('heading', { level: 2 }).allTextContents()).toEqual(
        HOME[role].map((title) => expect.stringContaining(title)),
      );
      expect(await main.getByRole('link', { name: 'Users' }).count()).toBe(0);
      await screenshot(page, `foundation-home-${role}`);
      expect(await seriousA11yViolations(page)).toEqual([]);
    },
  );

  it('when the owner adds a user, then that user can sign in', async () => {
    const page = env.page;
    await env.signInAs('owner', '/admin/users');
    await page.getByRole('button', { name: /add user/i }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name').fill('Wren Castellan');
    await dialog.getByLabel('E-mail').fill('wren@demo.test');
    await dialog.getByLabel('Role').click();
    await page.getByRole('option', { name: /machinist/i }).click();
    await dialog
      .getByLabel(/password/i)
      .first()
      .fill('a-long-first-password');
    await screenshot(page, 'foundation-add-user-dialog');
    await dialog.getByRole('button', { name: /add|save|create/i }).click();
    await page.getByRole('cell', { name: 'wren@demo.test' }).waitFor();
    await page.locator('mat-dialog-container').waitFor({ state: 'detached' });
    await screenshot(page, 'foundation-users');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.context().clearCookies();
    await signIn(page, env.baseUrl, 'wren@demo.test', 'a-long-first-password');
    await page.getByText('Wren Castellan').first().waitFor();
  });
});

describe('shop settings', () => {
  it('when the owner changes how long a held piston stays held, then it is saved and kept', async () => {
    const page = env.page;
    await env.signInAs('owner', '/admin/settings');
    const days = page.getByLabel('Held pistons are released after (days)');
    await days.waitFor();
    expect(await page.getByLabel('Shop name').inputValue()).toBe('Tallowmere Bore & Hone');
    await days.fill('21');
    await screenshot(page, 'foundation-settings');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('Shop settings saved.').waitFor();
    await page.reload();
    await days.waitFor();
    expect(await days.inputValue()).toBe('21');
  });
});
