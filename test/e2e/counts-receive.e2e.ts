// On the demo shop in the browser: the pages that count waiting jobs and empty steps agree with
// each other and name the missing part; one receiving page takes an ordered delivery in against its
// order line, with the part's usual bin filled in, and the order moves on. Screenshots of each
// changed page at 1280 and 800 px wide.
import type { Page } from 'playwright-core';
import { browserTestFile, screenshotAtWidths, seriousA11yViolations } from './support';

const env = browserTestFile({ timeout: 180_000 });
/** The order the receiving test takes in, for the audit-trail test after it. */
let received: { id: string; number: string } | null = null;

/** Looks again every tenth of a second, for up to ten seconds, until the check holds. */
async function until(check: () => Promise<boolean>): Promise<void> {
  for (let i = 0; i < 100; i++) {
    if (await check()) return;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error('gave up waiting for the page');
}

async function figure(page: Page, label: string): Promise<number> {
  const item = page.locator('.headline li', { hasText: label });
  await item.waitFor();
  return Number((await item.locator('.figure').innerText()).replace(/\D/g, ''));
}

describe('the counts agree', () => {
  it('when the owner looks at the bench, Ran short, Empty steps and a ladder, then they count the same waiting jobs and empty steps and name the missing part', async () => {
    const page = env.page;
    await env.signInAs('owner');

    const waiting = await env.api<{ total: number; items: { waitingFor: string[] }[] }>(
      page,
      'GET',
      '/api/jobs?state=open&waiting=true&pageSize=100',
    );
    // The demo has jobs whose step has nothing free: otherwise there is nothing to compare.
    expect(waiting.total).toBeGreaterThan(0);

    await page.goto(`${env.baseUrl}/jobs`);
    await page.getByRole('heading', { name: 'Job bench', exact: true }).waitFor();
    await page.getByRole('switch', { name: 'Only jobs waiting for parts' }).click();
    const cards = page.locator('a.job-card.waiting');
    // The filtered list replaces the full one: wait until only waiting jobs are shown.
    await until(async () => (await page.locator('a.job-card').count()) === waiting.total);
    expect(await cards.count()).toBe(waiting.total);
    for (const text of await cards.locator('.waiting-badge').allInnerTexts()) {
      expect(text).toMatch(/Waiting for (a piston|a ring set|a piston and a ring set)/);
    }
    await screenshotAtWidths(page, 'counts-bench-waiting');

    await page.goto(`${env.baseUrl}/insights/exposure`);
    await page.getByRole('heading', { name: 'Ran short', exact: true }).waitFor();
    expect(await figure(page, 'Jobs waiting for parts now')).toBe(waiting.total);
    await page.locator('td.parts').first().waitFor();
    for (const text of await page.locator('td.parts').allInnerTexts()) {
      expect(text.trim()).toMatch(/^(piston|ring set|piston and ring set)$/);
    }
    await screenshotAtWidths(page, 'counts-ran-short');

    const empty = await env.api<{
      total: number;
      items: { familyId: string; stepLabel: string; missing: string[] }[];
    }>(page, 'GET', '/api/exposure?pageSize=200');
    expect(empty.total).toBeGreaterThan(0);
    await page.goto(`${env.baseUrl}/stock/exposure`);
    await page.getByRole('heading', { name: 'Empty steps', exact: true }).waitFor();
    await page.locator('td.missing').first().waitFor();
    for (const text of await page.locator('td.missing').allInnerTexts()) {
      expect(text.trim()).toMatch(/^no free (piston|ring set)( and no free ring set)?$/);
    }
    await screenshotAtWidths(page, 'counts-empty-steps');

    // A family with an empty step: its ladder counts the same steps Empty steps lists for it.
    const familyId = empty.items[0].familyId;
    const mine = empty.items.filter((i) => i.familyId === familyId);
    await page.goto(`${env.baseUrl}/catalog/families/${familyId}/ladder`);
    const summary = page.locator('.summary');
    await summary.waitFor();
    expect(await summary.innerText()).toMatch(
      new RegExp(`${mine.length} of \\d+\\s+steps? (is|are) empty`),
    );
    expect(await summary.innerText()).not.toContain('Every step');
    expect(await page.locator('li.step.nothing-free').count()).toBe(mine.length);
    const rings = mine.filter((i) => i.missing.includes('rings')).length;
    expect(await summary.innerText()).toContain(`${rings} with no free ring set`);
    await screenshotAtWidths(page, 'counts-ladder');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });
});

describe('one receiving page', () => {
  it('when staff receive an ordered part on the one page, then its open line is offered first with the usual bin, and the order is all in', async () => {
    const page = env.page;
    await env.signInAs('buyer');
    // A ring set with a usual bin, ordered from a demo supplier and sent.
    const parts = await env.api<{ items: { id: string; sku: string; bin: string | null }[] }>(
      page,
      'GET',
      '/api/parts?kind=rings&pageSize=100',
    );
    const part = parts.items.find((p) => p.bin);
    expect(part).toBeDefined();
    const suppliers = await env.api<{ items: { id: string; email: string | null }[] }>(
      page,
      'GET',
      '/api/suppliers?pageSize=50',
    );
    const supplier = suppliers.items.find((s) => s.email);
    expect(supplier).toBeDefined();
    const order = await env.api<{ id: string; number: string }>(
      page,
      'POST',
      '/api/purchase-orders',
      {
        supplierId: supplier?.id,
        lines: [{ partId: part?.id, quantity: 3, unitPrice: '14.20' }],
      },
    );
    await env.api(page, 'POST', `/api/purchase-orders/${order.id}/send`, {});

    await env.signInAs('staff');
    // The old address leads to the one page.
    await page.goto(`${env.baseUrl}/purchasing/receiving`);
    await page.waitForURL(/\/stock\/receive$/);
    await page.getByRole('heading', { name: 'Receive a delivery' }).waitFor();
    const picker = page.getByRole('combobox', { name: 'Part received' });
    await picker.fill(part?.sku ?? '');
    await page.getByRole('option', { name: new RegExp(part?.sku ?? '') }).click();

    const line = page.getByRole('radio', { name: new RegExp(`${order.number} line 1`) });
    await line.waitFor();
    expect(await line.isChecked()).toBe(true);
    expect(await page.getByRole('spinbutton', { name: 'Quantity' }).inputValue()).toBe('3');
    // The part's usual bin is chosen already.
    expect(await page.getByRole('combobox', { name: 'Bin' }).innerText()).toContain(
      part?.bin ?? '',
    );
    expect(await page.getByText("Cost: the order's price").count()).toBe(1);
    await screenshotAtWidths(page, 'counts-receive-against-order');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Receive into stock' }).click();
    const moved = page.locator('.order-moved');
    await moved.waitFor();
    expect(await moved.innerText()).toMatch(
      new RegExp(`${order.number} line 1: 3 of 3 in\\. The order is now all in`),
    );
    await screenshotAtWidths(page, 'counts-receive-done');
    const stored = await env.api<{ state: string }>(
      page,
      'GET',
      `/api/purchase-orders/${order.id}`,
    );
    expect(stored.state).toBe('all_in');
    received = order;
  });
});

describe('the audit trail names records', () => {
  it('when the owner opens the trail of that order, then it reads by order number and SKU with links, not raw ids', async () => {
    expect(received).not.toBeNull();
    const page = env.page;
    await env.signInAs('owner');
    await page.goto(
      `${env.baseUrl}/admin/audit?entity=purchase_order&entityId=${received?.id ?? ''}`,
    );
    const link = page.locator('td a.ref', { hasText: received?.number ?? '' }).first();
    await link.waitFor();
    expect(await link.getAttribute('href')).toBe(`/purchasing/orders/${received?.id ?? ''}`);
    // The drafted order names its supplier by name, not by id.
    const table = await page.locator('table').innerText();
    expect(table).not.toContain(received?.id ?? 'no id');
    await screenshotAtWidths(page, 'counts-audit-trail');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });
});
