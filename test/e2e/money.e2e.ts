// The money side of a job in the browser: the owner's labour prices; staff price a seeded job
// (a line added, a discount) and send the estimate; the customer opens the e-mailed link in a
// fresh browser with no session, approves and pays the deposit on the payment service's page; the
// job page shows it paid; hand-back issues the invoice and its PDF. Screenshots at both widths,
// and axe-core scans of the customer's page.
import type { Page } from 'playwright-core';
import {
  allowPageErrors,
  type Browser,
  browserTestFile,
  DEMO,
  openBrowser,
  openFromNav,
  screenshotAtWidths,
  seriousA11yViolations,
  signIn,
} from './support';

const env = browserTestFile();
let customer: Browser;

beforeAll(async () => {
  // The customer's own browser: nothing shared with the shop's, no cookie, no session.
  customer = await openBrowser();
});
afterAll(async () => {
  await customer?.close();
});

// The seeded job of Halvard Penrose (QV-54A, one cylinder, booked in, with an e-mail address): its
// estimate proposes only "Clean and inspect" at 15.00, the seeded labour price for every job.
const CUSTOMER = 'Halvard Penrose';
const CUSTOMER_EMAIL = 'halvard@example.test';

let jobId = '';
let jobNumber = '';
let link = '';

async function jobOf(page: Page, name: string): Promise<{ id: string; number: string }> {
  const res = await page.request.get(
    `${env.baseUrl}/api/jobs?state=open&q=${encodeURIComponent(name)}`,
  );
  const body = (await res.json()) as { items: { id: string; number: string }[] };
  expect(body.items.length).toBe(1);
  return body.items[0];
}

async function openJob(page: Page): Promise<void> {
  await page.goto(`${env.baseUrl}/jobs/${jobId}`);
  await page.getByRole('heading', { name: 'Estimate', exact: true }).waitFor();
}

