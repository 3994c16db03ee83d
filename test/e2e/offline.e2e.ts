// The bench when the workshop network drops: the production build's service worker and manifest,
// the home page, the bench, a job, a cylinder and its bore sheet opening from the worker's cache
// with the network cut (context.setOffline), marked as copies, and no money document kept; what
// is typed offline (readings, the bore after honing, passes ticked done) waiting on the tablet,
// sent when the network is back, and refused with both values when the desk changed it meanwhile;
// the hold and the cut saying they need the connection; nothing of the machinist's left after
// sign-out.
import pg from 'pg';
import { request, type Locator, type Page } from 'playwright-core';
import {
  DEMO,
  DEMO_PASSWORD,
  allowPageErrors,
  e2eEnvironment,
  failOnPageErrors,
  screenshot,
  signIn,
} from './support';

// Playwright cuts the network of pages only; with this it cuts the service worker's too, which
// is where a real dropped Wi-Fi bites. Read when the worker is attached, so set before launch.
process.env.PW_EXPERIMENTAL_SERVICE_WORKER_NETWORK_EVENTS = '1';

failOnPageErrors();
jest.setTimeout(180_000);

type CylinderRow = { job_id: string; n: number; number: string };

let env: Awaited<ReturnType<typeof e2eEnvironment>>;
let ready: CylinderRow;
/** A cylinder already cut, its job open, with nothing recorded after honing yet. */
let honing: CylinderRow;
/** A cylinder with its step chosen and no piston held yet. */
let unheld: CylinderRow;
/** A cylinder of two passes or more, found by the first pass test. */
let passes: CylinderRow;

async function query<T>(sql: string, params: unknown[] = []): Promise<T[]> {
  const client = new pg.Client({ connectionString: env.databaseUrl });
  await client.connect();
  try {
    return (await client.query(sql, params)).rows as T[];
  } finally {
    await client.end();
  }
}

/** The owner changes shop settings through the API, in a session of their own. */
async function ownerSettings(patch: Record<string, string>): Promise<void> {
  const owner = await request.newContext({ baseURL: env.baseUrl });
  const xsrf = async () =>
    (await owner.storageState()).cookies.find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  try {
    await owner.get('/api/session');
    const signIn = await owner.post('/api/session', {
      data: { email: DEMO.owner, password: DEMO_PASSWORD },
      headers: { 'X-XSRF-TOKEN': await xsrf() },
    });
    if (!signIn.ok()) throw new Error(`the owner's sign-in answered ${signIn.status()}`);
    const saved = await owner.patch('/api/settings', {
      data: patch,
      headers: { 'X-XSRF-TOKEN': await xsrf() },
    });
    if (!saved.ok()) throw new Error(`settings answered ${saved.status()}: ${await saved.text()}`);
  } finally {
    await owner.dispose();
  }
}

beforeAll(async () => {
  env = await e2eEnvironment();
  // A light finishing pass after the cut, so a bore sheet plans two passes: a tick made against
  // one count can then meet a third one stored meanwhile.
  await ownerSettings({ finishPass: '0.002 in' });
  // An open job whose cylinder has its readings and a measured piston held: its bore sheet opens.
  [ready] = await query<CylinderRow>(
    `SELECT c.job_id, c.n, j.number FROM job_cylinders c
       JOIN jobs j ON j.id = c.job_id
       JOIN holds h ON h.job_id = c.job_id AND h.cylinder = c.n
                   AND h.unit_id IS NOT NULL AND h.released_at IS NULL
      WHERE c.cut_at IS NULL AND c.largest_nm IS NOT NULL AND j.state = 'parts_set_aside'
      ORDER BY j.number LIMIT 1`,
  );
  [honing] = await query<CylinderRow>(
    `SELECT c.job_id, c.n, j.number FROM job_cylinders c JOIN jobs j ON j.id = c.job_id
      WHERE c.cut_at IS NOT NULL AND c.measured_after_hone_nm IS NULL AND c.ring_gap_nm IS NULL
        AND j.state NOT IN ('handed_back', 'called_off')
      ORDER BY j.number, c.n LIMIT 1`,
  );
  [unheld] = await query<CylinderRow>(
    `SELECT c.job_id, c.n, j.number FROM job_cylinders c JOIN jobs j ON j.id = c.job_id
      WHERE c.chosen_step_id IS NOT NULL AND c.cut_at IS NULL
        AND j.state NOT IN ('handed_back', 'called_off')
        AND NOT EXISTS (SELECT 1 FROM holds h WHERE h.job_id = c.job_id AND h.cylinder = c.n
                          AND h.unit_id IS NOT NULL AND h.released_at IS NULL)
      ORDER BY j.number, c.n LIMIT 1`,
  );
  if (!ready || !honing || !unheld) {
    throw new Error('the demo shop lacks a held, a cut or an unheld cylinder of an open job');
  }
});
afterAll(async () => {
  await env?.close();
});

