// holds.*: machinists holding measured pistons through the HTTP API, signed in, at 8 and 32 clients,
// on units spread over many parts and on one hot part; beside a raw pg loop doing the same writes
// (the conditional claim of the unit, the hold row, the level, the ledger row) in one transaction.
// Then a race (32 clients, several attempts per piston) and the invariants: no oversell anywhere.
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { HttpSession, type ServerProcess } from '../drills/support';
import { figure, percentile, say } from './emit';
import { BENCH_PASSWORD, type BenchShop } from './generate';

interface Planned {
  unitId: string;
  partId: string;
  jobId: string;
  cylinder: number;
}

interface RunResult {
  ok: number;
  conflicts: number;
  other: number;
  seconds: number;
  latencies: number[];
  wonUnits: string[];
}

/** Free units and open cylinders, handed out once each so no two planned holds collide by accident. */
class Pool {
  private units = new Map<string, { id: string; partId: string }[]>();
  private slots = new Map<string, { jobId: string; n: number }[]>();

  static async load(client: pg.Client): Promise<Pool> {
    const pool = new Pool();
    const units = await client.query(`select u.id, u.part_id, p.family_id from piston_units u
      join parts p on p.id = u.part_id where u.status = 'free' and u.skirt_nm is not null order by u.part_id, u.id`);
    for (const r of units.rows) {
      const key = `${r.family_id}`;
      if (!pool.units.has(key)) pool.units.set(key, []);
      pool.units.get(key)?.push({ id: r.id, partId: r.part_id });
    }
    const slots = await client.query(`select jc.job_id, jc.n, j.family_id from job_cylinders jc
      join jobs j on j.id = jc.job_id
      where j.state in ('booked_in', 'gauged', 'parts_set_aside') order by j.created_at, jc.job_id, jc.n`);
    for (const r of slots.rows) {
      if (!pool.slots.has(r.family_id)) pool.slots.set(r.family_id, []);
      pool.slots.get(r.family_id)?.push({ jobId: r.job_id, n: r.n });
    }
    return pool;
  }

  families(exclude: string): string[] {
    return [...this.units.keys()].filter(
      (f) => f !== exclude && (this.slots.get(f)?.length ?? 0) > 0,
    );
  }

  /** Spread: one hold per family in turn, each family's parts in turn. */
  spread(count: number, excludeFamily: string): Planned[] {
    const plan: Planned[] = [];
    const families = this.families(excludeFamily);
    for (let i = 0; plan.length < count; i++) {
      const family = families[i % families.length];
      const units = this.units.get(family) ?? [];
      const slots = this.slots.get(family) ?? [];
      if (!units.length || !slots.length) {
        if (families.every((f) => !(this.units.get(f)?.length && this.slots.get(f)?.length))) break;
        continue;
      }
      // Take from a different part each time: the units are sorted by part, so stride through them.
      const at = (i * 7919) % units.length;
      const [unit] = units.splice(at, 1);
      const slot = slots.shift() as { jobId: string; n: number };
      plan.push({ unitId: unit.id, partId: unit.partId, jobId: slot.jobId, cylinder: slot.n });
    }
    if (plan.length < count)
      throw new Error(`only ${plan.length} of ${count} spread holds could be planned`);
    return plan;
  }

  /** Hot: every hold on the one part, each for its own cylinder. */
  hot(count: number, familyId: string, partId: string): Planned[] {
    const units = (this.units.get(familyId) ?? [])
      .filter((u) => u.partId === partId)
      .slice(0, count);
    const slots = (this.slots.get(familyId) ?? []).splice(0, units.length);
    const taken = new Set(units.map((u) => u.id));
    this.units.set(
      familyId,
      (this.units.get(familyId) ?? []).filter((u) => !taken.has(u.id)),
    );
    if (units.length < count) throw new Error(`only ${units.length} free units on the hot part`);
    return units.map((u, i) => ({
      unitId: u.id,
      partId: u.partId,
      jobId: slots[i].jobId,
      cylinder: slots[i].n,
    }));
  }

  /** Race: `units` pistons, each asked for by `attempts` different cylinders at once. */
  race(units: number, attempts: number, excludeFamily: string): Planned[] {
    const family = this.families(excludeFamily).sort(
      (a, b) => (this.slots.get(b)?.length ?? 0) - (this.slots.get(a)?.length ?? 0),
    )[0];
    const pistons = (this.units.get(family) ?? []).splice(0, units);
    const slots = (this.slots.get(family) ?? []).splice(0, units * attempts);
    if (slots.length < units * attempts) throw new Error('not enough open cylinders for the race');
    // A piston's attempts stand next to each other in the queue, so different clients send them
    // at the same moment.
    const plan: Planned[] = [];
    for (let u = 0; u < pistons.length; u++) {
      for (let a = 0; a < attempts; a++) {
        const slot = slots[u * attempts + a];
        plan.push({
          unitId: pistons[u].id,
          partId: pistons[u].partId,
          jobId: slot.jobId,
          cylinder: slot.n,
        });
      }
    }
    return plan;
  }
}