describe('a job priced, agreed from the link, paid and invoiced', () => {
  it('when the owner opens Labour prices and adds an operation, then it is listed with its exact price', async () => {
    const page = env.page;
    await signIn(page, env.baseUrl, DEMO.owner);
    await openFromNav(page, 'Labour prices');
    await page.getByRole('cell', { name: 'Skim the head face', exact: true }).waitFor();
    await page.getByLabel('Operation', { exact: true }).fill('Check the port timing');
    await page.getByLabel(/^Price/).fill('22.40');
    await page.getByRole('button', { name: 'Add the operation' }).click();
    const row = page.getByRole('row', { name: /Check the port timing/ });
    await row.waitFor();
    expect(await row.textContent()).toContain('€22.40');
    await screenshotAtWidths(page, 'money-labour-prices');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('when staff add a line and a discount and send the estimate, then its totals follow the rule and it waits for the customer', async () => {
    const page = env.page;
    await env.signInAs('staff');
    ({ id: jobId, number: jobNumber } = await jobOf(page, CUSTOMER));
    await openJob(page);
    const panel = page.locator('app-estimate-panel');
    await panel.getByRole('cell', { name: /^Clean and inspect Labour/ }).waitFor();
    await panel.getByLabel('Description').fill('Skim the head face');
    await panel.getByLabel('Quantity').fill('1');
    await panel.getByLabel(/^Unit price/).fill('65.00');
    await panel.getByRole('button', { name: 'Add the line' }).click();
    await panel.getByRole('cell', { name: /^Skim the head face Other/ }).waitFor();
    await panel.getByRole('button', { name: 'Give a discount' }).click();
    await panel.getByLabel(/^Discount/).fill('5.00');
    await panel.getByLabel('Reason').fill('Returning customer');
    await panel.getByRole('button', { name: 'Give the discount' }).click();
    await panel.getByRole('cell', { name: /^Discount: Returning customer/ }).waitFor();
    // Worked by hand from the seeded prices: 15.00 + 65.00 − 5.00 = 75.00; tax at the seeded 20 %
    // on the subtotal 15.00; total 90.00.
    const total = panel.locator('[data-figure="total"]');
    await total.filter({ hasText: '€90.00' }).waitFor();
    await panel.getByText('rounded half-up to the cent').waitFor();

    await panel.getByRole('button', { name: 'Send to the customer' }).click();
    await panel.locator('.badge', { hasText: 'With the customer' }).waitFor();
    await screenshotAtWidths(page, 'money-estimate-sent');
    expect(await seriousA11yViolations(page)).toEqual([]);

    // The bench marks the job as waiting for the customer.
    await page.goto(`${env.baseUrl}/jobs`);
    await page
      .locator('.job-card', { hasText: jobNumber })
      .getByText('Waiting for the customer’s approval')
      .waitFor();
  });

  it('when the owner reads the Mailbox, then the estimate e-mail carries the customer’s link', async () => {
    const page = env.page;
    await env.signInAs('owner');
    // The outbox worker sends every couple of seconds: ask again until the mail has arrived.
    for (let i = 0; i < 30 && !link; i++) {
      const res = await page.request.get(`${env.baseUrl}/api/mailbox?pageSize=50`);
      const body = (await res.json()) as { items: { to: string; text: string }[] };
      const mail = body.items.find((m) => m.to.includes(CUSTOMER_EMAIL) && /\/c\//.test(m.text));
      const path = mail && /\/c\/[A-Za-z0-9_-]{43}/.exec(mail.text)?.[0];
      if (path) link = `${env.baseUrl}${path}`;
      else await page.waitForTimeout(1000);
    }
    expect(link).toMatch(/\/c\/[A-Za-z0-9_-]{43}$/);
  });

  it('when the customer opens the link with no session and approves, then the page says so', async () => {
    const page = customer.page;
    await page.goto(link);
    await page.getByRole('heading', { name: `Job ${jobNumber}`, level: 1 }).waitFor();
    await page.getByText(/We have your job/).waitFor();
    await page.locator('[data-figure="total"]', { hasText: '€90.00' }).waitFor();
    // Nothing of the shop's signed-in app is here: no navigation, no sign-in.
    expect(await page.getByRole('navigation').count()).toBe(0);
    expect(page.url()).toBe(link);
    await screenshotAtWidths(page, 'money-public-page', [1280, 800, 390]);
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Approve' }).click();
    await page.getByText('You agreed to this estimate.').waitFor();
    await page.getByText(/the shop has your agreement/).waitFor();
    expect(await page.getByRole('button', { name: 'Approve' }).count()).toBe(0);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('when a link is wrong, then a plain page says it is not valid and names no job', async () => {
    const page = customer.page;
    allowPageErrors(
      /^Failed to load resource: the server responded with a status of 404/,
      'a made-up link is answered 404 on purpose, and the page shows that in words',
      /\/api\/public\/jobs\//,
    );
    await page.goto(`${env.baseUrl}/c/${'x'.repeat(43)}`);
    await page.getByRole('heading', { name: 'This link is not valid or has expired' }).waitFor();
    expect(await page.locator('main').textContent()).not.toMatch(/J-\d|€|Halvard/);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('when staff open the job again, then the estimate shows agreed from the link', async () => {
    const page = env.page;
    await env.signInAs('staff');
    await openJob(page);
    const panel = page.locator('app-estimate-panel');
    await panel.locator('.badge', { hasText: 'Agreed by the customer' }).waitFor();
    await panel.getByText(/from the e-mailed link/).waitFor();
  });

  it('when staff ask for the deposit and the customer pays it on the payment page, then the job shows it paid', async () => {
    const page = env.page;
    const payments = page.locator('app-payments-panel');
    await payments.getByRole('heading', { name: 'Payments' }).waitFor();
    // Amount left empty: the seeded 30 % of the 90.00 total, 27.00 (worked by hand).
    await payments.getByRole('button', { name: 'Ask for the payment' }).click();
    await payments.getByRole('status').filter({ hasText: 'The customer pays €27.00' }).waitFor();
    await payments.getByRole('cell', { name: 'Waiting', exact: true }).waitFor();

    const buyer = customer.page;
    await buyer.goto(link);
    // The payment service's own page may ask the browser for its icon; it has none to give.
    allowPageErrors(
      /^Failed to load resource: the server responded with a status of 404/,
      "the local payment service's page has no icon, and the browser asks for one",
      /favicon\.ico$/,
    );
    await buyer.getByRole('link', { name: 'Pay deposit of €27.00' }).click();
    await buyer.getByRole('heading', { name: /^Payment to / }).waitFor();
    await screenshotAtWidths(buyer, 'money-pay-page', [1280, 390]);
    await buyer.getByRole('button', { name: /^Pay / }).click();
    // Paid, the service sends the customer back to their job's page.
    await buyer.waitForURL(/\/c\/[A-Za-z0-9_-]{43}$/);
    await buyer.getByRole('heading', { name: `Job ${jobNumber}`, level: 1 }).waitFor();

    // The signed event reaches the shop a moment later: look again until it has.
    const paid = payments.locator('[data-figure="paid"]', { hasText: '€27.00' });
    for (let i = 0; i < 20 && (await paid.count()) === 0; i++) {
      await page.waitForTimeout(1000);
      await openJob(page);
    }
    await paid.waitFor();
    // 90.00 − 27.00 = 63.00 still owed.
    await payments.locator('[data-figure="balance"]', { hasText: '€63.00' }).waitFor();
    await payments.getByRole('cell', { name: 'Paid', exact: true }).waitFor();
    await screenshotAtWidths(page, 'money-deposit-paid');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('when the job is handed back, then its invoice shows what is owed and prints as a PDF', async () => {
    const page = env.page;
    await page.getByRole('button', { name: 'Hand back' }).click();
    await page
      .getByRole('dialog')
      .getByRole('button', { name: 'Hand back and issue parts' })
      .click();
    await page.locator('.state-chip', { hasText: 'Handed back' }).waitFor();
    const invoice = page.locator('app-invoice-panel');
    await invoice.getByRole('heading', { name: /^Invoice \S+/ }).waitFor();
    await invoice.locator('[data-figure="invoice-paid"]', { hasText: '€27.00' }).waitFor();
    await invoice.locator('[data-figure="invoice-balance"]', { hasText: '€63.00' }).waitFor();
    await screenshotAtWidths(page, 'money-invoice');
    expect(await seriousA11yViolations(page)).toEqual([]);

    const print = invoice.getByRole('link', { name: 'Print PDF' });
    const href = await print.getAttribute('href');
    expect(href).toBe(`/api/jobs/${jobId}/invoice.pdf`);
    const pdf = await page.request.get(`${env.baseUrl}${href}`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toMatch(/^application\/pdf/);
    expect((await pdf.body()).subarray(0, 5).toString('latin1')).toBe('%PDF-');
  });
});