// Run in the page; typed loosely because the test project has no DOM typings.
interface PageGlobals {
  navigator: { serviceWorker: { controller: unknown } };
  caches: {
    keys(): Promise<string[]>;
    open(name: string): Promise<{ keys(): Promise<{ url: string }[]> }>;
  };
  fetch(url: string): Promise<{ status: number; json(): Promise<unknown> }>;
}

/** The service worker controls the page and has stored every file of the app shell. */
async function workerReady(page: Page): Promise<void> {
  await page.waitForFunction(
    () => (globalThis as unknown as PageGlobals).navigator.serviceWorker.controller !== null,
    null,
    { timeout: 60_000 },
  );
  await page.waitForFunction(
    async () => {
      const g = globalThis as unknown as PageGlobals;
      const manifest = (await (await g.fetch('/ngsw.json?probe')).json()) as {
        assetGroups: { name: string; urls: string[] }[];
      };
      const names = await g.caches.keys();
      for (const group of manifest.assetGroups) {
        const name = names.find((n) => n.endsWith(`:assets:${group.name}:cache`));
        if (!name) return false;
        const stored = await (await g.caches.open(name)).keys();
        if (stored.length < group.urls.length) return false;
      }
      return true;
    },
    null,
    { timeout: 60_000, polling: 500 },
  );
}

/** The address of every API answer the worker's data group holds. */
function cachedUrls(page: Page): Promise<string[]> {
  return page.evaluate(async () => {
    const g = globalThis as unknown as PageGlobals;
    const urls: string[] = [];
    for (const name of await g.caches.keys()) {
      // The data group's answers; its bookkeeping tables (`…:lru`, `…:age`) are left out.
      if (!name.includes(':data:') || !name.endsWith(':cache')) continue;
      for (const request of await (await g.caches.open(name)).keys()) urls.push(request.url);
    }
    return urls;
  });
}

async function cachedAnswers(page: Page): Promise<number> {
  return (await cachedUrls(page)).length;
}

/**
 * What the bench opens offline, and nothing else: the home page's open jobs, the job bench, a job,
 * a cylinder's step choice and bore sheet, the customer's cylinders (DEVELOPERS.md "Offline at the
 * bench"). Written out here as paths, apart from the worker's patterns.
 */
const BENCH_ANSWERS = [
  /^\/api\/home$/,
  /^\/api\/jobs(\?.*)?$/,
  /^\/api\/jobs\/[^/?]+$/,
  /^\/api\/jobs\/[^/?]+\/cylinders\/\d+\/(recommendation|bore-sheet)$/,
  /^\/api\/customers\/[^/?]+\/cylinders$/,
  /^\/api\/cylinders\/[^/?]+$/,
];

