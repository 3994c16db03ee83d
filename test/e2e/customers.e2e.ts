// Customers and the life of each cylinder, in the browser on the seeded demo shop: a returning
// customer is found at intake in two keystrokes with their marked cylinder; at the bench the
// recommendation shows the cylinder's earlier bore and the steps left and refuses the steps it
// has passed; the cylinder page shows its history, chart and tag; the owner merges a duplicate,
// exports and erases a customer without losing a job; the owner's insight lists cylinders near
// their last step.
import {
  browserTestFile,
  DEMO,
  screenshotAtWidths,
  seriousA11yViolations,
  signIn,
} from './support';

// Each step drives a real browser against a real server; on a busy machine that takes seconds.
const env = browserTestFile({ timeout: 180_000 });

interface JobBody {
  id: string;
  number: string;
  customerId: string;
  customerName: string;
  family: { id: string; code: string; cylinders: number; standardBore: { mm: string } };
  cylinderDetails: { n: number; cutAt: string | null; step: { label: string } | null }[];
}

/** The returning customer: a demo customer whose cut cylinder is now marked and linked. */
const known = {
  customerId: '',
  customerName: '',
  cylinderId: '',
  mark: 'E2E-TAG-7',
  firstJob: '',
  firstStep: '',
  familyCode: '',
  newJobUrl: '',
};

beforeAll(async () => {
  await signIn(env.page, env.baseUrl, DEMO.owner);
  const page = env.page;
  // A demo job whose first cylinder is already cut: that bore becomes the cylinder's history.
  const list = await env.api<{ items: { id: string }[] }>(
    page,
    'GET',
    '/api/jobs?state=ready_to_go&pageSize=50',
  );
  let cut: JobBody | null = null;
  for (const item of list.items) {
    const job = await env.api<JobBody>(page, 'GET', `/api/jobs/${item.id}`);
    if (job.cylinderDetails[0]?.cutAt && job.cylinderDetails[0].step) {
      cut = job;
      break;
    }
  }
  if (!cut) throw new Error('the demo shop has no job ready to go with a cut cylinder 1');
  const cylinder = await env.api<{ id: string }>(
    page,
    'POST',
    `/api/customers/${cut.customerId}/cylinders`,
    { mark: known.mark, familyId: cut.family.id, castNumber: 'C-2231' },
  );
  await env.api(page, 'PATCH', `/api/jobs/${cut.id}/cylinders/1`, { cylinderId: cylinder.id });
  Object.assign(known, {
    customerId: cut.customerId,
    customerName: cut.customerName,
    cylinderId: cylinder.id,
    firstJob: cut.number,
    firstStep: cut.cylinderDetails[0].step?.label ?? '',
    familyCode: cut.family.code,
  });
});

