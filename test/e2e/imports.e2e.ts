// A buyer adds a supplier; staff bring in that supplier's semicolon price list (Windows-1252, decimal
// commas), check the detected format and the preview counts, apply it, and find the new prices on the
// supplier's items. A screenshot of every step goes to test/artifacts/screenshots.
import path from 'node:path';
import { browserTestFile, REPO, screenshot, seriousA11yViolations } from './support';

const env = browserTestFile({ timeout: 180_000 });

const SUPPLIER = 'Brannock Kolbenvertrieb';
const LIST = path.join(REPO, 'imports', 'morvendt-motorteile-2026-12.csv');

describe('bringing in a supplier price list', () => {
  it('when a buyer adds a supplier, then it is listed with its currency', async () => {
    const page = env.page;
    await env.signInAs('buyer', '/suppliers/new');
    await page.getByLabel('Name').fill(SUPPLIER);
    await page.getByLabel('Ordering e-mail').fill('bestellung@brannock.test');
    await page.getByLabel('Currency').fill('EUR');
    await page.getByLabel('Lead time (days)').fill('12');
    await screenshot(page, 'imports-1-supplier-form');
    await page.getByRole('button', { name: 'Add supplier' }).click();
    await page.getByRole('heading', { name: SUPPLIER }).waitFor();
    await page.getByText('No items here yet').waitFor();
    await screenshot(page, 'imports-2-supplier-added');
  });

  it('when staff upload the semicolon list, then the detected format and counts show, and applying it shows the new prices', async () => {
    const page = env.page;
    await env.signInAs('staff', '/imports/new');
    await page.getByRole('heading', { name: 'Bring in a price list' }).waitFor();

    // The list of suppliers arrives after the page: a select with no options yet does not open.
    const option = page.getByRole('option', { name: new RegExp(SUPPLIER) });
    for (let tries = 0; tries < 10 && !(await option.isVisible()); tries++) {
      await page.getByRole('combobox', { name: 'Supplier' }).click();
      await option.waitFor({ timeout: 1500 }).catch(() => undefined);
    }
    await option.click();
    await page.locator('input[type=file]').setInputFiles(LIST);
    await page.getByText('morvendt-motorteile-2026-12.csv').waitFor();
    await screenshot(page, 'imports-3-file-chosen');

    await page.getByRole('button', { name: 'Read the list' }).click();
    const format = page.getByTestId('detected-format');
    await format.waitFor();
    await format.getByText('Windows-1252 (Western European)').waitFor();
    await format.getByText('semicolon (;)').waitFor();
    await format.getByText('decimal comma (2,555)').waitFor();
    const counts = page.getByTestId('import-counts');
    await expectTile(counts, 'rows read', '31');
    await expectTile(counts, 'new items', '31');
    await expectTile(counts, 'rows with errors', '0');
    // The sample shows the accented description decoded from the Windows-1252 bytes.
    await page
      .getByTestId('import-sample')
      .getByText('Kolben Ø 54,00 mm – Standard, Rautiefe Rz 2 µm')
      .waitFor();
    await screenshot(page, 'imports-4-preview');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Apply 31 rows' }).click();
    await page.getByText(/Applied: 31 new items/).waitFor();
    await screenshot(page, 'imports-5-applied');

    await page.getByRole('link', { name: 'See their items' }).click();
    await page.getByRole('heading', { name: SUPPLIER }).waitFor();
    await page.getByLabel('Find an item').fill('MV-Z72-SET');
    const row = page.getByRole('row', { name: /MV-Z72-SET/ });
    await row.waitFor();
    // 1.234,50 in the list is one thousand two hundred thirty-four euros fifty.
    await row.getByText('1,234.50 EUR').waitFor();
    await screenshot(page, 'imports-6-new-prices');
    expect(await seriousA11yViolations(page)).toEqual([]);

    await row.getByRole('button', { name: 'Prices' }).click();
    await page.getByRole('dialog').getByText('first price').waitFor();
    await screenshot(page, 'imports-7-price-history');
  });
});

async function expectTile(
  counts: ReturnType<typeof env.page.getByTestId>,
  label: string,
  value: string,
): Promise<void> {
  const tile = counts.locator('li', { hasText: label });
  await tile.waitFor();
  expect((await tile.locator('.n').innerText()).trim()).toBe(value);
}
