// Drill: a supplier with a very large price list (ITEMS items, all waiting in the mapping queue),
// then 200 heavy list requests at once (the queue, its later pages, searches of the supplier's
// items) and 200 sign-ins with made-up e-mails at once. /api/health, polled from outside the
// server's process throughout, must answer 200 within a second every time: a balancer must never
// take a healthy server out. The lists answer 200, or 503 with Retry-After when the pool is full.
import { randomUUID } from 'node:crypto';
import {
  drillDatabase,
  HttpSession,
  insertUser,
  sleep,
  sqlClient,
  startServer,
  type DrillDatabase,
  type ServerProcess,
} from './support';

jest.setTimeout(600_000);

const ITEMS = 400_000;

let database: DrillDatabase;
let server: ServerProcess | null = null;

beforeAll(async () => {
  database = await drillDatabase('heavy');
});

afterAll(async () => {
  await server?.stop();
  await database?.drop();
});

describe('heavy lists and floods', () => {
  it('when 200 heavy list requests and then 200 made-up sign-ins arrive at once, then health answers 200 within a second throughout', async () => {
    const client = await sqlClient(database.url);
    try {
      const buyer = await insertUser(client, 'buyer');
      const {
        rows: [supplier],
      } = await client.query(
        `insert into suppliers (name, currency, lead_days) values ('Drill bulk lists', 'EUR', 5) returning id`,
      );
      await client.query(
        `insert into supplier_items (supplier_id, sku, description, size_nm, oversize_nm, price, currency)
         select $1, 'HL-' || lpad(g::text, 7, '0'),
                'Piston ' || (54 + (g % 40) * 0.25)::text || ' mm, cast, pin and clips, item ' || g,
                54000000 + (g % 40) * 250000, (g % 5) * 250000, 30 + (g % 900) / 100.0, 'EUR'
           from generate_series(1, $2::int) g`,
        [supplier.id, ITEMS],
      );
      await client.query('analyze supplier_items');

      server = await startServer(database.url, { STEPSTOCK_NO_BACKGROUND: '1' });
      const session = new HttpSession(server.url);
      await session.signIn(buyer);

      const polls: Array<{ ms: number; status: number; phase: string }> = [];
      let phase = 'lists';
      let polling = true;
      const poller = (async () => {
        while (polling) {
          const started = performance.now();
          let status = 0;
          try {
            const res = await fetch(`${server!.url}/api/health`, {
              signal: AbortSignal.timeout(10_000),
            });
            status = res.status;
            await res.text();
          } catch {
            status = -1;
          }
          polls.push({ ms: performance.now() - started, status, phase });
          await sleep(100);
        }
      })();

      const lists = [
        '/api/supplier-items/unmapped?pageSize=50',
        '/api/supplier-items/unmapped?page=40&pageSize=50',
        `/api/supplier-items/unmapped?supplierId=${supplier.id}&q=0001234`,
        `/api/suppliers/${supplier.id}/items?q=item%201999`,
        `/api/suppliers/${supplier.id}/items?q=HL-03&pageSize=100`,
      ];
      const burst = await Promise.all(
        Array.from({ length: 200 }, (_, i) =>
          session.get(lists[i % lists.length], { timeoutMs: 60_000 }),
        ),
      );
      phase = 'sign-ins';
      const flood = await Promise.all(
        Array.from({ length: 200 }, () =>
          fetch(`${server!.url}/api/session`, {
            method: 'POST',
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({
              email: `${randomUUID()}@nobody.test`,
              password: 'wrong-guess-1',
            }),
            signal: AbortSignal.timeout(60_000),
          }).then(async (r) => {
            await r.text();
            return r.status;
          }),
        ),
      );
      polling = false;
      await poller;

      const slowest = Math.max(...polls.map((p) => p.ms));
      process.stdout.write(
        `${JSON.stringify({ drill: 'heavy-lists', items: ITEMS, polls: polls.length, slowestHealthMs: Math.round(slowest), slowestByPhase: Object.fromEntries(['lists', 'sign-ins'].map((p) => [p, Math.round(Math.max(0, ...polls.filter((q) => q.phase === p).map((q) => q.ms)))])), burst: count(burst.map((b) => b.status)), flood: count(flood) })}\n`,
      );
      for (const b of burst) expect([200, 503]).toContain(b.status);
      expect(burst.filter((b) => b.status === 200).length).toBeGreaterThan(0);
      const first = burst.find((b, i) => b.status === 200 && i % lists.length === 0);
      expect((first?.body as { total: number } | undefined)?.total).toBe(ITEMS);
      for (const status of flood) expect([401, 429, 503]).toContain(status);
      expect(polls.length).toBeGreaterThan(3);
      expect(new Set(polls.map((p) => p.status))).toEqual(new Set([200]));
      expect(slowest).toBeLessThan(1000);
    } finally {
      await client.end();
    }
  });
});

function count(statuses: number[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const s of statuses) out[s] = (out[s] ?? 0) + 1;
  return out;
}
