// Shared pieces of the fault drills: the throwaway cluster the test runner made, a migrated database
// of a drill's own, users with known passwords, and a small cookie-carrying HTTP client that talks to
// a real server process the way a browser does (session cookie plus the XSRF header).
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import pg from 'pg';
import { createDb } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import type { Cluster } from '../../server/db/cluster';
import type { Role } from '../../shared/session-types';

export const REPO = path.resolve(__dirname, '..', '..');
export const DRILL_PASSWORD = 'drill-password-long';
// Cost 4: the drills make users, they do not test hashing (the security tests do).
const DRILL_HASH = bcrypt.hashSync(DRILL_PASSWORD, 4);

export function testCluster(): Cluster {
  const raw = process.env.STEPSTOCK_TEST_CLUSTER;
  if (!raw)
    throw new Error('STEPSTOCK_TEST_CLUSTER is not set: run drills through test/test.sh drills');
  return JSON.parse(raw) as Cluster;
}

export async function adminQuery(sql: string): Promise<void> {
  const url = process.env.STEPSTOCK_PG_ADMIN_URL;
  if (!url)
    throw new Error('STEPSTOCK_PG_ADMIN_URL is not set: run drills through test/test.sh drills');
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

/** The test database's server, role and password, another database name. */
export function databaseUrl(name: string): string {
  const url = new URL(process.env.DATABASE_URL as string);
  url.pathname = `/${name}`;
  return url.toString();
}

export interface DrillDatabase {
  name: string;
  url: string;
  drop(): Promise<void>;
}

/** An empty database owned by the application role; `migrate` brings it to the latest schema. */
export async function drillDatabase(
  prefix: string,
  opts: { migrate?: boolean } = {},
): Promise<DrillDatabase> {
  const name = `drill_${prefix}_${randomBytes(4).toString('hex')}`;
  await adminQuery(`create database ${name} owner stepstock`);
  const url = databaseUrl(name);
  if (opts.migrate !== false) {
    const db = createDb(url);
    try {
      await migrateLatest(db);
    } finally {
      await db.destroy();
    }
  }
  return { name, url, drop: () => adminQuery(`drop database if exists ${name} with (force)`) };
}

/** One plain pg client for checking rows behind the server's back. */
export async function sqlClient(url: string): Promise<pg.Client> {
  const client = new pg.Client({ connectionString: url });
  // A drill stops the database or drops it with force; a cut connection must not crash the test.
  client.on('error', () => undefined);
  await client.connect();
  return client;
}

export interface DrillUser {
  id: string;
  email: string;
  password: string;
  role: Role;
}

export async function insertUser(client: pg.Client, role: Role): Promise<DrillUser> {
  const email = `${role}-${randomBytes(4).toString('hex')}@drill.test`;
  const r = await client.query(
    `insert into users (email, name, role, password_hash) values ($1, $2, $3, $4) returning id`,
    [email, `Drill ${role}`, role, DRILL_HASH],
  );
  return { id: r.rows[0].id, email, password: DRILL_PASSWORD, role };
}

export interface TimedResponse {
  status: number;
  body: unknown;
  ms: number;
}

/** A browser-like session against a server process: keeps cookies, echoes the XSRF token. */
export class HttpSession {
  private cookies = new Map<string, string>();

  constructor(readonly baseUrl: string) {}

  /** The same signed-in browser talking to another server process (sessions live in PostgreSQL). */
  on(baseUrl: string): HttpSession {
    const other = new HttpSession(baseUrl);
    other.cookies = this.cookies;
    return other;
  }

  get xsrf(): string {
    return this.cookies.get('XSRF-TOKEN') ?? '';
  }

  get sid(): string {
    return this.cookies.get('stepstock.sid') ?? '';
  }

  private remember(res: Response) {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      this.cookies.set(pair.slice(0, i), decodeURIComponent(pair.slice(i + 1)));
    }
  }

  /** The answer's status and body (parsed when it is JSON, else its text) and how long it took. */
  private async timed(res: Response, started: number): Promise<TimedResponse> {
    this.remember(res);
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      /* not JSON: keep the text */
    }
    return { status: res.status, body: parsed, ms: performance.now() - started };
  }

  async request(
    method: string,
    path: string,
    body?: unknown,
    opts: { timeoutMs?: number } = {},
  ): Promise<TimedResponse> {
    const headers: Record<string, string> = {
      cookie: [...this.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; '),
    };
    if (method !== 'GET' && this.xsrf) headers['x-xsrf-token'] = this.xsrf;
    if (body !== undefined) headers['content-type'] = 'application/json';
    const started = performance.now();
    const res = await fetch(`${this.baseUrl}${path}`, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: AbortSignal.timeout(opts.timeoutMs ?? 30_000),
    });
    return this.timed(res, started);
  }

  /** A multipart upload (a price list), the way the browser's file input sends it. */
  async upload(
    path: string,
    fields: Record<string, string | Blob>,
    fileName?: string,
    opts: { timeoutMs?: number } = {},
  ): Promise<TimedResponse> {
    const form = new FormData();
    for (const [k, v] of Object.entries(fields)) {
      if (typeof v === 'string') form.append(k, v);
      else form.append(k, v, fileName);
    }
    const started = performance.now();
    const res = await fetch(`${this.baseUrl}${path}`, {
      method: 'POST',
      headers: {
        cookie: [...this.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; '),
        'x-xsrf-token': this.xsrf,
      },
      body: form,
      signal: AbortSignal.timeout(opts.timeoutMs ?? 120_000),
    });
    return this.timed(res, started);
  }

  get(path: string, opts?: { timeoutMs?: number }) {
    return this.request('GET', path, undefined, opts);
  }
  post(path: string, body: unknown = {}, opts?: { timeoutMs?: number }) {
    return this.request('POST', path, body, opts);
  }
  patch(path: string, body: unknown = {}, opts?: { timeoutMs?: number }) {
    return this.request('PATCH', path, body, opts);
  }

  async signIn(user: DrillUser): Promise<void> {
    await this.get('/api/session');
    const res = await this.post('/api/session', { email: user.email, password: user.password });
    if (res.status !== 200)
      throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  }
}

