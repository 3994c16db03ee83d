// Drill: the server process dies (SIGKILL: no shutdown, no cleanup) in the middle of committing a
// supplier's price list that changes every price. Afterwards the supplier's prices must be exactly
// the old ones — not a mix — with no history, mapping or audit rows from the dead commit; a new
// server process then commits the same upload in full.
import { randomUUID } from 'node:crypto';
import type pg from 'pg';
import {
  drillDatabase,
  HttpSession,
  insertUser,
  sleep,
  sqlClient,
  startServer,
  type DrillDatabase,
  type DrillUser,
  type ServerProcess,
} from './support';

jest.setTimeout(240_000);

const ROWS = 20_000;

let database: DrillDatabase;
const servers: ServerProcess[] = [];

beforeAll(async () => {
  database = await drillDatabase('commit');
});

afterAll(async () => {
  await Promise.all(servers.map((s) => s.kill()));
  await database?.drop();
});

/** A generated list in a plain English layout; `cents` shifts every price so a re-import changes all. */
function priceList(cents: number): Blob {
  const lines = ['sku,description,price,currency,available'];
  for (let i = 1; i <= ROWS; i++) {
    const price = (1000 + (i % 500) + cents) / 100;
    lines.push(
      `KD-${String(i).padStart(6, '0')},Drill piston ${i},${price.toFixed(2)},EUR,${i % 7}`,
    );
  }
  return new Blob([`${lines.join('\n')}\n`], { type: 'text/csv' });
}

interface SupplierState {
  items: number;
  prices: string;
  history: number;
  commits: number;
  mappingAt: string | null;
}

async function supplierState(client: pg.Client, supplierId: string): Promise<SupplierState> {
  const q = async (sql: string) => (await client.query(sql, [supplierId])).rows[0];
  const items = await q(`select count(*)::int as n,
      md5(coalesce(string_agg(sku || '=' || price::text || currency, ',' order by sku), '')) as prices
    from supplier_items where supplier_id = $1`);
  const history = await q(`select count(*)::int as n from supplier_item_prices p
    join supplier_items i on i.id = p.item_id where i.supplier_id = $1`);
  const commits = await q(`select count(*)::int as n from audit_events
    where action = 'price_list.commit' and after ->> 'supplierId' = $1::text`);
  const mapping = await q(
    `select updated_at::text as at from supplier_mappings where supplier_id = $1`,
  );
  return {
    items: items.n,
    prices: items.prices,
    history: history.n,
    commits: commits.n,
    mappingAt: mapping?.at ?? null,
  };
}

async function signedIn(server: ServerProcess, user: DrillUser): Promise<HttpSession> {
  const session = new HttpSession(server.url);
  await session.signIn(user);
  return session;
}

