// Staff receives three measured pistons typing sizes in inches; the machinist, who reads
// millimetres, finds them on the family's step ladder with the sizes converted exactly
// (1 in = 25.4 mm, international yard and pound agreement of 1959, NIST SP 811 appendix B).
import { browserTestFile, screenshot, seriousA11yViolations } from './support';

// Each test walks several pages in a real browser.
const env = browserTestFile({ timeout: 120_000 });

// A demo piston at +0.020 in of the imperial single (standard bore 2.9375 in, so the step's bore
// is 2.9575 in): three pistons a few ten-thousandths apart, as they come from the maker.
const PART = 'MB-350-PC-020';
const SIZES = [
  { typed: '2.9553', mm: '75.065 mm' }, // 2.9553 × 25.4 = 75.06462 mm
  { typed: '2.9556', mm: '75.072 mm' }, // 2.9556 × 25.4 = 75.07224 mm
  { typed: '2.9558', mm: '75.077 mm' }, // 2.9558 × 25.4 = 75.07732 mm
];
let labels: string[] = [];

describe('receiving measured pistons and finding them on the step ladder', () => {
  it('when staff receives three pistons typing sizes in inches, then three labelled units are stored', async () => {
    const page = env.page;
    await env.signInAs('staff', '/stock/receive');

    // A keyboard-wedge scan: the code, then Enter, picks the single match.
    const picker = page.getByRole('combobox', { name: 'Part received' });
    await picker.fill(PART);
    await picker.press('Enter');
    await page.getByText(PART, { exact: true }).waitFor();

    await page.getByLabel('Quantity').fill('3');
    for (const [i, size] of SIZES.entries()) {
      await page.getByLabel(`Piston ${i + 1} skirt`).fill(size.typed);
    }
    // The other unit shows under each field before anything is saved.
    await page.getByText(`= ${SIZES[0].mm}`).waitFor();
    await page.getByLabel('Bin').click();
    await page.getByRole('option', { name: /^P-06/ }).click();
    await page.getByLabel('Unit cost').fill('41.00');
    await screenshot(page, 'stock-receive-filled');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.getByRole('button', { name: /receive into stock/i }).click();
    await page.getByRole('heading', { name: 'Received' }).waitFor();
    labels = await page.locator('.unit-list li strong').allInnerTexts();
    expect(labels).toHaveLength(3);
    for (const label of labels) expect(label).toMatch(/^PU-\d{6,}$/);
    await screenshot(page, 'stock-receive-done');

    await page.getByRole('link', { name: /print labels/i }).click();
    await page.getByRole('heading', { name: 'Piston labels' }).waitFor();
    await page.locator('app-barcode svg rect').first().waitFor();
    expect(await page.locator('article.label').count()).toBe(3);
    await screenshot(page, 'stock-labels-sheet');
  });

  it('when the machinist opens the family ladder in millimetres, then the three pistons show converted', async () => {
    expect(labels).toHaveLength(3);
    const page = env.page;
    await env.signInAs('machinist', '/catalog/families');
    await page.getByRole('link', { name: 'MB-350', exact: true }).click();
    await page.getByRole('heading', { name: '+0.020 in' }).waitFor();

    const step = page.locator('li.step', { has: page.getByRole('heading', { name: '+0.020 in' }) });
    // 2.9575 in × 25.4 = 75.1205 mm, shown at 0.001 mm.
    await step.getByText('75.121 mm').waitFor();
    for (const [i, label] of labels.entries()) {
      const chip = step.locator(`a.chip[aria-label*="${label}"]`);
      await chip.waitFor();
      expect((await chip.innerText()).trim()).toBe(SIZES[i].mm);
    }
    await screenshot(page, 'catalog-ladder-mm');
    expect(await seriousA11yViolations(page)).toEqual([]);

    // The same page in inches reads back the sizes exactly as they were typed.
    await page.getByRole('radio', { name: 'in' }).click();
    for (const [i, label] of labels.entries()) {
      // Waits for the page to redraw in inches rather than reading the old text.
      const chip = step.locator(`a.chip[aria-label*="${label}"]`, {
        hasText: `${SIZES[i].typed} in`,
      });
      await chip.waitFor();
      expect((await chip.innerText()).trim()).toBe(`${SIZES[i].typed} in`);
    }
    await screenshot(page, 'catalog-ladder-in');
  });

  it('when the catalog and stock pages open, then each shows its data without serious accessibility problems', async () => {
    const page = env.page;
    await env.signInAs('owner', '/catalog/families');
    await page.getByRole('link', { name: 'QV-54A', exact: true }).waitFor();
    await screenshot(page, 'catalog-families');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.goto(`${env.baseUrl}/catalog/parts`);
    await page.getByRole('link', { name: 'BT-72-BGK' }).waitFor();
    await screenshot(page, 'catalog-parts');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.goto(`${env.baseUrl}/stock/units?q=${labels[0]}`);
    await page.getByRole('cell', { name: labels[0], exact: true }).waitFor();
    await screenshot(page, 'stock-units');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.goto(`${env.baseUrl}/stock/exposure`);
    await page.getByRole('heading', { name: 'Empty steps' }).waitFor();
    await page.locator('td.mat-mdc-cell').first().waitFor();
    await screenshot(page, 'stock-exposure');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.goto(`${env.baseUrl}/stock/bins`);
    await page.getByRole('cell', { name: 'P-01', exact: true }).waitFor();
    await screenshot(page, 'stock-bins');

    await page.goto(`${env.baseUrl}/stock/ledger`);
    await page.getByRole('heading', { name: 'Stock movements' }).waitFor();
    await page.locator('td.mat-mdc-cell').first().waitFor();
    await screenshot(page, 'stock-ledger');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });
});
