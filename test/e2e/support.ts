// Browser-test harness: a database copied from the seeded demo template, the real server in its own
// process, and Debian's Chromium driven by playwright-core. Nothing leaves 127.0.0.1.
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { startServer } from '../support/server-process';

export const REPO = path.resolve(__dirname, '..', '..');
export const ARTIFACTS = path.join(REPO, 'test', 'artifacts');
export const DEMO_PASSWORD = 'stepstock-demo';
export const DEMO = {
  owner: 'owner@demo.test',
  buyer: 'buyer@demo.test',
  machinist: 'machinist@demo.test',
  staff: 'staff@demo.test',
} as const;
export type DemoRole = keyof typeof DEMO;

async function adminQuery(sql: string): Promise<void> {
  const url = process.env.STEPSTOCK_PG_ADMIN_URL;
  if (!url)
    throw new Error('STEPSTOCK_PG_ADMIN_URL is not set: run browser tests through npm test');
  await queryDatabase(url, sql);
}

/** A fresh copy of the seeded demo database (copying a template is much faster than seeding). */
export async function demoDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `e2e_${randomBytes(5).toString('hex')}`;
  await adminQuery(`create database ${name} template stepstock_e2e_template owner stepstock`);
  // Same server and password as the test database, another database name.
  const url = new URL(process.env.DATABASE_URL as string);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    drop: () => adminQuery(`drop database if exists ${name} with (force)`),
  };
}

export interface Browser {
  context: BrowserContext;
  page: Page;
  close(): Promise<void>;
}

// ---- Page errors: every browser test fails on an uncaught page error or a console error ----------

export interface PageProblem {
  kind: 'pageerror' | 'console';
  text: string;
  /** Where it came from: the resource for a failed load, else the page. */
  url: string;
}

interface Allowance {
  kind: PageProblem['kind'];
  text: RegExp;
  url?: RegExp;
  /** Why this entry is harmless: shown when the list is read, and required. */
  why: string;
}

/**
 * The only console errors every test accepts, each with its reason. Chromium reports each answer
 * with a status of 400 or more as a console error ("Failed to load resource"), even when the page
 * expected and handled it; those are only harmless where listed here or allowed by the test itself.
 */
export const HARMLESS: readonly Allowance[] = [
  {
    kind: 'console',
    text: /^Failed to load resource: the server responded with a status of 401/,
    url: /\/api\/session$/,
    why:
      'on start the app asks who is signed in: a signed-out visitor is answered 401 and sent to ' +
      'sign-in, and a refused sign-in is a 401 the form shows in words',
  },
];

const problems: PageProblem[] = [];
let allowedThisTest: Allowance[] = [];

function watch(page: Page): void {
  page.on('pageerror', (error) =>
    problems.push({ kind: 'pageerror', text: `${error.name}: ${error.message}`, url: page.url() }),
  );
  page.on('console', (message) => {
    if (message.type() !== 'error') return;
    problems.push({
      kind: 'console',
      text: message.text(),
      url: message.location().url || page.url(),
    });
  });
}

/**
 * For one test that provokes an error on purpose (a refused form, a conflict it checks is shown):
 * accept console errors matching `text` (and `url`) until the test ends. Say why in `why`.
 */
export function allowPageErrors(text: RegExp, why: string, url?: RegExp): void {
  allowedThisTest.push({ kind: 'console', text, url, why });
}

function isAllowed(p: PageProblem): boolean {
  return [...HARMLESS, ...allowedThisTest].some(
    (a) => a.kind === p.kind && a.text.test(p.text) && (!a.url || a.url.test(p.url)),
  );
}

/** The problems seen since the last call that no allowance covers; clears the list. */
export function takePageProblems(): PageProblem[] {
  const found = problems.splice(0).filter((p) => !isAllowed(p));
  allowedThisTest = [];
  return found;
}

/**
 * Debian's Chromium in a profile of its own. `extraArgs` is for a file that needs a browser set up
 * differently (a fake camera fed from a file), `device` for one that plays a tablet (touch, its
 * screen); every other file gets the same desk browser.
 */
