// Labels for real printers, in the browser on the demo shop: the owner picks the label printer's roll
// in the settings, and a piston label, a bin label and a cylinder tag each print as a PDF of one
// label per page at the roll's size, with the barcode and the readable text inside the label.
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import {
  ARTIFACTS,
  DEMO,
  e2eEnvironment,
  failOnPageErrors,
  screenshot,
  signIn,
  queryDatabase,
} from './support';

failOnPageErrors();

jest.setTimeout(180_000);

let env: Awaited<ReturnType<typeof e2eEnvironment>>;

beforeAll(async () => {
  env = await e2eEnvironment();
});
afterAll(async () => {
  await env?.close();
});

const query = <T>(sql: string, params: unknown[] = []) =>
  queryDatabase<T>(env.databaseUrl, sql, params);

/** A write through the API the pages use, with the session's XSRF token like Angular sends it. */
async function write<T>(
  page: Page,
  method: 'patch' | 'post',
  url: string,
  data: object,
): Promise<T> {
  const cookies = await page.context().cookies();
  const token = cookies.find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await page.request[method](`${env.baseUrl}${url}`, {
    data,
    headers: { 'X-XSRF-TOKEN': token },
  });
  if (!res.ok()) throw new Error(`${method} ${url}: ${res.status()} ${await res.text()}`);
  return (await res.json()) as T;
}

const setLabelStock = (page: Page, labelStock: string) =>
  write(page, 'patch', '/api/settings', { labelStock });

let cylinder: { id: string; customerId: string; mark: string } | null = null;

/** A marked cylinder of the customer with the longest name, tagged with a long mark. */
async function markedCylinder(
  page: Page,
): Promise<{ id: string; customerId: string; mark: string }> {
  if (cylinder) return cylinder;
  const [customer] = await query<{ id: string }>(
    'SELECT id FROM customers ORDER BY length(name) DESC, id LIMIT 1',
  );
  const [family] = await query<{ id: string }>(
    'SELECT id FROM engine_families ORDER BY code LIMIT 1',
  );
  const mark = 'BLK-2207-RH-04';
  const made = await write<{ id: string }>(
    page,
    'post',
    `/api/customers/${customer.id}/cylinders`,
    {
      mark,
      familyId: family.id,
    },
  );
  cylinder = { id: made.id, customerId: customer.id, mark };
  return cylinder;
}

/** Every page box of a PDF as Chromium writes it: [width, height] in points. */
function pageBoxes(pdf: Buffer): Array<[number, number]> {
  const text = pdf.toString('latin1');
  return [...text.matchAll(/\/MediaBox\s*\[\s*0 0 ([\d.]+) ([\d.]+)\s*\]/g)].map((m) => [
    Number(m[1]),
    Number(m[2]),
  ]);
}

// 1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811 appendix B) and 1 in = 72 pt (the
// PDF default user space unit, ISO 32000-1 §8.3.2.3): 1 mm = 72 / 25.4 pt.
const mmToPt = (mm: number) => (mm * 72) / 25.4;
// Chromium lays a printed page out on a 300 dpi grid (steps of 72 / 300 = 0.24 pt), so a page box
// may differ from the exact size by part of a step or two: well under 0.5 pt (0.18 mm).
const PT_TOLERANCE = 0.5;
// CSS px are 1/96 in (CSS Values and Units Level 3, §5.2): 1 mm = 96 / 25.4 px.
const mmToPx = (mm: number) => (mm * 96) / 25.4;

interface Fit {
  width: number;
  height: number;
  outside: string[];
  cut: string[];
}

/**
 * The label's box in px, the elements that stick out of it and the texts cut short inside it.
 * `whole` names the texts that must show in full (codes, sizes); other texts may end in an ellipsis
 * by design but must stay inside the label too.
 */
async function labelFit(page: Page, label: string, whole: string[]): Promise<Fit> {
  return (await page.evaluate(`(() => {
    const root = document.querySelector(${JSON.stringify(label)});
    const box = root.getBoundingClientRect();
    const outside = [];
    for (const el of root.querySelectorAll('*')) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 && r.height === 0) continue;
      if (r.left < box.left - 0.5 || r.right > box.right + 0.5 || r.top < box.top - 0.5 || r.bottom > box.bottom + 0.5)
        outside.push((el.className && el.className.baseVal === undefined ? el.className : el.tagName) + ': ' + (el.textContent || '').trim());
    }
    const cut = [];
    for (const sel of ${JSON.stringify(whole)}) {
      for (const el of root.querySelectorAll(sel)) {
        if (el.scrollWidth > el.clientWidth + 1 || el.scrollHeight > el.clientHeight + 1)
          cut.push(sel + ': ' + el.textContent.trim());
      }
    }
    return { width: box.width, height: box.height, outside, cut };
  })()`)) as Fit;
}

