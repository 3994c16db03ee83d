// Drill: PostgreSQL goes away under a running server. The server must answer 503 quickly (never
// hang), say so on /api/health, and carry on by itself once the database is back — with the sessions
// people had before the outage still valid, since they live in PostgreSQL and not in the process.
import { startCluster, stopCluster, isRunning } from '../../server/db/cluster';
import {
  drillDatabase,
  HttpSession,
  insertUser,
  sleep,
  sqlClient,
  startServer,
  testCluster,
  type ServerProcess,
  type DrillDatabase,
  type DrillUser,
  type TimedResponse,
} from './support';

// The service contract: a 503 within two seconds while the database is unreachable.
const ANSWER_LIMIT_MS = 2000;

jest.setTimeout(120_000);

const cluster = testCluster();
let database: DrillDatabase;
let server: ServerProcess;
let owner: DrillUser;
let target: DrillUser;

beforeAll(async () => {
  database = await drillDatabase('outage');
  const client = await sqlClient(database.url);
  owner = await insertUser(client, 'owner');
  target = await insertUser(client, 'staff');
  await client.end();
  server = await startServer(database.url, { STEPSTOCK_NO_BACKGROUND: '1' });
});

afterAll(async () => {
  // Other drills share this cluster: it must be running again whatever happened above.
  if (!isRunning(cluster)) await startCluster(cluster);
  await server?.stop();
  await database?.drop();
});

function errorCode(r: TimedResponse): string | undefined {
  return (r.body as { error?: { code?: string } } | null)?.error?.code;
}

describe('database outage', () => {
  it('when PostgreSQL stops under load, then every request ends in 200 or 503 within 2 s, health says down, and service and sessions come back without a restart', async () => {
    const session = new HttpSession(server.url);
    await session.signIn(owner);
    const sidBefore = session.sid;
    expect((await session.get('/api/users')).status).toBe(200);

    // Requests in flight: a steady stream of reads and writes from several clients while the
    // database is stopped with `immediate` (connections cut, no checkpoint, like a crash).
    let stopAt = 0;
    let streaming = true;
    const during: Array<TimedResponse & { startedAfterStop: boolean }> = [];
    const stream = async (i: number) => {
      while (streaming) {
        const startedAt = performance.now();
        const call =
          i % 2 === 0
            ? session.get('/api/users', { timeoutMs: 10_000 })
            : session.patch(
                '/api/account',
                { unit: i % 4 === 1 ? 'in' : 'mm' },
                { timeoutMs: 10_000 },
              );
        // A dropped connection or a dead server is recorded as status 0, not thrown, so the
        // assertions below can say what happened.
        const r = await call.catch((e: Error) => ({
          status: 0,
          body: String((e.cause as Error | undefined)?.message ?? e.message),
          ms: performance.now() - startedAt,
        }));
        during.push({ ...r, startedAfterStop: stopAt > 0 && startedAt >= stopAt });
        if (r.status === 0) await sleep(100);
      }
    };
    const streams = [0, 1, 2, 3, 4, 5].map(stream);
    await sleep(300);
    stopAt = performance.now();
    stopCluster(cluster, 'immediate');
    const stoppedIn = performance.now() - stopAt;
    expect(isRunning(cluster)).toBe(false);
    await sleep(1500);
    expect({ exitCode: server.process.exitCode, log: server.log().slice(-3000) }).toEqual({
      exitCode: null,
      log: expect.any(String),
    });
    streaming = false;
    await Promise.all(streams);

    // Nothing hung and nothing failed any other way than a clean 503.
    expect(during.length).toBeGreaterThan(6);
    for (const r of during) {
      expect([200, 503]).toContain(r.status);
      expect(r.ms).toBeLessThan(ANSWER_LIMIT_MS);
      if (r.status === 503) expect(errorCode(r)).toBe('unavailable');
    }
    const afterStop = during.filter((r) => r.startedAfterStop);
    expect(afterStop.length).toBeGreaterThan(0);
    expect(afterStop.every((r) => r.status === 503)).toBe(true);

    // Each kind of request, one by one, answered 503 within the limit while the database is down.
    const probes: Array<[string, () => Promise<TimedResponse>]> = [
      ['GET /api/users', () => session.get('/api/users')],
      ['GET /api/session', () => session.get('/api/session')],
      ['PATCH /api/users/:id', () => session.patch(`/api/users/${target.id}`, { role: 'buyer' })],
      [
        'POST /api/session (a new sign-in)',
        () =>
          new HttpSession(server.url).post('/api/session', {
            email: target.email,
            password: target.password,
          }),
      ],
      ['GET /api/settings', () => session.get('/api/settings')],
    ];
    const timings: Record<string, number> = {};
    for (const [name, probe] of probes) {
      const r = await probe();
      timings[name] = Math.round(r.ms);
      expect({ name, status: r.status, code: errorCode(r) }).toEqual({
        name,
        status: 503,
        code: 'unavailable',
      });
      expect(r.ms).toBeLessThan(ANSWER_LIMIT_MS);
    }
    const health = await session.get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body).toEqual({ status: 'degraded', db: 'down' });
    expect(health.ms).toBeLessThan(ANSWER_LIMIT_MS);
    timings['GET /api/health'] = Math.round(health.ms);

    // PostgreSQL comes back; the same server process picks it up by itself.
    const restartAt = performance.now();
    await startCluster(cluster);
    let back: TimedResponse | null = null;
    while (performance.now() - restartAt < 30_000) {
      back = await session.get('/api/health');
      if (back.status === 200) break;
      await sleep(100);
    }
    const resumedMs = Math.round(performance.now() - restartAt);
    expect(back?.body).toEqual({ status: 'ok', db: 'ok' });
    expect(server.process.exitCode).toBeNull();

    // The session from before the outage is still the same signed-in owner, and may still write.
    const me = await session.get('/api/session');
    expect(me.status).toBe(200);
    expect((me.body as { user: { id: string } }).user.id).toBe(owner.id);
    expect(session.sid).toBe(sidBefore);
    const change = await session.patch(`/api/users/${target.id}`, { name: 'Drill staff, renamed' });
    expect(change.status).toBe(200);
    // The change refused during the outage was not half-applied.
    const check = await sqlClient(database.url);
    const row = (await check.query('select role, name from users where id = $1', [target.id]))
      .rows[0];
    await check.end();
    expect(row).toEqual({ role: 'staff', name: 'Drill staff, renamed' });

    // Figures for the report, so a slow machine shows up in the log rather than as a flake.
    process.stdout.write(
      `${JSON.stringify({
        drill: 'database-outage',
        stopMs: Math.round(stoppedIn),
        requestsDuringOutage: during.length,
        answered503: during.filter((r) => r.status === 503).length,
        slowestMs: Math.round(Math.max(...during.map((r) => r.ms))),
        probeMs: timings,
        resumedMs,
      })}\n`,
    );
  });
});