async function runWith<C>(
  clients: C[],
  plan: Planned[],
  attempt: (client: C, p: Planned) => Promise<'ok' | 'conflict' | 'other'>,
): Promise<RunResult> {
  const result: RunResult = {
    ok: 0,
    conflicts: 0,
    other: 0,
    seconds: 0,
    latencies: [],
    wonUnits: [],
  };
  let next = 0;
  const started = performance.now();
  await Promise.all(
    clients.map(async (client) => {
      for (;;) {
        const i = next++;
        if (i >= plan.length) return;
        const t = performance.now();
        const outcome = await attempt(client, plan[i]);
        result.latencies.push(performance.now() - t);
        if (outcome === 'ok') {
          result.ok++;
          result.wonUnits.push(plan[i].unitId);
        } else if (outcome === 'conflict') result.conflicts++;
        else result.other++;
      }
    }),
  );
  result.seconds = (performance.now() - started) / 1000;
  return result;
}

async function httpRun(
  server: ServerProcess,
  email: string,
  clients: number,
  plan: Planned[],
): Promise<RunResult> {
  // Sign-in is not what is measured: one after another, each client with its own session.
  const sessions: HttpSession[] = [];
  for (let i = 0; i < clients; i++) {
    const s = new HttpSession(server.url);
    try {
      await s.signIn({ id: '', email, password: BENCH_PASSWORD, role: 'machinist' });
    } catch (e) {
      throw new Error(`${(e as Error).message}\nserver log:\n${server.log().slice(-3000)}`);
    }
    sessions.push(s);
  }
  const otherAnswers: string[] = [];
  const result = await runWith(sessions, plan, async (s, p) => {
    const r = await s.post(`/api/jobs/${p.jobId}/holds`, {
      cylinder: p.cylinder,
      unitId: p.unitId,
    });
    if (r.status === 201) return 'ok';
    if (r.status === 409) return 'conflict';
    if (otherAnswers.length < 3)
      otherAnswers.push(`${r.status} ${JSON.stringify(r.body).slice(0, 200)}`);
    return 'other';
  });
  if (otherAnswers.length) {
    say(
      `unexpected answers: ${otherAnswers.join(' | ')}\nserver log:\n${server.log().slice(-3000)}`,
    );
  }
  return result;
}

async function rawRun(
  databaseUrl: string,
  userId: string,
  clients: number,
  plan: Planned[],
): Promise<RunResult> {
  const conns = await Promise.all(
    Array.from({ length: clients }, async () => {
      const c = new pg.Client({ connectionString: databaseUrl });
      await c.connect();
      return c;
    }),
  );
  try {
    return await runWith(conns, plan, async (c, p) => {
      const holdId = randomUUID();
      await c.query('begin');
      try {
        const claimed = await c.query(
          `update piston_units set status = 'held', held_for_job_id = $1, held_cylinder = $2, hold_id = $3,
             hold_expires_at = now() + interval '14 days', updated_at = now()
           where id = $4 and status = 'free'`,
          [p.jobId, p.cylinder, holdId, p.unitId],
        );
        if (claimed.rowCount !== 1) {
          await c.query('rollback');
          return 'conflict';
        }
        await c.query(
          `insert into holds (id, job_id, cylinder, part_id, unit_id, quantity, expires_at, created_by)
           values ($1, $2, $3, $4, $5, 1, now() + interval '14 days', $6)`,
          [holdId, p.jobId, p.cylinder, p.partId, p.unitId, userId],
        );
        await c.query(
          `update part_levels set held = held + 1, updated_at = now() where part_id = $1`,
          [p.partId],
        );
        await c.query(
          `insert into stock_ledger (user_id, part_id, unit_id, kind, quantity, held_delta, job_id, reason, ref)
           values ($1, $2, $3, 'reservation', 0, 1, $4, 'bench hold', $5)`,
          [userId, p.partId, p.unitId, p.jobId, holdId],
        );
        await c.query('commit');
        return 'ok';
      } catch {
        await c.query('rollback');
        return 'other';
      }
    });
  } finally {
    await Promise.all(conns.map((c) => c.end()));
  }
}

