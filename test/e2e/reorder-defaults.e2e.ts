// The buyer sets a family-wide reorder default from the reorder page.
import { browserTestFile, DEMO, screenshot, seriousA11yViolations, signIn } from './support';

const env = browserTestFile();

describe('reorder defaults', () => {
  it('when the buyer saves a default for every step of a family, then it is listed', async () => {
    const page = env.page;
    await signIn(page, env.baseUrl, DEMO.buyer);
    await page.goto(`${env.baseUrl}/purchasing/reorder`);
    await page.getByRole('link', { name: 'Defaults by family and step' }).click();
    await page.getByRole('heading', { name: 'Reorder defaults' }).waitFor();
    await page.getByRole('combobox', { name: 'Engine family' }).waitFor();
    await page.getByLabel('Reorder point').fill('2');
    await page.getByLabel('Order up to').fill('6');
    await page.getByRole('button', { name: 'Save the default' }).click();
    await page.getByText(/Default saved: pistons at every step reorder at 2/).waitFor();
    const row = page.getByRole('row', { name: /Every step\s+Pistons\s+2\s+6/ });
    await row.waitFor();
    await screenshot(page, 'purchasing-reorder-defaults');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });
});
