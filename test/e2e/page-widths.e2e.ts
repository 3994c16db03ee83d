// Every role's main pages at a desk's 1280 px and a tablet's 800 px: nothing is cut off at the
// right edge, no table column is clipped or pushed out of sight, no cell's text overflows its cell,
// no picker's chosen value is cut short, the bench keeps its stages in one row, and every
// icon-only button has a name. A screenshot of each page at both widths is kept.
import type { Page } from 'playwright-core';
import { browserTestFile, DEMO, type DemoRole, screenshotAtWidths, signIn } from './support';

const env = browserTestFile();

const EVERYONE = [
  '/',
  '/jobs',
  '/catalog/families',
  '/catalog/parts',
  '/stock/units',
  '/stock/exposure',
  '/stock/ledger',
  '/purchasing/orders',
  '/account',
];

/** The buying pages the owner and the buyer both have. */
const BUYING = [
  '/stock/receive',
  '/stock/bins',
  '/alerts',
  '/purchasing/reorder',
  '/purchasing/sourcing',
  '/suppliers',
  '/suppliers/unmapped',
  '/imports/new',
  '/imports',
  '/purchasing/rates',
];

/** Each role's pages: every entry of its navigation. */
const PAGES: Record<DemoRole, string[]> = {
  owner: [
    ...EVERYONE,
    '/jobs/new',
    ...BUYING,
    '/insights/sales',
    '/insights/money',
    '/insights/stock',
    '/insights/abc',
    '/insights/exposure',
    '/admin/users',
    '/admin/settings',
    '/admin/audit',
    '/alerts/mailbox',
  ],
  buyer: [
    ...EVERYONE,
    ...BUYING,
    '/insights/stock',
    '/insights/abc',
    '/insights/exposure',
  ],
  machinist: [...EVERYONE, '/jobs/new'],
  staff: [
    ...EVERYONE,
    '/jobs/new',
    '/stock/receive',
    '/stock/bins',
    '/suppliers',
    '/imports/new',
    '/imports',
  ],
};

interface Measured {
  problems: string[];
  /** The height of the content pane's whole page, and the stage columns' tops on the bench. */
  pageHeight: number;
  benchTops: number[];
}

/** Measures the page as it is laid out now; runs in the browser. */
function measure(page: Page): Promise<Measured> {
  return page.evaluate(() => {
    // Typed loosely: the test project has no DOM typings.
    type El = {
      tagName: string;
      className: unknown;
      textContent: string | null;
      parentElement: El | null;
      scrollWidth: number;
      clientWidth: number;
      scrollHeight: number;
      offsetParent: unknown;
      getAttribute(name: string): string | null;
      getBoundingClientRect(): { left: number; right: number; top: number; width: number };
      querySelectorAll(selector: string): ArrayLike<El>;
      querySelector(selector: string): El | null;
    };
    type Rect = { left: number; right: number; width: number };
    const g = globalThis as unknown as {
      document: {
        querySelector(selector: string): El | null;
        createRange(): { selectNodeContents(n: unknown): void; getBoundingClientRect(): Rect };
        createTreeWalker(root: El, show: number): { nextNode(): unknown };
      };
      getComputedStyle(el: El): Record<string, string>;
    };
    const problems: string[] = [];
    const pane = g.document.querySelector('mat-sidenav-content');
    const main = g.document.querySelector('main');
    if (!pane || !main) return { problems: ['no content pane'], pageHeight: 0, benchTops: [] };
    const edge = pane.getBoundingClientRect().right;
    const name = (el: El) =>
      `<${el.tagName.toLowerCase()} class="${String(el.className).slice(0, 60)}"> "${(el.textContent ?? '').trim().replace(/\s+/g, ' ').slice(0, 50)}"`;
    const visible = (el: El) => el.offsetParent !== null;
    const textNodes = (el: El): unknown[] => {
      const walker = g.document.createTreeWalker(el, 4 /* text nodes */);
      const found: unknown[] = [];
      for (let n = walker.nextNode(); n; n = walker.nextNode())
        if (
          (n as { textContent: string }).textContent.trim() &&
          // Words kept for screen readers only are clipped on purpose.
          !(n as { parentElement: { closest(s: string): unknown } }).parentElement.closest(
            '.visually-hidden, caption',
          )
        )
          found.push(n);
      return found;
    };
    const scroller = (el: El): El | null => {
      for (let p = el.parentElement; p && p !== pane; p = p.parentElement) {
        if (/(auto|scroll)/.test(g.getComputedStyle(p).overflowX)) return p;
      }
      return null;
    };

    if (pane.scrollWidth > pane.clientWidth + 1)
      problems.push(`the page is ${pane.scrollWidth - pane.clientWidth} px wider than its pane`);

    for (const table of Array.from(main.querySelectorAll('table'))) {
      if (!visible(table)) continue;
      const box = table.parentElement as El;
      // A table that needs sideways scrolling hides its right-hand columns: each must fit.
      if (
        table.getBoundingClientRect().width > box.clientWidth + 1 ||
        box.scrollWidth > box.clientWidth + 1
      )
        problems.push(
          `table ${name(table).slice(0, 80)} is ${Math.round(table.getBoundingClientRect().width - box.clientWidth)} px wider than its box${scroller(table) ? ' (its right-hand columns scroll out of sight)' : ''}`,
        );
      for (const cell of Array.from(table.querySelectorAll('th, td'))) {
        if (!visible(cell)) continue;
        if (cell.getBoundingClientRect().right > edge + 1 && !scroller(cell))
          problems.push(`cell ${name(cell)} runs past the right edge`);
        // Text that runs past its cell's edges is cut off (or spills over the next cell).
        const box = cell.getBoundingClientRect();
        for (const text of textNodes(cell)) {
          const range = g.document.createRange();
          range.selectNodeContents(text);
          const r = range.getBoundingClientRect();
          if (r.width > 0 && (r.right > box.right + 1 || r.left < box.left - 1)) {
            problems.push(`cell ${name(cell)} cuts its text off`);
            break;
          }
        }
      }
    }
    // A picker or field whose chosen value is cut short ("Hel…" for "Held").
    for (const value of Array.from(main.querySelectorAll('.mat-mdc-select-value'))) {
      if (visible(value) && value.scrollWidth > value.clientWidth + 1)
        problems.push(`picker value ${name(value)} is cut short`);
    }
    // Anything else sticking out past the right edge, outside a scrolling box.
    for (const el of Array.from(
      main.querySelectorAll('h1, h2, p, button, a, mat-form-field, section'),
    )) {
      if (visible(el) && el.getBoundingClientRect().right > edge + 1 && !scroller(el))
        problems.push(`${name(el)} runs past the right edge`);
    }
    // Every icon-only button or link says what it does to a screen reader.
    for (const button of Array.from(main.querySelectorAll('button, a'))) {
      if (!visible(button)) continue;
      let words = (button.textContent ?? '').trim();
      const icons = Array.from(button.querySelectorAll('mat-icon'));
      for (const icon of icons) words = words.replace((icon.textContent ?? '').trim(), '');
      const named = button.getAttribute('aria-label') || button.getAttribute('aria-labelledby');
      if (icons.length > 0 && words.trim() === '' && !named)
        problems.push(`icon-only ${name(button)} has no accessible name`);
    }
    const columns = Array.from(main.querySelectorAll('.columns > .column'));
    return {
      problems: [...new Set(problems)].slice(0, 12),
      pageHeight: pane.scrollHeight,
      benchTops: columns.map((c) => Math.round(c.getBoundingClientRect().top)),
    };
  });
}