async function until(check: () => Promise<boolean>, what: string, ms = 10_000): Promise<void> {
  const deadline = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`Still not true after ${ms} ms: ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}

const OFFLINE_MARK = /Offline — shown as of (\d{2}\/\d{2}\/\d{4} )?\d{2}:\d{2}/;

async function offlineMark(page: Page): Promise<string> {
  const note = page.getByRole('status').filter({ hasText: 'Offline' });
  await note.waitFor();
  return (await note.textContent())?.trim() ?? '';
}

/** Both tablet orientations, as the machinist holds it in its stand. */
async function tabletShots(page: Page, name: string, show?: Locator): Promise<void> {
  const before = page.viewportSize();
  for (const [w, h] of [
    [800, 1280],
    [1280, 800],
  ]) {
    await page.setViewportSize({ width: w, height: h });
    // Long enough for the side navigation to finish closing when the width drops below its break.
    await page.waitForTimeout(600);
    await show?.scrollIntoViewIfNeeded();
    await screenshot(page, `${name}-${w}x${h}`);
  }
  if (before) await page.setViewportSize(before);
}

/** Types the top reading along the pin on the cylinder page shown and saves the readings. */
async function typeTopPin(page: Page, value: string): Promise<void> {
  const cell = page.getByLabel('Top of ring travel, along the pin', { exact: true });
  await cell.waitFor();
  await cell.fill(value);
  await page.getByRole('button', { name: 'Save readings' }).click();
}

async function topPinNm(): Promise<number> {
  const [row] = await query<{ diameter_nm: string | number }>(
    `SELECT diameter_nm FROM bore_readings WHERE job_id = $1 AND n = $2 AND depth = 'top' AND axis = 'pin'`,
    [ready.job_id, ready.n],
  );
  return Number(row.diameter_nm);
}

/**
 * Another client (the desk, still online while the tablet is not) changes a cylinder through the
 * API; Playwright's request context is not cut by setOffline.
 */
async function asTheDesk(method: 'put' | 'patch', path: string, data: object): Promise<void> {
  const token =
    (await env.browser.context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await env.page.request[method](`${env.baseUrl}${path}`, {
    data,
    headers: { 'X-XSRF-TOKEN': token },
  });
  expect([path, res.status()]).toEqual([path, 200]);
}

/** Another session (the desk) corrects the top reading along the pin, keeping the other five. */
async function changeTopPinThroughApi(value: string): Promise<void> {
  const api = env.page.request;
  const job = (await (await api.get(`${env.baseUrl}/api/jobs/${ready.job_id}`)).json()) as {
    cylinderDetails: {
      n: number;
      readings: {
        depth: string;
        axis: string;
        diameter: { mm: string; in: string };
        unit: string;
      }[];
    }[];
  };
  const readings = job.cylinderDetails
    .find((c) => c.n === ready.n)!
    .readings.map((r) => ({
      depth: r.depth,
      axis: r.axis,
      diameter:
        r.depth === 'top' && r.axis === 'pin'
          ? value
          : r.unit === 'in'
            ? `${r.diameter.in} in`
            : `${r.diameter.mm} mm`,
    }));
  await asTheDesk('put', `/api/jobs/${ready.job_id}/cylinders/${ready.n}/readings`, { readings });
}

/**
 * A cylinder whose bore sheet plans two passes or more (ticks on it can disagree three ways), from
 * the held, uncut cylinders of open jobs, as the server plans them now.
 */
async function cylinderWithPasses(): Promise<CylinderRow> {
  const held = await query<CylinderRow>(
    `SELECT c.job_id, c.n, j.number FROM job_cylinders c JOIN jobs j ON j.id = c.job_id
      WHERE c.cut_at IS NULL AND j.state NOT IN ('handed_back', 'called_off')
        AND EXISTS (SELECT 1 FROM holds h WHERE h.job_id = c.job_id AND h.cylinder = c.n
                      AND h.unit_id IS NOT NULL AND h.released_at IS NULL)
      ORDER BY j.number, c.n`,
  );
  for (const c of held) {
    const res = await env.page.request.get(
      `${env.baseUrl}/api/jobs/${c.job_id}/cylinders/${c.n}/bore-sheet`,
    );
    const sheet = (await res.json()) as { passes?: unknown[] };
    if ((sheet.passes?.length ?? 0) >= 2) return c;
  }
  throw new Error('no held cylinder of the demo shop has a bore sheet of two passes or more');
}

/** The cylinder's row as the server stored it: passes done and the sizes after honing. */
async function storedCylinder(c: CylinderRow) {
  const [row] = await query<{ passes_done: number; measured_after_hone_nm: number | null }>(
    `SELECT passes_done, measured_after_hone_nm FROM job_cylinders WHERE job_id = $1 AND n = $2`,
    [c.job_id, c.n],
  );
  return row;
}

/**
 * A honed size near the bore sheet's aim, on the micrometre, as typed ("55.882 mm") and in nm
 * (1 mm = 1 000 000 nm by definition).
 */
async function nearTheAim(
  c: CylinderRow,
  micrometres: number,
): Promise<{ text: string; nm: number }> {
  const res = await env.page.request.get(
    `${env.baseUrl}/api/jobs/${c.job_id}/cylinders/${c.n}/bore-sheet`,
  );
  const sheet = (await res.json()) as { finishedBore: { mm: string } };
  const [whole, fraction = ''] = sheet.finishedBore.mm.split('.');
  const um = Number(whole) * 1000 + Number(fraction.padEnd(3, '0').slice(0, 3)) + micrometres;
  return {
    text: `${Math.floor(um / 1000)}.${String(um % 1000).padStart(3, '0')} mm`,
    nm: um * 1000,
  };
}

const NO_COPY = 'with the network cut, answers the worker has no copy of are 504';
const LATE_WORKER =
  "Playwright gives the page its network back a moment before the service worker's; a send " +
  'tried in that moment fails and is tried again';

/** With the network cut (pages and worker) for the length of `work`, then back. */
async function offline(work: () => Promise<void>): Promise<void> {
  allowPageErrors(/status of 504/, NO_COPY);
  await env.browser.context.setOffline(true);
  try {
    await work();
  } finally {
    await env.browser.context.setOffline(false);
  }
}

describe('installable: the production build serves a service worker and a manifest', () => {
  it('when /ngsw.json, the worker and /manifest.webmanifest are asked for, then they come with the right types and are not kept for long', async () => {
    const ngsw = await fetch(`${env.baseUrl}/ngsw.json`);
    expect(ngsw.status).toBe(200);
    expect(ngsw.headers.get('content-type')).toMatch(/^application\/json/);
    // A browser must ask again each time, or a tablet keeps last week's app.
    expect(ngsw.headers.get('cache-control')).toBe('no-cache');
    const config = (await ngsw.json()) as { dataGroups: { name: string; strategy: string }[] };
    expect(config.dataGroups.map((g) => [g.name, g.strategy])).toEqual([['bench', 'freshness']]);

    const worker = await fetch(`${env.baseUrl}/ngsw-worker.js`);
    expect(worker.status).toBe(200);
    expect(worker.headers.get('content-type')).toMatch(/javascript/);
    expect(worker.headers.get('cache-control')).toBe('no-cache');

    // The media type the W3C Web App Manifest specification registers.
    const manifest = await fetch(`${env.baseUrl}/manifest.webmanifest`);
    expect(manifest.status).toBe(200);
    expect(manifest.headers.get('content-type')).toMatch(/^application\/manifest\+json/);
    const body = (await manifest.json()) as {
      name: string;
      display: string;
      icons: { src: string; sizes: string }[];
    };
    expect(body.name).toBe('Stepstock');
    expect(body.display).toBe('standalone');
    for (const icon of body.icons) {
      const res = await fetch(`${env.baseUrl}/${icon.src}`);
      expect([icon.src, res.status]).toEqual([icon.src, 200]);
    }
    expect(body.icons.map((i) => i.sizes)).toEqual(expect.arrayContaining(['192x192', '512x512']));

    const index = await (await fetch(`${env.baseUrl}/jobs`)).text();
    expect(index).toMatch(/<link rel="manifest" href="manifest\.webmanifest"/);
  });
});

describe('opens offline', () => {
  it('when the machinist has opened the home page, the bench, a job, a cylinder and its bore sheet once, then only their answers are kept and with the network cut each opens again, marked as a copy', async () => {
    const page = env.page;
    await signIn(page, env.baseUrl, DEMO.machinist);
    await page.goto(`${env.baseUrl}/jobs`);
    await workerReady(page);

    // Visited again under the worker, so its data group keeps each page's answers.
    const pages = [
      { url: '/', sees: page.locator('.today section.panel').first(), name: 'home' },
      { url: '/jobs', sees: page.locator('a.job-card').first(), name: 'bench' },
      {
        url: `/jobs/${ready.job_id}`,
        sees: page.getByRole('heading', { level: 1, name: `Job ${ready.number}` }),
        name: 'job',
      },
      {
        url: `/jobs/${ready.job_id}/cylinders/${ready.n}`,
        sees: page.getByRole('heading', {
          level: 1,
          name: `Cylinder ${ready.n} of ${ready.number}`,
        }),
        name: 'cylinder',
      },
      {
        url: `/jobs/${ready.job_id}/cylinders/${ready.n}/sheet`,
        sees: page.getByRole('heading', {
          level: 1,
          name: `Bore sheet · ${ready.number} · cylinder ${ready.n}`,
        }),
        name: 'bore-sheet',
      },
    ];
    for (const p of pages) {
      await page.goto(`${env.baseUrl}${p.url}`);
      await p.sees.waitFor();
      // The job page reads its estimate too: shown from the server, and never kept.
      if (p.name === 'job') await page.locator('section.estimate .badge').waitFor();
      expect(await page.getByText(OFFLINE_MARK).count()).toBe(0);
    }
    await page.waitForLoadState('networkidle');
    const kept = (await cachedUrls(page)).map((u) => {
      const url = new URL(u);
      return url.pathname + url.search;
    });
    expect(kept).toEqual(
      expect.arrayContaining([
        `/api/jobs/${ready.job_id}`,
        `/api/jobs/${ready.job_id}/cylinders/${ready.n}/bore-sheet`,
      ]),
    );
    expect(kept.filter((u) => !BENCH_ANSWERS.some((pattern) => pattern.test(u)))).toEqual([]);

    // The worker answers what it can; what it cannot reach it answers 504, which Chromium logs.
    await offline(async () => {
      for (const p of pages) {
        await page.goto(`${env.baseUrl}${p.url}`);
        await p.sees.waitFor();
        expect(await offlineMark(page)).toMatch(OFFLINE_MARK);
        // The home page's lists came from the copy, not "could not be loaded".
        expect(await page.locator('.load-error').count()).toBe(0);
        await tabletShots(page, `offline-${p.name}`);
      }
    });

    // Back online, a fresh page is live again and says nothing.
    await page.goto(`${env.baseUrl}/jobs`);
    await page.locator('a.job-card').first().waitFor();
    await page.waitForTimeout(500);
    expect(await page.getByText(OFFLINE_MARK).count()).toBe(0);
  });

  it('when a reading is typed offline, then it waits on the tablet, is sent when the network is back, and the server holds it', async () => {
    const page = env.page;
    const cylinderUrl = `${env.baseUrl}/jobs/${ready.job_id}/cylinders/${ready.n}`;
    await offline(async () => {
      await page.goto(cylinderUrl);
      await typeTopPin(page, '2.9535 in');
      const waiting = page.getByText(/Bore readings for cylinder \d+ of .+: waiting to send/);
      await waiting.waitFor();
      await tabletShots(page, 'offline-reading-waiting', waiting);
      // Offline, the cut says it needs the server instead of failing.
      await page.goto(`${cylinderUrl}/sheet`);
      await page.getByText(/Marking the cut or taking it back needs the connection/).waitFor();
      expect(
        await page
          .getByRole('button', { name: new RegExp(`Mark cylinder ${ready.n} as cut`) })
          .isDisabled(),
      ).toBe(true);
      await page.goto(cylinderUrl);
      await page.getByText(/waiting to send/).waitFor();
    });
    allowPageErrors(/net::ERR_FAILED/, LATE_WORKER, /\/readings$/);
    // Back online: sent by itself, and the page reads the cylinder again.
    await page.getByText(/waiting to send/).waitFor({ state: 'detached', timeout: 30_000 });
    // 2.9535 in = 29 535 × 2540 nm (0.0001 in = 2540 nm exactly).
    expect(await topPinNm()).toBe(29_535 * 2540);
  });

  it('when a reading typed offline was changed meanwhile by another session, then the conflict shows both values and "Keep mine" stores it', async () => {
    const page = env.page;
    allowPageErrors(
      /status of 409/,
      'the stale reading is refused on purpose; the page shows the conflict',
    );
    await offline(async () => {
      await page.goto(`${env.baseUrl}/jobs/${ready.job_id}/cylinders/${ready.n}`);
      await typeTopPin(page, '2.9545 in');
      await page.getByText(/waiting to send/).waitFor();
      // Meanwhile, at the desk (another session, online), the same reading is corrected.
      await changeTopPinThroughApi('2.9540 in');
    });
    allowPageErrors(/net::ERR_FAILED/, LATE_WORKER, /\/readings$/);
    const conflict = page.getByRole('alert').filter({ hasText: 'not saved' });
    await conflict.waitFor({ timeout: 30_000 });
    const text = (await conflict.textContent()) ?? '';
    expect(text).toContain('Top of ring travel, along the pin: 2.9545 in');
    expect(text).toContain('On the server now');
    expect(text).toContain('Top of ring travel, along the pin: 2.9540 in');
    // Nothing was overwritten: the server still holds the desk's value.
    expect(await topPinNm()).toBe(29_540 * 2540);
    await tabletShots(page, 'offline-reading-conflict', conflict);

    // Kept, it waits again briefly, now based on the desk's version, and is sent over it.
    await conflict.getByRole('button', { name: 'Keep mine' }).click();
    await conflict.waitFor({ state: 'detached', timeout: 30_000 });
    await until(async () => (await topPinNm()) === 29_545 * 2540, 'mine is stored', 30_000);
    await page.getByText(/waiting to send/).waitFor({ state: 'detached', timeout: 30_000 });
  });

  it('when the cylinder has no piston held yet, then offline the hold says it needs the connection and cannot be started', async () => {
    const page = env.page;
    const url = `${env.baseUrl}/jobs/${unheld.job_id}/cylinders/${unheld.n}`;
    const hold = page.getByRole('button', { name: 'Set a piston aside' });
    await page.goto(url);
    await hold.waitFor();
    expect(await hold.isEnabled()).toBe(true);
    await offline(async () => {
      await page.goto(url);
      // The band says so once the page shows the kept copy.
      await page.getByText(OFFLINE_MARK).waitFor();
      await page
        .getByRole('status')
        .filter({ hasText: 'Holding a piston needs the connection' })
        .waitFor();
      expect(await hold.isDisabled()).toBe(true);
    });
  });

  it('when the bore after honing is typed offline, then it waits on the tablet, is sent when the network is back, and the server holds it', async () => {
    const page = env.page;
    const sheetUrl = `${env.baseUrl}/jobs/${honing.job_id}/cylinders/${honing.n}/sheet`;
    const honed = page.getByLabel('Bore after honing', { exact: true });
    // Opened once online, so the worker keeps this sheet.
    await page.goto(sheetUrl);
    await honed.waitFor();
    const mine = await nearTheAim(honing, 2);
    await offline(async () => {
      await page.goto(sheetUrl);
      // The band says so once the page shows the kept copy.
      await page.getByText(OFFLINE_MARK).waitFor();
      await honed.fill(mine.text);
      await page.getByRole('button', { name: 'Record', exact: true }).click();
      const waiting = page.getByText(/Sizes after honing for cylinder \d+ of .+: waiting to send/);
      await waiting.waitFor();
      await tabletShots(page, 'offline-honed-waiting', waiting);
      expect((await storedCylinder(honing)).measured_after_hone_nm).toBeNull();
    });
    allowPageErrors(/net::ERR_FAILED/, LATE_WORKER, /\/cylinders\/\d+$/);
    await page.getByText(/waiting to send/).waitFor({ state: 'detached', timeout: 30_000 });
    expect(Number((await storedCylinder(honing)).measured_after_hone_nm)).toBe(mine.nm);
    // The sheet reads itself again: the blank for the honed bore now holds the size.
    await page.locator('.checks dd strong').first().waitFor();
  });

  it('when a bore after honing typed offline was changed meanwhile at the desk, then the conflict shows both values and "Use theirs" keeps the desk\'s', async () => {
    const page = env.page;
    const sheetUrl = `${env.baseUrl}/jobs/${honing.job_id}/cylinders/${honing.n}/sheet`;
    const honed = page.getByLabel('Bore after honing', { exact: true });
    // Online first, so the kept copy shows the size stored by the last test: the entry's basis.
    await page.goto(sheetUrl);
    await honed.waitFor();
    const mine = await nearTheAim(honing, 3);
    const theirs = await nearTheAim(honing, 4);
    allowPageErrors(/status of 409/, 'the stale size is refused on purpose; the page shows both');
    await offline(async () => {
      await page.goto(sheetUrl);
      await honed.fill(mine.text);
      await page.getByRole('button', { name: 'Record', exact: true }).click();
      await page.getByText(/waiting to send/).waitFor();
      await asTheDesk('patch', `/api/jobs/${honing.job_id}/cylinders/${honing.n}`, {
        measuredAfterHone: theirs.text,
      });
    });
    allowPageErrors(/net::ERR_FAILED/, LATE_WORKER, /\/cylinders\/\d+$/);
    const conflict = page.getByRole('alert').filter({ hasText: 'Sizes after honing' });
    await conflict.waitFor({ timeout: 30_000 });
    const text = (await conflict.textContent()) ?? '';
    expect(text).toContain('not saved');
    expect(text).toContain(`Bore after honing: ${mine.text}`);
    expect(text).toContain('On the server now');
    expect(text).toContain(`Bore after honing: ${theirs.text}`);
    expect(Number((await storedCylinder(honing)).measured_after_hone_nm)).toBe(theirs.nm);
    await tabletShots(page, 'offline-honed-conflict', conflict);

    await conflict.getByRole('button', { name: 'Use theirs' }).click();
    await conflict.waitFor({ state: 'detached' });
    expect(await page.getByText(/waiting to send/).count()).toBe(0);
    expect(Number((await storedCylinder(honing)).measured_after_hone_nm)).toBe(theirs.nm);
  });

  it('when a pass is ticked done offline, then the tick waits on the tablet, is sent when the network is back, and the server holds the count', async () => {
    const page = env.page;
    passes = await cylinderWithPasses();
    const sheetUrl = `${env.baseUrl}/jobs/${passes.job_id}/cylinders/${passes.n}/sheet`;
    const pass = (i: number) => page.getByRole('button', { name: `Pass ${i} done`, exact: true });
    await page.goto(sheetUrl);
    await pass(2).waitFor();
    expect(await pass(1).getAttribute('aria-pressed')).toBe('false');
    expect((await storedCylinder(passes)).passes_done).toBe(0);
    await offline(async () => {
      await page.goto(sheetUrl);
      // The band says so once the page shows the kept copy.
      await page.getByText(OFFLINE_MARK).waitFor();
      await pass(1).click();
      const waiting = page.getByText(/Passes done for cylinder \d+ of .+: waiting to send/);
      await waiting.waitFor();
      // Shown ticked at once, though only the tablet has it yet.
      expect(await pass(1).getAttribute('aria-pressed')).toBe('true');
      expect(await pass(2).getAttribute('aria-pressed')).toBe('false');
      await tabletShots(page, 'offline-pass-waiting', waiting);
      expect((await storedCylinder(passes)).passes_done).toBe(0);
    });
    allowPageErrors(/net::ERR_FAILED/, LATE_WORKER, /\/passes-done$/);
    await page.getByText(/waiting to send/).waitFor({ state: 'detached', timeout: 30_000 });
    expect((await storedCylinder(passes)).passes_done).toBe(1);
    await page.locator('button[aria-label="Pass 1 done"][aria-pressed="true"]').waitFor();
  });

  it('when a pass ticked offline was changed meanwhile at the desk, then the conflict shows both counts and "Keep mine" stores the tablet\'s', async () => {
    const page = env.page;
    const sheetUrl = `${env.baseUrl}/jobs/${passes.job_id}/cylinders/${passes.n}/sheet`;
    const pass = (i: number) => page.getByRole('button', { name: `Pass ${i} done`, exact: true });
    // Online first, so the kept copy shows the one pass done by the last test.
    await page.goto(sheetUrl);
    await pass(2).waitFor();
    expect(await pass(1).getAttribute('aria-pressed')).toBe('true');
    allowPageErrors(/status of 409/, 'the stale tick is refused on purpose; the page shows both');
    await offline(async () => {
      await page.goto(sheetUrl);
      await pass(2).click();
      await page.getByText(/waiting to send/).waitFor();
      // Meanwhile at the desk the first pass is taken back: none done.
      await asTheDesk('put', `/api/jobs/${passes.job_id}/cylinders/${passes.n}/passes-done`, {
        done: 0,
        basedOn: 1,
      });
    });
    allowPageErrors(/net::ERR_FAILED/, LATE_WORKER, /\/passes-done$/);
    const conflict = page.getByRole('alert').filter({ hasText: 'Passes done for cylinder' });
    await conflict.waitFor({ timeout: 30_000 });
    const text = (await conflict.textContent()) ?? '';
    expect(text).toContain('not saved');
    expect(text).toContain('Passes done: 2');
    expect(text).toContain('On the server now');
    expect(text).toContain('Passes done: 0');
    expect((await storedCylinder(passes)).passes_done).toBe(0);
    await tabletShots(page, 'offline-pass-conflict', conflict);

    await conflict.getByRole('button', { name: 'Keep mine' }).click();
    await until(
      async () => (await storedCylinder(passes)).passes_done === 2,
      'mine is stored',
      30_000,
    );
    await page.getByText(/waiting to send/).waitFor({ state: 'detached', timeout: 30_000 });
    await conflict.waitFor({ state: 'detached' });
    // Read again from the server once sent: both passes ticked.
    await page.locator('button[aria-label="Pass 2 done"][aria-pressed="true"]').waitFor();
  });

  it('when the machinist signs out, then the worker keeps no copy of their pages and the tablet opens none offline', async () => {
    const page = env.page;
    expect(await cachedAnswers(page)).toBeGreaterThan(0);

    await page.locator('.user-button').click();
    await page.getByRole('menuitem', { name: /Sign out/ }).click();
    await page.waitForURL(/\/sign-in/);
    await until(async () => (await cachedAnswers(page)) === 0, 'the copies are deleted');

    allowPageErrors(/status of 504/, 'offline after sign-out, nothing is answered from a copy');
    await env.browser.context.setOffline(true);
    try {
      const answer = await page.evaluate(
        async (id) =>
          (await (globalThis as unknown as PageGlobals).fetch(`/api/jobs/${id}`)).status,
        ready.job_id,
      );
      expect(answer).toBe(504);
      await page.goto(`${env.baseUrl}/jobs`);
      await page.waitForURL(/\/sign-in/);
    } finally {
      await env.browser.context.setOffline(false);
    }
  });
});