const ROLLS = [
  { stock: 'roll-62x29', widthMm: 62, heightMm: 29 },
  { stock: 'roll-50x25', widthMm: 50, heightMm: 25 },
  { stock: 'roll-62x35', widthMm: 62, heightMm: 35 },
] as const;

describe('labels for a label printer', () => {
  it('when the owner chooses a label roll in the shop settings, then it is saved', async () => {
    const page = env.page;
    await signIn(page, env.baseUrl, DEMO.owner);
    await page.goto(`${env.baseUrl}/admin/settings`);
    await page.getByLabel('Labels print on').click();
    await page.getByRole('option', { name: 'Label printer roll, 50 × 25 mm' }).click();
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('Shop settings saved.').waitFor();
    const rows = await query<{ stock: string }>(
      `SELECT value->>'labelStock' AS stock FROM settings WHERE key = 'shop'`,
    );
    expect(rows).toEqual([{ stock: 'roll-50x25' }]);
  });

  it.each(ROLLS)(
    'when the shop prints on $stock, then a piston, a bin and a cylinder tag each print one label per page at that size',
    async ({ stock, widthMm, heightMm }) => {
      const page = env.page;
      await setLabelStock(page, stock);
      // The longest part number and bin name the demo shop has: the hardest labels to fit.
      const [unit] = await query<{ id: string; label: string }>(
        `SELECT u.id, u.label FROM piston_units u JOIN parts p ON p.id = u.part_id
          WHERE u.skirt_nm IS NOT NULL AND u.bin_id IS NOT NULL
          ORDER BY length(p.sku) DESC, u.label LIMIT 1`,
      );
      const [bin] = await query<{ id: string; code: string }>(
        'SELECT id, code FROM bins ORDER BY length(name) DESC, code LIMIT 1',
      );
      expect(unit && bin).toBeTruthy();
      const tag = await markedCylinder(page);

      const pages = [
        {
          name: 'piston',
          url: `/stock/labels?unit=${unit.id}`,
          ready: page.getByRole('article', { name: `Label ${unit.label}` }),
          label: 'article.label',
          whole: ['header span', '.size span', '.unit-label'],
        },
        {
          name: 'bin',
          url: `/stock/bins/labels?ids=${bin.id}`,
          ready: page.getByRole('article', { name: `Label for bin ${bin.code}` }),
          label: 'article.label',
          whole: ['.bin-code'],
        },
        {
          name: 'cylinder-tag',
          url: `/customers/${tag.customerId}/cylinders/${tag.id}`,
          ready: page.getByRole('img', { name: `Tag label for cylinder ${tag.mark}` }),
          label: '.tag',
          whole: ['.mark'],
        },
      ];
      for (const p of pages) {
        await page.goto(`${env.baseUrl}${p.url}`);
        await p.ready.waitFor();
        await page.locator(`${p.label} app-barcode svg rect`).first().waitFor();
        const fit = await labelFit(page, p.label, p.whole);
        // On screen the label is drawn at its printed size: 1 mm = 96 / 25.4 CSS px.
        expect(Math.abs(fit.width - mmToPx(widthMm))).toBeLessThan(1);
        expect(Math.abs(fit.height - mmToPx(heightMm))).toBeLessThan(1);
        expect(fit.outside).toEqual([]);
        expect(fit.cut).toEqual([]);
        await page.locator(p.label).screenshot({
          path: path.join(ARTIFACTS, 'screenshots', `labels-${p.name}-${stock}.png`),
        });

        const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
        mkdirSync(path.join(ARTIFACTS, 'pdf'), { recursive: true });
        writeFileSync(path.join(ARTIFACTS, 'pdf', `labels-${p.name}-${stock}.pdf`), pdf);
        const boxes = pageBoxes(pdf);
        // One label, one page, the roll's own size.
        expect(boxes).toHaveLength(1);
        const [w, h] = boxes[0];
        expect(Math.abs(w - mmToPt(widthMm))).toBeLessThan(PT_TOLERANCE);
        expect(Math.abs(h - mmToPt(heightMm))).toBeLessThan(PT_TOLERANCE);
      }
    },
  );

  it('when the shop prints on sheets, then the piston labels page still shows the A4 sticker sheet', async () => {
    const page = env.page;
    await setLabelStock(page, 'sheet');
    const [unit] = await query<{ id: string }>(
      'SELECT id FROM piston_units WHERE skirt_nm IS NOT NULL ORDER BY label LIMIT 1',
    );
    await page.goto(`${env.baseUrl}/stock/labels?unit=${unit.id}`);
    await page
      .locator('mat-button-toggle.mat-button-toggle-checked', { hasText: 'Sticker sheet' })
      .waitFor();
    await page.locator('.sheet:not(.single) article.label').waitFor();
    const fit = await labelFit(page, 'article.label', ['.unit-label']);
    expect(Math.abs(fit.width - mmToPx(62))).toBeLessThan(1);
    expect(Math.abs(fit.height - mmToPx(35))).toBeLessThan(1);
    await screenshot(page, 'labels-sheet');
  });
});