describe('killed commit', () => {
  it('when the server is killed in the middle of committing a price list, then nothing of it is applied and committing again succeeds', async () => {
    const client = await sqlClient(database.url);
    const locker = await sqlClient(database.url);
    try {
      const buyer = await insertUser(client, 'buyer');
      servers.push(await startServer(database.url, { STEPSTOCK_NO_BACKGROUND: '1' }));
      let session = await signedIn(servers[0], buyer);
      const supplier = await session.post('/api/suppliers', {
        name: 'Drill Pistons Ltd',
        email: 'orders@drill-pistons.test',
        currency: 'EUR',
        leadDays: 7,
      });
      expect(supplier.status).toBe(201);
      const supplierId = (supplier.body as { id: string }).id;

      // The first list goes in normally.
      const first = await session.upload(
        `/api/suppliers/${supplierId}/price-lists`,
        { file: priceList(0) },
        'first.csv',
      );
      expect({
        status: first.status,
        counts: (first.body as { counts: unknown }).counts,
      }).toMatchObject({
        status: 201,
        counts: { ok: ROWS, errors: 0 },
      });
      const firstId = (first.body as { importId: string }).importId;
      const committed = await session.post(`/api/price-list-imports/${firstId}/commit`, {});
      expect(committed.status).toBe(200);
      const before = await supplierState(client, supplierId);
      // Every item starts its price history with the first list.
      expect(before).toMatchObject({ items: ROWS, history: ROWS, commits: 1 });

      // The second list changes every price. Upload it, then hold the mapping table so the commit
      // stalls after writing the new prices and before its end, and kill the server right there.
      const second = await session.upload(
        `/api/suppliers/${supplierId}/price-lists`,
        { file: priceList(7) },
        'second.csv',
      );
      expect(second.status).toBe(201);
      const secondId = (second.body as { importId: string }).importId;
      await locker.query('begin');
      await locker.query('lock table supplier_mappings in share mode');
      const token = randomUUID();
      const pending = session
        .post(
          `/api/price-list-imports/${secondId}/commit?progress=${token}`,
          {},
          { timeoutMs: 60_000 },
        )
        .catch((e: Error) => e);
      // Wait until the commit's transaction has rewritten supplier_items and is stuck on our lock.
      let pid = 0;
      const deadline = Date.now() + 60_000;
      while (!pid) {
        const r = await client.query(
          `select a.pid from pg_stat_activity a
            where a.application_name = $1 and a.wait_event_type = 'Lock'
              and exists (select 1 from pg_locks l where l.pid = a.pid and l.granted
                          and l.relation = 'supplier_items'::regclass and l.mode = 'RowExclusiveLock')`,
          [`ssi:${token}:committing`],
        );
        pid = r.rows[0]?.pid ?? 0;
        if (Date.now() > deadline)
          throw new Error(`the commit never reached its midpoint:\n${servers[0].log()}`);
        if (!pid) await sleep(50);
      }
      await servers[0].kill();
      expect(servers[0].process.signalCode).toBe('SIGKILL');
      const answer = await pending;
      // The commit's caller got no answer at all: the connection died with the process.
      expect(answer).toMatchObject({ message: 'fetch failed' });
      // Let the stalled statement go on; its client is gone, so PostgreSQL rolls the transaction back.
      await locker.query('commit');
      for (;;) {
        const r = await client.query(`select 1 from pg_stat_activity where pid = $1`, [pid]);
        if (r.rowCount === 0) break;
        await sleep(50);
      }

      // Nothing partial: every price, the history, the mapping and the audit trail are as before.
      const afterKill = await supplierState(client, supplierId);
      expect(afterKill).toEqual(before);
      const imp = await client.query(
        `select status, (select count(*)::int from price_list_import_rows r where r.import_id = m.id) as staged
           from price_list_imports m where id = $1`,
        [secondId],
      );
      expect(imp.rows[0]).toEqual({ status: 'previewed', staged: ROWS });

      // A new process; the buyer's session lives in PostgreSQL and still works there.
      servers.push(await startServer(database.url, { STEPSTOCK_NO_BACKGROUND: '1' }));
      session = session.on(servers[1].url);
      const again = await session.post(`/api/price-list-imports/${secondId}/commit`, {});
      expect({ status: again.status, body: again.body }).toMatchObject({
        status: 200,
        body: { status: 'committed', counts: { up: ROWS } },
      });
      const after = await supplierState(client, supplierId);
      expect(after.items).toBe(ROWS);
      expect(after.history).toBe(2 * ROWS);
      expect(after.commits).toBe(2);
      expect(after.prices).not.toBe(before.prices);
      const sample = await client.query(
        `select price::text from supplier_items where supplier_id = $1 and sku = 'KD-000001'`,
        [supplierId],
      );
      // KD-000001 costs (1000 + 1 + 7) / 100 = 10.08 in the second list.
      expect(sample.rows[0].price).toBe('10.0800');

      process.stdout.write(
        `${JSON.stringify({ drill: 'killed-commit', rows: ROWS, killedPid: servers[0].process.pid, backendPid: pid })}\n`,
      );
    } finally {
      await locker.query('rollback').catch(() => undefined);
      await locker.end();
      await client.end();
    }
  });
});
