// The bench when the workshop network drops: the production build's service worker and manifest,
// the bench, a job, a cylinder and its bore sheet opening from the worker's cache with the
// network cut (context.setOffline), marked as copies, and nothing of the machinist's left after
// sign-out.
import pg from 'pg';
import type { Locator, Page } from 'playwright-core';
import {
  DEMO,
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

let env: Awaited<ReturnType<typeof e2eEnvironment>>;
let ready: { job_id: string; n: number; number: string };

async function query<T>(sql: string, params: unknown[] = []): Promise<T[]> {
  const client = new pg.Client({ connectionString: env.databaseUrl });
  await client.connect();
  try {
    return (await client.query(sql, params)).rows as T[];
  } finally {
    await client.end();
  }
}

beforeAll(async () => {
  env = await e2eEnvironment();
  // An open job whose cylinder has its readings and a measured piston held: its bore sheet opens.
  [ready] = await query<{ job_id: string; n: number; number: string }>(
    `SELECT c.job_id, c.n, j.number FROM job_cylinders c
       JOIN jobs j ON j.id = c.job_id
       JOIN holds h ON h.job_id = c.job_id AND h.cylinder = c.n
                   AND h.unit_id IS NOT NULL AND h.released_at IS NULL
      WHERE c.cut_at IS NULL AND c.largest_nm IS NOT NULL AND j.state = 'parts_set_aside'
      ORDER BY j.number LIMIT 1`,
  );
});
afterAll(async () => {
  await env?.close();
});

// Run in the page; typed loosely because the test project has no DOM typings.
interface PageGlobals {
  navigator: { serviceWorker: { controller: unknown } };
  caches: {
    keys(): Promise<string[]>;
    open(name: string): Promise<{ keys(): Promise<unknown[]> }>;
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

/** How many API answers the worker's data group holds. */
function cachedAnswers(page: Page): Promise<number> {
  return page.evaluate(async () => {
    const g = globalThis as unknown as PageGlobals;
    let count = 0;
    for (const name of await g.caches.keys()) {
      if (name.includes(':data:')) count += (await (await g.caches.open(name)).keys()).length;
    }
    return count;
  });
}

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
    await page.waitForTimeout(150);
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

/** Another session (the desk) corrects the top reading along the pin, keeping the other five. */
async function changeTopPinThroughApi(value: string): Promise<void> {
  const api = env.page.request;
  const token =
    (await env.browser.context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
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
  const res = await api.put(
    `${env.baseUrl}/api/jobs/${ready.job_id}/cylinders/${ready.n}/readings`,
    { data: { readings }, headers: { 'X-XSRF-TOKEN': token } },
  );
  expect(res.status()).toBe(200);
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
  it('when the machinist has opened the bench, a job, a cylinder and its bore sheet once, then with the network cut each opens again, marked as a copy', async () => {
    const page = env.page;
    await signIn(page, env.baseUrl, DEMO.machinist);
    await page.goto(`${env.baseUrl}/jobs`);
    await workerReady(page);

    // Visited again under the worker, so its data group keeps each page's answers.
    const pages = [
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
      expect(await page.getByText(OFFLINE_MARK).count()).toBe(0);
    }

    // The worker answers what it can; what it cannot reach it answers 504, which Chromium logs.
    allowPageErrors(
      /status of 504/,
      'with the network cut, answers the worker has no copy of are 504',
    );
    await env.browser.context.setOffline(true);
    try {
      for (const p of pages) {
        await page.goto(`${env.baseUrl}${p.url}`);
        await p.sees.waitFor();
        expect(await offlineMark(page)).toMatch(OFFLINE_MARK);
        await tabletShots(page, `offline-${p.name}`);
      }
    } finally {
      await env.browser.context.setOffline(false);
    }

    // Back online, a fresh page is live again and says nothing.
    await page.goto(`${env.baseUrl}/jobs`);
    await pages[0].sees.waitFor();
    await page.waitForTimeout(500);
    expect(await page.getByText(OFFLINE_MARK).count()).toBe(0);
  });

  it('when a reading is typed offline, then it waits on the tablet, is sent when the network is back, and the server holds it', async () => {
    const page = env.page;
    const cylinderUrl = `${env.baseUrl}/jobs/${ready.job_id}/cylinders/${ready.n}`;
    allowPageErrors(
      /status of 504/,
      'with the network cut, answers the worker has no copy of are 504',
    );
    await env.browser.context.setOffline(true);
    try {
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
    } finally {
      await env.browser.context.setOffline(false);
    }
    allowPageErrors(
      /net::ERR_FAILED/,
      "Playwright gives the page its network back a moment before the service worker's; a send " +
        'tried in that moment fails and is tried again',
      /\/readings$/,
    );
    // Back online: sent by itself, and the page reads the cylinder again.
    await page.getByText(/waiting to send/).waitFor({ state: 'detached', timeout: 30_000 });
    // 2.9535 in = 29 535 × 2540 nm (0.0001 in = 2540 nm exactly).
    expect(await topPinNm()).toBe(29_535 * 2540);
  });

  it('when a reading typed offline was changed meanwhile by another session, then the conflict shows both values and "Keep mine" stores it', async () => {
    const page = env.page;
    allowPageErrors(
      /status of 504/,
      'with the network cut, answers the worker has no copy of are 504',
    );
    allowPageErrors(
      /status of 409/,
      'the stale reading is refused on purpose; the page shows the conflict',
    );
    await env.browser.context.setOffline(true);
    try {
      await page.goto(`${env.baseUrl}/jobs/${ready.job_id}/cylinders/${ready.n}`);
      await typeTopPin(page, '2.9545 in');
      await page.getByText(/waiting to send/).waitFor();
      // Meanwhile, at the desk (another session, online), the same reading is corrected.
      await changeTopPinThroughApi('2.9540 in');
    } finally {
      await env.browser.context.setOffline(false);
    }
    allowPageErrors(
      /net::ERR_FAILED/,
      "Playwright gives the page its network back a moment before the service worker's; a send " +
        'tried in that moment fails and is tried again',
      /\/readings$/,
    );
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