function report(name: string, api: RunResult, raw: RunResult): void {
  figure({
    name,
    value: api.ok / api.seconds,
    unit: 'holds/s',
    baseline: raw.ok / raw.seconds,
    holds: api.ok,
    conflicts: api.conflicts,
    failed: api.other,
    p50Ms: Math.round(percentile(api.latencies, 0.5) * 10) / 10,
    p95Ms: Math.round(percentile(api.latencies, 0.95) * 10) / 10,
    baselineP95Ms: Math.round(percentile(raw.latencies, 0.95) * 10) / 10,
  });
  figure({
    name: `${name}.p95`,
    value: percentile(api.latencies, 0.95),
    unit: 'ms',
    baseline: percentile(raw.latencies, 0.95),
    p50Ms: Math.round(percentile(api.latencies, 0.5) * 10) / 10,
  });
}

/** Counts every way stock could have been promised twice; each must be zero. */
async function oversellCount(client: pg.Client): Promise<Record<string, number>> {
  const one = async (sql: string) => Number((await client.query(sql)).rows[0].n);
  return {
    unitsHeldTwice: await one(`select count(*) as n from (select unit_id from holds
      where released_at is null and unit_id is not null group by unit_id having count(*) > 1) x`),
    heldOverOnHand: await one(
      `select count(*) as n from part_levels where held > on_hand or on_hand < 0`,
    ),
    levelsOffUnits:
      await one(`select count(*) as n from part_levels l join parts p on p.id = l.part_id
      where p.kind = 'piston' and l.held <> (select count(*) from piston_units u where u.part_id = l.part_id and u.status = 'held')`),
    levelsOffLedger: await one(`select count(*) as n from part_levels l
      where l.held <> (select coalesce(sum(held_delta), 0) from stock_ledger s where s.part_id = l.part_id)
         or l.on_hand <> (select coalesce(sum(quantity), 0) from stock_ledger s where s.part_id = l.part_id)`),
    unitsOffHolds: await one(`select count(*) as n from piston_units u where u.status = 'held'
      and not exists (select 1 from holds h where h.id = u.hold_id and h.unit_id = u.id and h.released_at is null)`),
  };
}

export async function holdsBench(opts: {
  server: ServerProcess;
  databaseUrl: string;
  shop: BenchShop;
}): Promise<void> {
  const client = new pg.Client({ connectionString: opts.databaseUrl });
  await client.connect();
  try {
    const pool = await Pool.load(client);
    const machinist = opts.shop.users.machinist;
    const hotFamily = opts.shop.hotFamilyId;
    let oversold = 0;

    for (const [name, clients, count] of [
      ['holds.c8.spread', 8, 1600],
      ['holds.c32.spread', 32, 3200],
    ] as const) {
      say(`${name}: ${count} holds through the API, ${clients} clients`);
      const api = await httpRun(
        opts.server,
        machinist.email,
        clients,
        pool.spread(count, hotFamily),
      );
      say(`${name}: ${count} holds through raw SQL, ${clients} connections`);
      const raw = await rawRun(
        opts.databaseUrl,
        machinist.id,
        clients,
        pool.spread(count, hotFamily),
      );
      report(name, api, raw);
      oversold += api.ok - new Set(api.wonUnits).size + (raw.ok - new Set(raw.wonUnits).size);
    }

    say('holds.c8.hot: 1600 holds on one part, 8 clients');
    const hotApi = await httpRun(
      opts.server,
      machinist.email,
      8,
      pool.hot(1600, hotFamily, opts.shop.hotPartId),
    );
    const hotRaw = await rawRun(
      opts.databaseUrl,
      machinist.id,
      8,
      pool.hot(1600, hotFamily, opts.shop.hotPartId),
    );
    report('holds.c8.hot', hotApi, hotRaw);

    // The race: 100 pistons, each wanted by six cylinders at once, 32 clients.
    say('holds.race: 100 pistons, six cylinders each, 32 clients');
    const race = pool.race(100, 6, hotFamily);
    const raced = await httpRun(opts.server, machinist.email, 32, race);
    const wantedUnits = new Set(race.map((p) => p.unitId)).size;
    oversold += Math.max(0, raced.ok - wantedUnits) + (raced.ok - new Set(raced.wonUnits).size);

    const checks = await oversellCount(client);
    const total = oversold + Object.values(checks).reduce((a, b) => a + b, 0);
    figure({
      name: 'holds.oversells',
      value: total,
      unit: 'count',
      raceWins: raced.ok,
      raceUnits: wantedUnits,
      raceRefused: raced.conflicts,
      ...checks,
    });
  } finally {
    await client.end();
  }
}
