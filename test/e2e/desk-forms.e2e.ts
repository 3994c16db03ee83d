// Forms at the desk and the bench: shop settings checked as they are typed, a due date far ahead
// questioned and shown with its year, one way of writing dates from the shop's locale, a server's
// refusal shown at its field, and "marked as cut" confirmed and taken back.
import {
  allowPageErrors,
  browserTestFile,
  screenshotAtWidths,
  seriousA11yViolations,
} from './support';

const env = browserTestFile();

describe('shop settings', () => {
  it('when the owner types an unknown zone, the currency "XYZ" and a cut of 0.5 in, then the first two are refused at their fields at once and the cut is questioned with the usual range', async () => {
    const page = env.page;
    await env.signInAs('owner', '/admin/settings');
    const zone = page.getByLabel('Time zone');
    await zone.waitFor();
    await zone.fill('Mars/Olympus');
    await page.getByText('Must be a time zone name such as "Europe/Paris" or "UTC".').waitFor();
    await page.getByLabel('Home currency').fill('XYZ');
    await page.getByText('Must be an ISO 4217 currency code.').waitFor();
    await page.getByLabel('Deepest cut per pass, on the diameter').fill('0.5 in');
    // Usual range: common practice (no source), kept in shared/settings-ranges.ts.
    await page.getByText(/Far outside the usual 0\.0020–0\.0394 in \(0\.050–1\.000 mm\)/).waitFor();
    await screenshotAtWidths(page, 'desk-forms-settings-checked');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await zone.fill('UTC');
    await page.getByLabel('Home currency').fill('EUR');
    await page.getByLabel('Deepest cut per pass, on the diameter').fill('0.020 in');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('Shop settings saved.').waitFor();
  });

  it('when the owner chooses month-first dates, then date fields ask for MM/DD/YYYY; back to day first they ask for DD/MM/YYYY', async () => {
    const page = env.page;
    await env.signInAs('owner');
    const orders = [
      [/English, month first/, 'MM/DD/YYYY'],
      [/English, day first/, 'DD/MM/YYYY'],
    ] as const;
    for (const [order, asked] of orders) {
      await page.goto(`${env.baseUrl}/admin/settings`);
      await page.getByLabel('How dates are written').click();
      await page.getByRole('option', { name: order }).click();
      await page.getByRole('button', { name: 'Save settings' }).click();
      await page.getByText('Shop settings saved.').waitFor();
      await page.goto(`${env.baseUrl}/jobs/new`);
      await page.getByText(asked, { exact: true }).waitFor();
    }
  });
});

describe('an engine family', () => {
  it('when a clearance of 0.5 mm is typed, then the usual range is shown beside it, as a caution', async () => {
    const page = env.page;
    await env.signInAs('owner', '/catalog/families/new');
    await page.getByLabel('Clearance, least', { exact: true }).fill('0.5');
    // Usual range: common practice (no source), kept in shared/settings-ranges.ts.
    await page.getByText(/Far outside the usual 0\.010–0\.150 mm \(0\.0004–0\.0059 in\)/).waitFor();
    await screenshotAtWidths(page, 'desk-forms-family-clearance');
  });
});

