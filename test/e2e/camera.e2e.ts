// Scanning labels with the camera, in the browser on the demo shop. The fake camera is Chromium's
// own (`--use-file-for-fake-video-capture`) playing a YUV4MPEG2 file this test writes from one of
// our printed labels: a piston's (found on the pistons page, held from the hold dialog), a bin's
// (found on the bins page) and a cylinder's tag (opens the cylinder from the customer search, as a
// keyboard-wedge scanner's mark and Enter does). Without a camera the scan says so and the typed
// field still works.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { labelLuma, writeY4m } from './fake-camera';
import {
  ARTIFACTS,
  DEMO,
  e2eEnvironment,
  failOnPageErrors,
  openBrowser,
  screenshot,
  signIn,
  type Browser,
  queryDatabase,
} from './support';

failOnPageErrors();

jest.setTimeout(180_000);

let env: Awaited<ReturnType<typeof e2eEnvironment>>;
let camera: Browser | null = null;
const Y4M = path.join(ARTIFACTS, 'camera', 'piston-label.y4m');
const BIN_Y4M = path.join(ARTIFACTS, 'camera', 'bin-label.y4m');
const TAG_Y4M = path.join(ARTIFACTS, 'camera', 'cylinder-tag.y4m');

/** Chromium whose camera plays `file`, a picture of a printed label. */
function cameraBrowser(file: string): Promise<Browser> {
  return openBrowser([
    '--use-fake-ui-for-media-stream',
    '--use-fake-device-for-media-stream',
    `--use-file-for-fake-video-capture=${file}`,
  ]);
}

/** The fake camera's picture, from the barcode of the label the page shows. */
async function cameraFile(page: Page, file: string, svg = 'article.label app-barcode svg') {
  await page.locator(`${svg} rect`).first().waitFor();
  mkdirSync(path.dirname(file), { recursive: true });
  writeY4m(file, await labelLuma(page, svg));
}

/** Opens the camera from the page's Scan button and waits until it has read a label. */
async function scanWithCamera(page: Page, shot: string): Promise<void> {
  await page.getByRole('button', { name: 'Scan with camera' }).click();
  const dialog = page.getByRole('dialog', { name: 'Scan a label with the camera' });
  await dialog.getByLabel('Camera picture').waitFor();
  await screenshot(page, shot);
  // The read closes the dialog, which stops the camera.
  await dialog.waitFor({ state: 'detached' });
  expect(await page.locator('video').count()).toBe(0);
}

beforeAll(async () => {
  env = await e2eEnvironment();
});
afterAll(async () => {
  await camera?.close().catch(() => undefined);
  await env?.close();
});

const query = <T>(sql: string, params: unknown[] = []) =>
  queryDatabase<T>(env.databaseUrl, sql, params);

/**
 * An open job's cylinder with a step chosen and not cut, with a free measured piston of the job's
 * family at that step: one with no piston held if the demo shop has one, else one whose held piston
 * the test lets go first (`held`).
 */
async function cylinderForPiston(): Promise<{ job_id: string; n: number; held: string | null }> {
  const rows = await query<{ job_id: string; n: number; held: string | null }>(
    `SELECT c.job_id, c.n,
            (SELECT u.label FROM holds h JOIN piston_units u ON u.id = h.unit_id
              WHERE h.job_id = c.job_id AND h.cylinder = c.n AND h.released_at IS NULL
              LIMIT 1) AS held
       FROM job_cylinders c JOIN jobs j ON j.id = c.job_id
      WHERE c.chosen_step_id IS NOT NULL AND c.cut_at IS NULL
        AND j.state NOT IN ('handed_back', 'called_off')
        AND EXISTS (SELECT 1 FROM piston_units u JOIN parts p ON p.id = u.part_id
                     WHERE p.family_id = j.family_id AND p.step_id = c.chosen_step_id
                       AND p.kind = 'piston' AND u.status = 'free' AND u.skirt_nm IS NOT NULL)
      ORDER BY 3 NULLS FIRST, j.created_at, c.n LIMIT 1`,
  );
  if (!rows[0]) throw new Error('the demo shop has no cylinder a free piston fits');
  return rows[0];
}

/** The search field on the pistons page, and the labels of the rows it shows. */
async function shownLabels(page: Page): Promise<string[]> {
  return page.locator('table tbody tr td.mat-column-label').allInnerTexts();
}

let target: { jobId: string; n: number; unitId: string; label: string } | null = null;

/**
 * On the pistons page, the camera cannot be used: the dialog says why (`why`) and to type the label,
 * and the field still finds a piston by its typed (or wedge-scanned) label and Enter.
 */
