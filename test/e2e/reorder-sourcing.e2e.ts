// The buyer's way from a low part to an order, in the browser: a draft that differs from the
// suggestion says why and takes the rest from the next supplier; "who has it" opens Sourcing with
// the part's family and step filled in and Find ready; a part nobody offers points to the item
// waiting in the mapping queue that might be it. Screenshots at 1280 and 800 px wide.
import type { Page } from 'playwright-core';
import { browserTestFile, DEMO, screenshot, seriousA11yViolations, signIn } from './support';

const env = browserTestFile({ timeout: 180_000 });

async function both(page: Page, name: string) {
  await page.setViewportSize({ width: 1280, height: 900 });
  await screenshot(page, `${name}-1280`);
  await page.setViewportSize({ width: 800, height: 1000 });
  await screenshot(page, `${name}-800`);
  // Nothing may stick out sideways at tablet width.
  const overflow = await page.evaluate(() => {
    const d = (globalThis as unknown as { document: { documentElement: { scrollWidth: number } } })
      .document;
    return d.documentElement.scrollWidth;
  });
  expect(overflow).toBeLessThanOrEqual(800);
  await page.setViewportSize({ width: 1280, height: 900 });
}

const CAPPED = 'FLW-CAP-PC';
const UNOFFERED = 'FLW-NONE-RS';
let alder = '';
let birch = '';

beforeAll(async () => {
  const page = env.page;
  await signIn(page, env.baseUrl, DEMO.owner);
  await page.goto(`${env.baseUrl}/`);
  const [step] = await env.query<{ family_id: string; step_id: string }>(
    `SELECT family_id, step_id FROM parts WHERE sku = 'BT-72-PC-025'`,
  );
  const capped = await env.api<{ id: string }>(page, 'POST', '/api/parts', {
    kind: 'piston',
    sku: CAPPED,
    familyId: step.family_id,
    stepId: step.step_id,
    description: 'Cast piston for the capped-stock check',
    salePrice: '89.00',
    material: 'cast',
    ringCount: 2,
  });
  const unoffered = await env.api<{ id: string }>(page, 'POST', '/api/parts', {
    kind: 'rings',
    sku: UNOFFERED,
    familyId: step.family_id,
    stepId: step.step_id,
    description: 'Ring set nobody has mapped yet',
    salePrice: '34.50',
  });
  await env.api<{ id: string }>(page, 'PUT', `/api/parts/${capped.id}/reorder-rule`, {
    reorderPoint: 2,
    orderUpTo: 6,
  });
  await env.api<{ id: string }>(page, 'PUT', `/api/parts/${unoffered.id}/reorder-rule`, {
    reorderPoint: 1,
    orderUpTo: 2,
  });
  const supplier = (name: string) =>
    env.api<{ id: string }>(page, 'POST', '/api/suppliers', {
      name,
      email: `${name.toLowerCase().replace(/\W+/g, '-')}@example.test`,
      currency: 'EUR',
      leadDays: 5,
      shippingCost: '0',
    });
  alder = (await supplier('Alderwick Piston Supply')).id;
  birch = (await supplier('Birchcombe Ring & Bore')).id;
  // What their price lists said (an import writes these rows): Alderwick has 3, Birchcombe 4, and
  // Alderwick lists our ring set under our own SKU without anyone having mapped it.
  const item = (supplierId: string, sku: string, partId: string | null, price: string, n: number) =>
    env.query(
      `INSERT INTO supplier_items (supplier_id, sku, description, part_id, price, currency, available)
       VALUES ($1, $2, $3, $4, $5, 'EUR', $6)`,
      [supplierId, sku, 'As the supplier lists it', partId, price, n],
    );
  await item(alder, 'ALD-7731', capped.id, '30.00', 3);
  await item(birch, 'BCR-0912', capped.id, '34.00', 4);
  await item(alder, UNOFFERED, null, '12.00', 20);
});

describe('from the reorder list to orders', () => {
  it('when the cheapest supplier has only 3 of the 6 suggested, then the drafts say so and take 3 from the next', async () => {
    const page = env.page;
    await env.signInAs('buyer', '/purchasing/reorder');
    await page.getByLabel('Find a part').fill('FLW-');
    await page.getByText(CAPPED, { exact: true }).waitFor();
    await page.getByText(UNOFFERED, { exact: true }).waitFor();
    await page.getByRole('button', { name: 'Draft orders for the low parts' }).click();

    const why = page.locator('.adjusted li', { hasText: CAPPED });
    await why.waitFor();
    const text = await why.innerText();
    expect(text).toContain('Suggested 6');
    expect(text).toContain('Alderwick Piston Supply says it has 3');
    expect(text).toMatch(/3 from Alderwick Piston Supply \(PO-[\d-]+\) and 3 from Birchcombe/);
    expect(await page.getByRole('link', { name: /Draft PO-.*Alderwick/ }).count()).toBe(1);
    expect(await page.getByRole('link', { name: /Draft PO-.*Birchcombe/ }).count()).toBe(1);

    // Nobody offers the ring set, but the mapping queue suggests Alderwick's item for it.
    const waiting = page.locator('.unsourced .waiting', { hasText: UNOFFERED });
    await waiting.getByRole('link', { name: `Alderwick Piston Supply's ${UNOFFERED}` }).waitFor();
    await both(page, 'reorder-drafts-explained');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('when the buyer asks who has the ring set, then Sourcing has its family and step, Find works, and the waiting item is one click away', async () => {
    const page = env.page;
    const row = page.getByRole('row', { name: new RegExp(UNOFFERED) });
    await row.getByRole('link', { name: `Who has ${UNOFFERED}` }).click();
    await page.waitForURL(/\/purchasing\/sourcing\?/);
    await page.getByText(`For ${UNOFFERED}`).waitFor();
    await page.getByText('No supplier offers this.').waitFor();
    // The family and step of the part are filled in.
    await page
      .getByRole('combobox', { name: 'Engine family' })
      .filter({ hasText: /BT-72/ })
      .waitFor();
    await page
      .getByRole('combobox', { name: 'Step' })
      .filter({ hasText: /\+0\.25/ })
      .waitFor();
    const find = page.getByRole('button', { name: 'Find offers' });
    expect(await find.isEnabled()).toBe(true);
    await page.getByLabel('How many').fill('3');
    await find.click();
    await page.waitForURL(/quantity=3/);
    await page.getByText(`For ${UNOFFERED}`).waitFor();
    const link = page.getByRole('link', { name: `Alderwick Piston Supply · ${UNOFFERED}` });
    await link.waitFor();
    await both(page, 'sourcing-for-a-part');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await link.click();
    await page.waitForURL(/\/suppliers\/unmapped\?/);
    expect(await page.getByLabel(/Find/).first().inputValue()).toBe(UNOFFERED);
    await page.getByText('As the supplier lists it').first().waitFor();
    await both(page, 'mapping-queue-from-sourcing');
  });
});