export async function openBrowser(
  extraArgs: readonly string[] = [],
  device: { hasTouch?: boolean; viewport?: { width: number; height: number } } = {},
): Promise<Browser> {
  const userDataDir = mkdtempSync(path.join(os.tmpdir(), 'stepstock-chromium-'));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: device.viewport ?? { width: 1280, height: 860 },
    hasTouch: device.hasTouch ?? false,
    acceptDownloads: true,
    // Only so the accessibility checker can be injected; the app itself runs under its CSP.
    bypassCSP: true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
      ...extraArgs,
    ],
  });
  // A test can never reach out: anything not on loopback is refused.
  await context.route('**/*', (route) => {
    const u = new URL(route.request().url());
    if (u.hostname === '127.0.0.1' || u.protocol === 'data:' || u.protocol === 'blob:')
      return route.continue();
    return route.abort();
  });
  context.on('page', watch);
  for (const open of context.pages()) watch(open);
  const page = context.pages()[0] ?? (await context.newPage());
  page.setDefaultTimeout(15_000);
  return {
    context,
    page,
    close: async () => {
      await context.close();
      rmSync(userDataDir, { recursive: true, force: true });
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  const dir = path.join(ARTIFACTS, 'screenshots');
  mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/**
 * Screenshots of the whole page at a desk's 1280 px and a tablet's 800 px width (`<name>-1280.png`,
 * `<name>-800.png`); the viewport is put back afterwards. The shell scrolls its content pane, not
 * the document, so a plain full-page picture would stop at the window's bottom edge: the window is
 * made as tall as the pane's content for the picture instead.
 */
export async function screenshotAtWidths(
  page: Page,
  name: string,
  widths: readonly number[] = [1280, 800],
): Promise<string[]> {
  const before = page.viewportSize();
  const height = before?.height ?? 860;
  const files: string[] = [];
  for (const width of widths) {
    await page.setViewportSize({ width, height });
    // Let the layout settle at the new width before measuring it.
    await page.waitForTimeout(150);
    const whole = await page.evaluate(() => {
      const g = globalThis as unknown as {
        innerHeight: number;
        document: {
          querySelector(s: string): { scrollHeight: number; clientHeight: number } | null;
        };
      };
      const pane = g.document.querySelector('mat-sidenav-content');
      // What the pane holds beyond what it shows, added to the window's own height.
      return pane ? g.innerHeight + Math.max(0, pane.scrollHeight - pane.clientHeight) : 0;
    });
    // Capped so a runaway page cannot ask Chromium for a picture it cannot make.
    if (whole > height) await page.setViewportSize({ width, height: Math.min(whole, 12_000) });
    await page.waitForTimeout(100);
    files.push(await screenshot(page, `${name}-${width}`));
  }
  if (before) await page.setViewportSize(before);
  return files;
}

export async function signIn(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}

/** Opens a page from the main navigation by its link and waits for its heading of that name. */
export async function openFromNav(page: Page, name: string): Promise<void> {
  await page.getByRole('navigation', { name: /main/i }).getByRole('link', { name }).click();
  await page.getByRole('heading', { name, level: 1 }).waitFor();
}

export async function signOut(page: Page) {
  await page.getByRole('button', { name: /account menu|user menu/i }).click();
  await page.getByRole('menuitem', { name: /sign out/i }).click();
  await page.waitForURL(/\/sign-in/);
}

const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: number;
  targets: string[];
}

/** axe-core scan of the current page; returns the serious and critical violations. */
export async function seriousA11yViolations(page: Page): Promise<AxeViolation[]> {
  const first = await scanOnce(page);
  if (first.length === 0) return first;
  // Material's overlays mark the page aria-hidden for the length of an opening or closing
  // animation; a person never meets that state, so a finding must still be there a moment later.
  await page.waitForTimeout(800);
  return scanOnce(page);
}

async function scanOnce(page: Page): Promise<AxeViolation[]> {
  await page.evaluate(AXE_SOURCE);
  const result = await page.evaluate(async () => {
    // Runs in the page: typed loosely because the test project has no DOM typings.
    const g = globalThis as unknown as {
      document: unknown;
      axe: {
        run: (
          ctx: unknown,
          opts: object,
        ) => Promise<{
          violations: Array<{ id: string; impact: string | null; help: string; nodes: unknown[] }>;
        }>;
      };
    };
    const r = await g.axe.run(g.document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.length,
      // Where it is, so a failing test says which element to mend.
      targets: (v.nodes as Array<{ target?: unknown }>)
        .slice(0, 3)
        .map((n) => JSON.stringify(n.target)),
    }));
  });
  return result.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