async function cameraRefused(page: Page, why: RegExp, shot: string): Promise<void> {
  const [unit] = await query<{ label: string }>(
    `SELECT label FROM piston_units WHERE status = 'free' ORDER BY label LIMIT 1`,
  );
  await page.goto(`${env.baseUrl}/stock/units`);
  await page.getByRole('button', { name: 'Scan with camera' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByRole('alert').getByText(why).waitFor();
  await dialog.getByText(/Type the label into the field instead/).waitFor();
  expect(await dialog.locator('video').count()).toBe(0);
  await screenshot(page, shot);
  await dialog.getByRole('button', { name: 'Close' }).click();
  await dialog.waitFor({ state: 'detached' });

  await page.getByLabel('Find a piston').fill(unit.label);
  await page.getByLabel('Find a piston').press('Enter');
  await page.getByRole('cell', { name: unit.label, exact: true }).waitFor();
}

describe('scanning a label with the camera', () => {
  it('when there is no camera, then the scan says so and the typed label still finds the piston', async () => {
    const page = env.page;
    await signIn(page, env.baseUrl, DEMO.machinist);
    // Chromium without a camera device answers NotFoundError.
    await cameraRefused(page, /No camera was found/, 'camera-none');
  });

  it('when a label is printed for a piston the cylinder can take, then the fake camera is made from it', async () => {
    const page = env.page;
    const cylinder = await cylinderForPiston();
    await page.goto(`${env.baseUrl}/jobs/${cylinder.job_id}/cylinders/${cylinder.n}`);
    if (cylinder.held) {
      await page.getByRole('button', { name: `Release ${cylinder.held}` }).click();
      await page.getByText(`${cylinder.held} is back on the shelf.`).waitFor();
    }
    await page.getByRole('button', { name: 'Set a piston aside' }).click();
    const dialog = page.getByRole('dialog');
    const hold = dialog.getByRole('button', { name: /^Hold PU-\d{6}/ });
    await hold.waitFor();
    const proposed = ((await hold.textContent()) ?? '').match(/PU-\d{6,}/)?.[0] ?? '';
    // Another free piston of the step that cleans up, so the scan visibly changes the choice.
    const others = await dialog.locator('ul li button').allInnerTexts();
    const other = others.find((t) => !/does not clean up/.test(t))?.match(/PU-\d{6,}/)?.[0];
    const label = other ?? proposed;
    expect(label).toMatch(/^PU-\d{6,}$/);
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await dialog.waitFor({ state: 'detached' });

    const [unit] = await query<{ id: string }>('SELECT id FROM piston_units WHERE label = $1', [
      label,
    ]);
    target = { jobId: cylinder.job_id, n: cylinder.n, unitId: unit.id, label };
    // The label exactly as the label page prints it.
    await page.goto(`${env.baseUrl}/stock/labels?unit=${unit.id}&layout=single`);
    await page.getByRole('article', { name: `Label ${label}` }).waitFor();
    await cameraFile(page, Y4M);
  });

  it('when the camera sees the label on the pistons page, then that piston is found', async () => {
    expect(target).not.toBeNull();
    const t = target as NonNullable<typeof target>;
    camera = await cameraBrowser(Y4M);
    const page = camera.page;
    await signIn(page, env.baseUrl, DEMO.machinist);
    await page.goto(`${env.baseUrl}/stock/units`);
    // The read searches for the label at once.
    await scanWithCamera(page, 'camera-scanning');
    expect(await page.getByLabel('Find a piston').inputValue()).toBe(t.label);
    await page.getByRole('cell', { name: t.label, exact: true }).waitFor();
    expect(await shownLabels(page)).toEqual([t.label]);
    await screenshot(page, 'camera-found-piston');
  });

  it('when the camera sees the label in the hold dialog, then that piston is held for the cylinder', async () => {
    const t = target as NonNullable<typeof target>;
    const page = (camera as Browser).page;
    await page.goto(`${env.baseUrl}/jobs/${t.jobId}/cylinders/${t.n}`);
    await page.getByRole('button', { name: 'Set a piston aside' }).click();
    const dialog = page.getByRole('dialog', { name: /Set a piston aside/ });
    await dialog.getByRole('button', { name: /^Hold PU-\d{6}/ }).waitFor();
    await scanWithCamera(page, 'camera-hold-scanning');
    // The scanned piston is checked like a typed one, then held through the server's hold.
    const hold = dialog.getByRole('button', { name: `Hold ${t.label}` });
    await hold.waitFor();
    await screenshot(page, 'camera-hold-picked');
    await hold.click();
    await dialog.waitFor({ state: 'detached' });
    await page.locator('.held-piston', { hasText: t.label }).waitFor();
    const units = await query<{ status: string }>('SELECT status FROM piston_units WHERE id = $1', [
      t.unitId,
    ]);
    expect(units).toEqual([{ status: 'held' }]);
    const holds = await query<{ job_id: string; cylinder: number }>(
      'SELECT job_id, cylinder FROM holds WHERE unit_id = $1 AND released_at IS NULL',
      [t.unitId],
    );
    expect(holds).toEqual([{ job_id: t.jobId, cylinder: t.n }]);
  });

  it('when the camera sees a printed bin label on the bins page, then that bin is found', async () => {
    // A bin whose code is in no other bin's code or name, so the search finds it alone.
    const [bin] = await query<{ id: string; code: string }>(
      `SELECT b.id, b.code FROM bins b
        WHERE NOT EXISTS (SELECT 1 FROM bins o WHERE o.id <> b.id
                            AND (strpos(lower(o.code), lower(b.code)) > 0
                                 OR strpos(lower(coalesce(o.name, '')), lower(b.code)) > 0))
        ORDER BY b.code DESC LIMIT 1`,
    );
    expect(bin).toBeDefined();
    const [{ count }] = await query<{ count: number }>('SELECT count(*)::int AS count FROM bins');
    expect(count).toBeGreaterThan(1);
    // Bins are the desk's (receiving stock): the label printed as staff print it.
    const desk = env.page;
    await signIn(desk, env.baseUrl, DEMO.staff);
    await desk.goto(`${env.baseUrl}/stock/bins/labels?ids=${bin.id}&layout=single`);
    await desk.getByRole('article', { name: `Label for bin ${bin.code}` }).waitFor();
    await cameraFile(desk, BIN_Y4M);

    // One fake camera per browser: the piston's goes first.
    await camera?.close();
    camera = await cameraBrowser(BIN_Y4M);
    const page = camera.page;
    await signIn(page, env.baseUrl, DEMO.staff);
    await page.goto(`${env.baseUrl}/stock/bins`);
    await page.locator('table tbody tr td.mat-column-code').nth(1).waitFor();
    await scanWithCamera(page, 'camera-scanning-bin');
    expect(await page.getByLabel('Find a bin').inputValue()).toBe(bin.code);
    // Only that bin is listed once the search has answered.
    await page.waitForFunction(`(() => {
      const cells = [...document.querySelectorAll('table tbody tr td.mat-column-code')];
      return cells.length === 1 && cells[0].textContent.trim() === ${JSON.stringify(bin.code)};
    })()`);
    await screenshot(page, 'camera-found-bin');
  });

  it("when the camera sees a cylinder's printed tag on the customer search, then that cylinder's page opens", async () => {
    // The demo shop marks none of its cylinders yet: the desk (signed in as staff) marks one of a
    // customer's, as intake does.
    const desk = env.page;
    const [job] = await query<{ customer_id: string; family_id: string }>(
      `SELECT customer_id, family_id FROM jobs ORDER BY number LIMIT 1`,
    );
    const xsrf = (await desk.context().cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value;
    const marked = await desk.request.post(
      `${env.baseUrl}/api/customers/${job.customer_id}/cylinders`,
      {
        data: { mark: 'TB-3107', familyId: job.family_id },
        headers: { 'X-XSRF-TOKEN': xsrf ?? '' },
      },
    );
    expect(marked.status()).toBe(201);
    const tag = { id: ((await marked.json()) as { id: string }).id, mark: 'TB-3107' };
    const cylinderPage = new RegExp(`/customers/${job.customer_id}/cylinders/${tag.id}$`);
    // The tag exactly as the cylinder's page prints it.
    await desk.goto(`${env.baseUrl}/customers/${job.customer_id}/cylinders/${tag.id}`);
    await desk.getByRole('img', { name: `Tag label for cylinder ${tag.mark}` }).waitFor();
    await cameraFile(desk, TAG_Y4M, 'app-cylinder-tag app-barcode svg');

    // A keyboard-wedge scanner types the mark and Enter into the same field.
    await desk.goto(`${env.baseUrl}/customers`);
    await desk.getByLabel('Find a customer').fill(tag.mark);
    await desk.getByLabel('Find a customer').press('Enter');
    await desk.waitForURL(cylinderPage);
    await desk.getByRole('heading', { level: 1, name: `Cylinder ${tag.mark}` }).waitFor();

    await camera?.close();
    camera = await cameraBrowser(TAG_Y4M);
    const page = camera.page;
    await signIn(page, env.baseUrl, DEMO.machinist);
    await page.goto(`${env.baseUrl}/customers`);
    await scanWithCamera(page, 'camera-scanning-tag');
    await page.waitForURL(cylinderPage);
    await page.getByRole('heading', { level: 1, name: `Cylinder ${tag.mark}` }).waitFor();
    await screenshot(page, 'camera-found-cylinder');
  });

  it('when the camera is there but permission to use it is refused, then the scan says so and the typed label still finds the piston', async () => {
    await camera?.close();
    // A camera, and no automatic yes: headless Chromium refuses the permission (NotAllowedError).
    camera = await openBrowser([
      '--use-fake-device-for-media-stream',
      `--use-file-for-fake-video-capture=${Y4M}`,
    ]);
    const page = camera.page;
    await signIn(page, env.baseUrl, DEMO.machinist);
    await cameraRefused(page, /permission was refused/, 'camera-refused');
  });
});