async function settle(page: Page): Promise<void> {
  await page.waitForLoadState('networkidle');
  await page.locator('main h1').first().waitFor();
  // Let progress bars go and fonts settle before measuring.
  await page.waitForTimeout(300);
}

async function checkAtWidths(page: Page, shot: string): Promise<void> {
  // The pictures first, so a failing check has them to look at.
  await screenshotAtWidths(page, shot);
  for (const width of [1280, 800]) {
    await page.setViewportSize({ width, height: 860 });
    await page.waitForTimeout(250);
    const found = await measure(page);
    expect({ width, problems: found.problems }).toEqual({ width, problems: [] });
    if (found.benchTops.length > 0) {
      // The bench keeps its stages side by side, so a later stage never sits under the first.
      expect(new Set(found.benchTops).size).toBe(1);
      expect(found.pageHeight).toBeLessThan(1600);
    }
  }
}

async function firstJobId(page: Page, state: string): Promise<string | null> {
  return page.evaluate(async (s) => {
    const res = await fetch(`/api/jobs?state=${s}&pageSize=1`);
    const body = (await res.json()) as { items: { id: string }[] };
    return body.items[0]?.id ?? null;
  }, state);
}

describe.each(Object.keys(DEMO) as DemoRole[])('the %s’s pages', (role) => {
  beforeAll(async () => {
    await env.page.context().clearCookies();
    await env.page.setViewportSize({ width: 1280, height: 860 });
    await signIn(env.page, env.baseUrl, DEMO[role]);
  });

  it.each(PAGES[role])(
    `when %s is opened at 1280 and 800 px, then nothing is clipped`,
    async (path) => {
      const page = env.page;
      await page.setViewportSize({ width: 1280, height: 860 });
      await page.goto(`${env.baseUrl}${path}`);
      await settle(page);
      const slug = path === '/' ? 'home' : path.slice(1).replace(/\//g, '-');
      await checkAtWidths(page, `widths-${role}-${slug}`);
    },
  );
});

describe('pages a machinist opens from the bench', () => {
  beforeAll(async () => {
    await env.page.context().clearCookies();
    await env.page.setViewportSize({ width: 1280, height: 860 });
    await signIn(env.page, env.baseUrl, DEMO.machinist);
  });

  it('when a gauged job, its cylinder page and its steps are opened at 1280 and 800 px, then nothing is clipped and the verdicts stay short', async () => {
    const page = env.page;
    const id = await firstJobId(page, 'gauged');
    expect(id).not.toBeNull();
    await page.goto(`${env.baseUrl}/jobs/${id}`);
    await settle(page);
    await checkAtWidths(page, 'widths-machinist-job');

    await page.goto(`${env.baseUrl}/jobs/${id}/cylinders/1`);
    await settle(page);
    const steps = page.locator('table.steps');
    await steps.waitFor();
    await checkAtWidths(page, 'widths-machinist-cylinder');
    await page.setViewportSize({ width: 800, height: 860 });
    await page.waitForTimeout(250);
    // A verdict reads as a few words on a line or two, not a column one word wide.
    const heights = await steps
      .locator('tbody tr')
      .evaluateAll((rows) =>
        rows.map((r) => Math.round((r as unknown as { offsetHeight: number }).offsetHeight)),
      );
    expect(heights.length).toBeGreaterThan(0);
    expect(Math.max(...heights)).toBeLessThanOrEqual(110);
  });

  it('when a family ladder is opened at 1280 and 800 px, then nothing is clipped', async () => {
    const page = env.page;
    await page.goto(`${env.baseUrl}/catalog/families`);
    await settle(page);
    await page.locator('main a[href$="/ladder"]').first().click();
    await page.waitForURL(/\/ladder$/);
    await settle(page);
    await checkAtWidths(page, 'widths-machinist-ladder');
  });
});