export function sleep(ms: number): Promise<void> {
  return new Promise((r) => setTimeout(r, ms));
}

export interface StockFixture {
  familyId: string;
  partId: string;
  stepId: string;
  binId: string;
  unitIds: string[];
}

/**
 * A family, one piston part at one step and `units` measured, free piston units received into a
 * bin, written the way the stock service writes them: one receipt ledger row per unit and the
 * part's level raised to match (sum of ledger quantities = on hand).
 */
export async function stockFixture(client: pg.Client, units: number): Promise<StockFixture> {
  const tag = randomBytes(4).toString('hex');
  const q = async (sql: string, params: unknown[] = []) => (await client.query(sql, params)).rows;
  const [series] = await q(
    `insert into step_series (code, name, unit) values ($1, 'Drill steps', 'mm') returning id`,
    [`DRL-${tag}`],
  );
  const steps = await q(
    `insert into series_steps (series_id, position, label, offset_nm)
     values ($1, 0, 'STD', 0), ($1, 1, '+0.25', 250000), ($1, 2, '+0.50', 500000) returning id`,
    [series.id],
  );
  const [family] = await q(
    `insert into engine_families (code, name, stroke_type, cylinders, cooling, standard_bore_nm, stroke_nm,
       clearance_min_nm, clearance_max_nm, hone_allowance_nm, cleanup_nm, max_oversize_nm, step_series_id)
     values ($1, 'Drill single', 'two', 1, 'air', 54000000, 54000000, 40000, 60000, 20000, 50000, 1000000, $2)
     returning id`,
    [`DRL-${tag}`, series.id],
  );
  const [part] = await q(
    `insert into parts (kind, sku, family_id, step_id, description, material, sale_price)
     values ('piston', $1, $2, $3, 'Drill piston +0.25', 'cast', 49.5) returning id`,
    [`DRL-P-${tag}`, family.id, steps[1].id],
  );
  const [bin] = await q(`insert into bins (code) values ($1) returning id`, [`DRL-${tag}`]);
  const unitRows = await q(
    `insert into piston_units (part_id, skirt_nm, bin_id, unit_cost, measured_at)
     select $1, 54200000 - g * 100, $2, 21.25, now() from generate_series(1, $3::int) g returning id`,
    [part.id, bin.id, units],
  );
  await q(
    `insert into stock_ledger (part_id, unit_id, kind, quantity, unit_cost, to_bin_id, ref)
     select part_id, id, 'receipt', 1, unit_cost, bin_id, 'drill receipt' from piston_units where part_id = $1`,
    [part.id],
  );
  await q(`update part_levels set on_hand = $2 where part_id = $1`, [part.id, units]);
  return {
    familyId: family.id,
    partId: part.id,
    stepId: steps[1].id,
    binId: bin.id,
    unitIds: unitRows.map((r) => r.id as string),
  };
}

export { freePort, startServer, type ServerProcess } from '../support/server-process';
