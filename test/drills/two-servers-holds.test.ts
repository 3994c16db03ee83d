// Drill: two server processes on one database, 200 machinists' holds fired at once against five
// free pistons. The database decides every race, not a process's memory: exactly five holds win,
// everybody else is told the piston is gone, and the ledger, the levels and the units agree.
import {
  drillDatabase,
  HttpSession,
  insertUser,
  sqlClient,
  startServer,
  stockFixture,
  type DrillDatabase,
  type ServerProcess,
  type StockFixture,
  type TimedResponse,
} from './support';

jest.setTimeout(180_000);

const ATTEMPTS = 200;
const FREE_UNITS = 5;

let database: DrillDatabase;
let servers: ServerProcess[] = [];

beforeAll(async () => {
  database = await drillDatabase('holds');
  servers = await Promise.all([startServer(database.url), startServer(database.url)]);
});

afterAll(async () => {
  await Promise.all(servers.map((s) => s.stop()));
  await database?.drop();
});

describe('two servers, one database, many holds', () => {
  it('when 200 holds race for 5 free pistons through two server processes, then exactly 5 win and ledger, levels and units agree', async () => {
    const client = await sqlClient(database.url);
    let stock: StockFixture;
    let jobIds: string[];
    const machinists = [];
    try {
      stock = await stockFixture(client, FREE_UNITS);
      // One single-cylinder job per attempt: every request is a legal hold on its own, so the
      // only thing that can refuse it is the race for the piston.
      jobIds = (
        await client.query(
          `with j as (
             insert into jobs (customer_name, family_id, cylinders)
             select 'Drill customer ' || g, $1, 1 from generate_series(1, $2::int) g returning id)
           insert into job_cylinders (job_id, n) select id, 1 from j returning job_id`,
          [stock.familyId, ATTEMPTS],
        )
      ).rows.map((r) => r.job_id as string);
      for (let i = 0; i < 4; i++) machinists.push(await insertUser(client, 'machinist'));
    } finally {
      await client.end();
    }

    // Four machinists, each signed in once; each session is used on both servers (the session
    // lives in PostgreSQL, so either process knows it).
    const sessions = await Promise.all(
      machinists.map(async (m, i) => {
        const s = new HttpSession(servers[i % 2].url);
        await s.signIn(m);
        return s;
      }),
    );

    const started = performance.now();
    const results: TimedResponse[] = await Promise.all(
      jobIds.map((jobId, i) =>
        sessions[i % sessions.length].on(servers[i % 2].url).post(`/api/jobs/${jobId}/holds`, {
          cylinder: 1,
          unitId: stock.unitIds[i % FREE_UNITS],
        }),
      ),
    );
    const elapsed = performance.now() - started;

    const byStatus: Record<number, number> = {};
    for (const r of results) byStatus[r.status] = (byStatus[r.status] ?? 0) + 1;
    // Exactly five win. Every loser is told the piston is gone (409 not_available, with the next
    // best piston); under a burst this size on a small machine a request may instead be shed
    // with a quick 503 when no pooled connection frees up in time. Nothing else is acceptable.
    expect(byStatus[201]).toBe(FREE_UNITS);
    expect((byStatus[409] ?? 0) + (byStatus[503] ?? 0)).toBe(ATTEMPTS - FREE_UNITS);
    for (const r of results.filter((x) => x.status !== 201)) {
      const code = (r.body as { error: { code: string } }).error.code;
      expect(code).toBe(r.status === 409 ? 'not_available' : 'unavailable');
    }
    const winners = results.filter((r) => r.status === 201);
    const heldUnits = winners.map((r) => (r.body as { unitId: string }).unitId);
    expect(new Set(heldUnits)).toEqual(new Set(stock.unitIds));
    // Which process won how many, for the record (either may win all five: the race is fair).
    const perServer = [0, 1].map(
      (s) => results.filter((r, i) => i % 2 === s && r.status === 201).length,
    );

    const check = await sqlClient(database.url);
    try {
      const q = async (sql: string) => (await check.query(sql, [stock.partId])).rows;
      const [level] = await q(`select on_hand, held from part_levels where part_id = $1`);
      expect(level).toEqual({ on_hand: FREE_UNITS, held: FREE_UNITS });
      const [ledger] = await q(`select sum(quantity)::int as on_hand, sum(held_delta)::int as held,
          count(*) filter (where kind = 'reservation')::int as reservations
        from stock_ledger where part_id = $1`);
      expect(ledger).toEqual({ on_hand: FREE_UNITS, held: FREE_UNITS, reservations: FREE_UNITS });
      const units =
        await q(`select u.status, u.hold_id = h.id as same_hold, h.released_at is null as active
        from piston_units u left join holds h on h.unit_id = u.id where u.part_id = $1`);
      expect(units).toHaveLength(FREE_UNITS);
      expect(units.every((u) => u.status === 'held' && u.same_hold && u.active)).toBe(true);
      const [holds] = await q(`select count(*)::int as n, count(distinct unit_id)::int as units
        from holds where part_id = $1`);
      expect(holds).toEqual({ n: FREE_UNITS, units: FREE_UNITS });
    } finally {
      await check.end();
    }
    for (const s of servers) expect((await fetch(`${s.url}/api/health`)).status).toBe(200);

    process.stdout.write(
      `${JSON.stringify({
        drill: 'two-servers-holds',
        attempts: ATTEMPTS,
        won: winners.length,
        answers: byStatus,
        wonPerServer: perServer,
        elapsedMs: Math.round(elapsed),
        slowestMs: Math.round(Math.max(...results.map((r) => r.ms))),
      })}\n`,
    );
  });
});