describe('customers and their cylinders', () => {
  it('when two letters of a returning customer are typed at intake, then they and their marked cylinder are offered', async () => {
    const page = env.page;
    await page.goto(`${env.baseUrl}/jobs/new`);
    await page.getByRole('heading', { name: 'Take in a job' }).waitFor();
    await page.getByLabel('Find the customer').click();
    // Two keystrokes, as a person types them.
    await page.keyboard.type(known.customerName.slice(0, 2));
    const first = page.getByRole('option').first();
    await first.waitFor();
    expect(await first.textContent()).toContain(known.customerName);
    await first.click();
    await page.getByRole('link', { name: known.customerName }).waitFor();
    // Every cylinder on record is of one family: that family is chosen by itself.
    await page.getByText(new RegExp(`^${escape(known.familyCode)} — `)).waitFor();
    await page.getByLabel('Cylinder 1').click();
    await page.getByRole('option', { name: new RegExp(known.mark) }).click();
    await page.getByText(/bored 1× \(last /).waitFor();
    await page
      .getByText(/steps? left/)
      .first()
      .waitFor();
    await page.getByRole('button', { name: 'Hone and new rings only' }).click();
    await screenshotAtWidths(page, 'customers-intake-returning');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Book the job in' }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    known.newJobUrl = page.url();
    const job = await env.api<
      JobBody & { cylinderDetails: { cylinder: { mark: string } | null }[] }
    >(page, 'GET', `/api/jobs/${known.newJobUrl.split('/').pop()}`);
    expect(job.customerId).toBe(known.customerId);
    expect(job.cylinderDetails[0].cylinder?.mark).toBe(known.mark);
  });

  it('when the linked cylinder is measured, then the step choice shows its earlier bore, refuses the steps it passed and counts the steps left', async () => {
    const page = env.page;
    const jobId = known.newJobUrl.split('/').pop() ?? '';
    const job = await env.api<JobBody>(page, 'GET', `/api/jobs/${jobId}`);
    // Worn a little over standard: only the earlier bore stops the small steps.
    const worn = (Number(job.family.standardBore.mm) + 0.04).toFixed(3);
    const readings = ['top', 'middle', 'bottom'].flatMap((depth) =>
      ['pin', 'thrust'].map((axis) => ({ depth, axis, diameter: `${worn} mm` })),
    );
    await env.api(page, 'PUT', `/api/jobs/${jobId}/cylinders/1/readings`, { readings });
    await page.goto(`${known.newJobUrl}/cylinders/1`);
    const past = page.getByRole('region', { name: "This cylinder's earlier bores" });
    // The cylinder's history loads beside the job: wait for the earlier job's link in it.
    await past.getByRole('link', { name: known.firstJob }).waitFor();
    await past.getByText(/(\d+ steps? left|No step left)/).waitFor();
    const text = (await past.textContent()) ?? '';
    expect(text).toContain(known.mark);
    expect(text).toContain(known.firstStep);
    expect(text).toContain(known.firstJob);
    expect(text).toMatch(/(\d+ steps? left|No step left)/);
    // The step bored before is refused, with the earlier bore as the reason.
    const row = page.locator('table.steps tbody tr', {
      has: page.getByRole('rowheader', { name: new RegExp(`^${escape(known.firstStep)}`) }),
    });
    // At or below the earlier bore: "already passed"; just above it but within the clean-up: "too close".
    await expect(row.textContent()).resolves.toMatch(
      /(already passed: |too close to )the earlier bore/,
    );
    await screenshotAtWidths(page, 'customers-bench-earlier-bore');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it("when the cylinder's page opens, then its bores show as a table and a chart, with its tag label", async () => {
    const page = env.page;
    await page.goto(`${env.baseUrl}/customers/${known.customerId}`);
    await page.getByRole('heading', { name: known.customerName, level: 1 }).waitFor();
    await page.getByRole('link', { name: known.mark }).click();
    await page.getByRole('heading', { name: `Cylinder ${known.mark}` }).waitFor();
    const bores = page.getByRole('region', { name: 'Table: bores' });
    await bores.getByRole('link', { name: known.firstJob }).waitFor();
    expect(await bores.textContent()).toContain(known.firstStep);
    await page.locator('app-bore-chart canvas').waitFor();
    await page.locator('app-cylinder-tag svg rect').first().waitFor({ state: 'attached' });
    await screenshotAtWidths(page, 'customers-cylinder-history');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('when the owner merges a duplicate record, then its jobs move over and the duplicate is gone', async () => {
    const page = env.page;
    const families = await env.api<{ items: { id: string; code: string }[] }>(
      page,
      'GET',
      '/api/engine-families?pageSize=50',
    );
    const family = families.items.find((f) => f.code === known.familyCode) ?? families.items[0];
    const into = await env.api<{ id: string }>(page, 'POST', '/api/customers', {
      name: 'Perpetua Quillfeather',
      phone: '555 0170',
    });
    const dup = await env.api<{ id: string }>(page, 'POST', '/api/customers', {
      name: 'P. Quillfeather',
      phone: '555 0171',
    });
    const dupJob = await env.api<{ number: string }>(page, 'POST', '/api/jobs', {
      customerId: dup.id,
      familyId: family.id,
      cylinders: 1,
    });
    await page.goto(`${env.baseUrl}/customers/${into.id}`);
    await page.getByRole('heading', { name: 'Perpetua Quillfeather', level: 1 }).waitFor();
    await page.getByText('No jobs yet.').waitFor();
    await screenshotAtWidths(page, 'customers-page');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Merge a duplicate in' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('The duplicate record').click();
    await page.keyboard.type('Quill');
    await page.getByRole('option', { name: /P\. Quillfeather/ }).click();
    await dialog.getByText(/moves to/).waitFor();
    expect(await seriousA11yViolations(page)).toEqual([]);
    await dialog.getByRole('button', { name: 'Merge into Perpetua Quillfeather' }).click();
    await page.getByRole('link', { name: dupJob.number }).waitFor();
    const gone = await page.request.get(`${env.baseUrl}/api/customers/${dup.id}`);
    expect(gone.status()).toBe(404);
  });

  it('when the owner exports and then erases a customer, then the downloads hold their data and the jobs stay under a placeholder', async () => {
    const page = env.page;
    const families = await env.api<{ items: { id: string }[] }>(
      page,
      'GET',
      '/api/engine-families',
    );
    const c = await env.api<{ id: string }>(page, 'POST', '/api/customers', {
      name: 'Ambrose Thistlewick',
      email: 'ambrose@example.test',
    });
    const job = await env.api<{ number: string }>(page, 'POST', '/api/jobs', {
      customerId: c.id,
      familyId: families.items[0].id,
      cylinders: 1,
    });
    await page.goto(`${env.baseUrl}/customers/${c.id}`);
    await page.getByRole('heading', { name: 'Ambrose Thistlewick', level: 1 }).waitFor();
    const json = await page.getByRole('link', { name: 'Export JSON' }).getAttribute('href');
    const csv = await page.getByRole('link', { name: 'Export CSV' }).getAttribute('href');
    const exported = await page.request.get(`${env.baseUrl}${json}`);
    expect(exported.status()).toBe(200);
    expect(JSON.stringify(await exported.json())).toContain('ambrose@example.test');
    const table = await page.request.get(`${env.baseUrl}${csv}`);
    expect(table.headers()['content-type']).toMatch(/text\/csv/);
    expect(await table.text()).toContain('Ambrose Thistlewick');

    await page.getByRole('button', { name: 'Erase on request' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByText(/the 1 job, their cylinders and bores/).waitFor();
    expect(await seriousA11yViolations(page)).toEqual([]);
    await dialog.getByRole('button', { name: 'Erase name and contact details' }).click();
    await page.getByRole('heading', { name: /^Erased customer /, level: 1 }).waitFor();
    await page.getByRole('link', { name: job.number }).waitFor();
    expect(await page.getByText('ambrose@example.test').count()).toBe(0);
    await screenshotAtWidths(page, 'customers-erased');
  });

  it('when anyone finds a customer in the list, then a row opens their page', async () => {
    const page = env.page;
    await page.goto(`${env.baseUrl}/customers`);
    await page.getByRole('heading', { name: 'Customers', level: 1 }).waitFor();
    await page.getByLabel('Find a customer').fill(known.customerName.slice(0, 4));
    await page.getByRole('link', { name: known.customerName }).click();
    await page.getByRole('heading', { name: known.customerName, level: 1 }).waitFor();
    await page.goto(`${env.baseUrl}/customers`);
    await page.getByRole('heading', { name: 'Customers', level: 1 }).waitFor();
    await screenshotAtWidths(page, 'customers-list');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('when the owner opens the insight on cylinders near their last step, then it lists them or says none is near', async () => {
    const page = env.page;
    await page.goto(`${env.baseUrl}/insights/cylinders?within=3`);
    await page.getByRole('heading', { name: 'Near their last step', level: 1 }).waitFor();
    const panel = page.getByRole('region', { name: 'Cylinders near their last step' });
    await panel.locator('table, .empty-state').first().waitFor();
    await page.getByText('Sleeves to expect').waitFor();
    await screenshotAtWidths(page, 'customers-insight-near-last-step');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });
});

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