/** Reads a test's own database directly, to check what the pages wrote or to find demo rows. */
export async function queryDatabase<T>(
  url: string,
  sql: string,
  params: unknown[] = [],
): Promise<T[]> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return (await client.query(sql, params)).rows as T[];
  } finally {
    await client.end();
  }
}

/**
 * A call to the API the pages use, made from `page`'s session with its XSRF token like Angular
 * sends it; anything but a 2xx answer fails with the method, path, status and what the server said.
 */
export async function apiCall<T>(
  page: Page,
  baseUrl: string,
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE',
  path: string,
  data?: object,
): Promise<T> {
  const cookies = await page.context().cookies();
  const token = cookies.find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await page.request.fetch(`${baseUrl}${path}`, {
    method,
    ...(data ? { data } : {}),
    headers: { 'X-XSRF-TOKEN': token },
  });
  if (!res.ok()) throw new Error(`${method} ${path}: ${res.status()} ${await res.text()}`);
  return (await res.json()) as T;
}

/** Starts a demo database, the server and a browser for one test file. */
export async function e2eEnvironment(extraEnv: NodeJS.ProcessEnv = {}) {
  const database = await demoDatabase();
  const server = await startServer(database.url, extraEnv);
  const browser = await openBrowser();
  return {
    baseUrl: server.url,
    databaseUrl: database.url,
    page: browser.page,
    browser,
    server,
    /** Reads or writes this file's own database directly (`queryDatabase`). */
    query: <T>(sql: string, params: unknown[] = []) => queryDatabase<T>(database.url, sql, params),
    /** `apiCall` against this file's server. */
    api: <T>(page: Page, method: Parameters<typeof apiCall>[2], path: string, data?: object) =>
      apiCall<T>(page, server.url, method, path, data),
    /** Signs the file's page out of whoever it was and in as the demo user of `role`; then opens `path`. */
    async signInAs(role: DemoRole, path?: string) {
      await browser.page.context().clearCookies();
      await signIn(browser.page, server.url, DEMO[role]);
      if (path) await browser.page.goto(`${server.url}${path}`);
    },
    async close() {
      await browser.close().catch(() => undefined);
      await server.stop();
      await database.drop();
    },
  };
}
/**
 * Fails each test of the calling file on any page error or console error not allowed above, naming
 * what the browser said. Call once at the top of a browser-test file.
 */
export function failOnPageErrors(): void {
  afterEach(() => {
    const found = takePageProblems();
    if (found.length > 0) {
      throw new Error(
        `The browser reported ${found.length} error(s) during this test:\n` +
          found.map((p) => `  [${p.kind}] ${p.text} (at ${p.url})`).join('\n'),
      );
    }
  });
}

export type E2eEnvironment = Awaited<ReturnType<typeof e2eEnvironment>>;

/**
 * The usual top of a browser-test file: each test fails on a page error (`failOnPageErrors`) and
 * may take `timeout` ms; an `e2eEnvironment` starts before the file's tests and closes after them.
 * The object returned is filled in place once it has started, so a file names it at the top:
 * `const env = browserTestFile({ timeout: 180_000 })`.
 */
export function browserTestFile(
  options: { timeout?: number; extraEnv?: NodeJS.ProcessEnv } = {},
): E2eEnvironment {
  failOnPageErrors();
  if (options.timeout) jest.setTimeout(options.timeout);
  const env = {} as E2eEnvironment;
  beforeAll(async () => {
    Object.assign(env, await e2eEnvironment(options.extraEnv));
  });
  afterAll(async () => {
    await env.close?.();
  });
  return env;
}
