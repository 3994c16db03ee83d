// The owner reads the audit trail: a change made a moment ago is on top with who, what and the
// values before and after; the filters work from the keyboard; other roles have no way in.
import { browserTestFile, DEMO, screenshot, seriousA11yViolations, signIn } from './support';

const env = browserTestFile({ timeout: 180_000 });

describe('audit trail', () => {
  it('when the owner changes a role and opens the audit trail, then the change is on top with before and after', async () => {
    const page = env.page;
    await signIn(page, env.baseUrl, DEMO.owner);

    // A change to look for: the demo buyer becomes staff and back again, through the Users page.
    await page.goto(`${env.baseUrl}/admin/users`);
    const buyerRow = page.getByRole('row', { name: new RegExp(DEMO.buyer) });
    await buyerRow.getByRole('combobox').waitFor();
    await buyerRow.getByRole('combobox').click();
    await page.getByRole('option', { name: /staff/i }).click();
    await page
      .getByText(/is now/)
      .first()
      .waitFor();

    await page
      .getByRole('navigation', { name: /main/i })
      .getByRole('link', { name: 'Audit trail' })
      .click();
    await page.getByRole('heading', { name: 'Audit trail' }).waitFor();
    const first = page.getByRole('row').nth(1);
    await first.getByText('User changed').waitFor();
    const text = (await first.textContent()) ?? '';
    expect(text).toMatch(/role:\s*buyer\s*→became\s*staff/);
    await screenshot(page, 'audit-trail');
    expect(await seriousA11yViolations(page)).toEqual([]);

    // Keyboard only: move to the "Record" filter, open it, choose "User".
    const record = page.getByRole('combobox', { name: 'Record' });
    await record.focus();
    await page.keyboard.press('Enter');
    await page.getByRole('option', { name: 'User', exact: true }).waitFor();
    // Type-ahead picks the option whose name starts with what is typed.
    await page.keyboard.type('User');
    await page.waitForTimeout(400);
    await page.keyboard.press('Enter');
    await page.getByRole('button', { name: /Show everything/ }).waitFor();
    // The filtered page replaces the first one when its answer arrives: wait for it (15 s at most).
    let actions: string[] = [];
    for (let waited = 0; waited < 15_000; waited += 200) {
      actions = await page.locator('td.mat-column-action').allTextContents();
      if (actions.length > 0 && actions.every((a) => /User|password/i.test(a))) break;
      await page.waitForTimeout(200);
    }
    expect(actions.length).toBeGreaterThan(0);
    expect(actions.filter((a) => !/User|password/i.test(a))).toEqual([]);
    await screenshot(page, 'audit-trail-users');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('when the machinist goes to the audit trail address, then the page is not shown and the menu has no entry', async () => {
    const page = env.page;
    await env.signInAs('machinist');
    const nav = page.getByRole('navigation', { name: /main/i });
    await nav.getByRole('link', { name: 'Home' }).waitFor();
    expect(await nav.getByRole('link', { name: 'Audit trail' }).count()).toBe(0);
    await page.goto(`${env.baseUrl}/admin/audit`);
    await page.waitForLoadState('networkidle');
    expect(await page.getByRole('heading', { name: 'Audit trail' }).count()).toBe(0);
  });
});