describe('taking in a job with a due date far ahead', () => {
  it('when 01/01/2099 is typed, then a caution asks to check the year, the job is still booked, and its page and bench card show the year', async () => {
    const page = env.page;
    await env.signInAs('staff', '/jobs/new');
    await page.getByRole('button', { name: 'New customer' }).click();
    await page.getByLabel('Customer name').fill('Lorcan Thistlewood');
    await page.getByLabel('Phone').fill('555 0142');
    await page.getByRole('button', { name: 'Add the customer' }).click();
    await page.getByRole('link', { name: 'Lorcan Thistlewood' }).waitFor();
    await page.getByLabel('Engine family').click();
    await page.getByRole('option').first().click();
    await page.getByLabel('Wanted by').fill('01/01/2099');
    await page.getByLabel('Wanted by').press('Tab');
    await page.getByText('That is more than a year ahead: check the year.').waitFor();
    await screenshotAtWidths(page, 'desk-forms-intake-due-far');
    await page.getByRole('button', { name: 'Book the job in' }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    // 1 January 2099 is a Thursday (any perpetual calendar); the demo shop writes day first.
    await page.getByText('Thu 01/01/2099').waitFor();
    await screenshotAtWidths(page, 'desk-forms-job-page');
    await page.goto(`${env.baseUrl}/jobs`);
    await page.getByText('Due Thu 01/01/2099').waitFor();
    await screenshotAtWidths(page, 'desk-forms-bench');
  });
});

describe('a refused order line', () => {
  it('when a draft line is saved with quantity 0, then the reason shows under that field in words, once, and no raw path', async () => {
    const page = env.page;
    allowPageErrors(
      /status of 400/,
      'the server refuses the quantity on purpose; the test checks the form shows it',
    );
    const [draft] = await env.query<{ id: string }>(
      `SELECT id FROM purchase_orders WHERE state = 'drafting' ORDER BY created_at LIMIT 1`,
    );
    await env.signInAs('buyer', `/purchasing/orders/${draft.id}`);
    const quantity = page.getByLabel('Quantity').first();
    await quantity.fill('0');
    await page.getByRole('button', { name: 'Save changes' }).click();
    const error = page.locator('.field-error').first();
    await error.waitFor();
    expect((await error.textContent())?.trim()).toMatch(/^Must be /);
    expect(await page.getByText(/lines\.0/).count()).toBe(0);
    expect(await page.locator('.mat-mdc-snack-bar-container').count()).toBe(0);
    await screenshotAtWidths(page, 'desk-forms-order-line-refused');
  });
});

describe('marking a cylinder as cut', () => {
  it('when the machinist marks it, then a dialog says what it locks; right after, the machinist can take it back', async () => {
    const page = env.page;
    // The customer's approval before a cut has API tests of its own.
    await env.query(
      `UPDATE settings SET value = value || '{"cutOnlyAfterApproval": false}'::jsonb WHERE key = 'shop'`,
    );
    const [ready] = await env.query<{ job_id: string; n: number }>(
      `SELECT c.job_id, c.n FROM job_cylinders c
         JOIN jobs j ON j.id = c.job_id
         JOIN holds h ON h.job_id = c.job_id AND h.cylinder = c.n
                     AND h.unit_id IS NOT NULL AND h.released_at IS NULL
        WHERE c.cut_at IS NULL AND j.state = 'parts_set_aside'
        ORDER BY j.number LIMIT 1`,
    );
    await env.signInAs('machinist', `/jobs/${ready.job_id}/cylinders/${ready.n}/sheet`);
    const mark = page.getByRole('button', {
      name: new RegExp(`Mark cylinder ${ready.n} as cut|Cut anyway`),
    });
    await mark.waitFor();
    // The label of the clearance field fits its field (it overflowed before).
    const field = page.locator('mat-form-field', { hasText: 'Clearance for this cylinder' });
    const label = field.locator('mat-label');
    const [fieldBox, labelBox] = [await field.boundingBox(), await label.boundingBox()];
    expect(labelBox && fieldBox && labelBox.x + labelBox.width <= fieldBox.x + fieldBox.width).toBe(
      true,
    );
    // A clearance that is no length is refused under its field, not in a passing snack bar.
    await page.getByLabel('Clearance for this cylinder').fill('abc');
    await page.getByRole('button', { name: 'Set clearance' }).click();
    await field.locator('.field-error').waitFor();
    expect(await page.locator('.mat-mdc-snack-bar-container').count()).toBe(0);
    await page.getByLabel('Clearance for this cylinder').fill('');
    if ((await mark.textContent())?.includes('Cut anyway')) {
      await page.getByLabel('Why cut anyway (kept with the job)').fill('Customer asked for it');
    }
    await mark.click();
    const dialog = page.getByRole('dialog');
    await dialog.getByText('its bore readings and its oversize step are locked').waitFor();
    await screenshotAtWidths(page, 'desk-forms-cut-confirm');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await dialog.getByRole('button', { name: 'Mark as cut' }).click();
    await dialog.waitFor({ state: 'detached' });
    const takeBack = page.getByRole('button', { name: 'Take back the cut' });
    await takeBack.waitFor();
    await page.getByText(/You can take it back until \d\d\/\d\d\/\d{4} \d\d:\d\d\./).waitFor();
    await screenshotAtWidths(page, 'desk-forms-cut-marked');

    await takeBack.click();
    await dialog.getByRole('button', { name: 'Take back the cut' }).click();
    await dialog.waitFor({ state: 'detached' });
    await mark.waitFor();
    const rows = await env.query<{ cut_at: Date | null }>(
      'SELECT cut_at FROM job_cylinders WHERE job_id = $1 AND n = $2',
      [ready.job_id, ready.n],
    );
    expect(rows).toEqual([{ cut_at: null }]);
    const audits = await env.query<{ action: string }>(
      `SELECT action FROM audit_events WHERE entity = 'job' AND entity_id = $1 AND action = 'cylinder.cut_undo'`,
      [ready.job_id],
    );
    expect(audits).toHaveLength(1);
  });
});
