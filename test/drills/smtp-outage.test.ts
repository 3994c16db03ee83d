// Drill: the shop's mail server is down when customers' jobs become ready. The notices must wait in
// the outbox (nothing lost, nothing half-sent), and once the mail server is back each one must arrive
// exactly once — with two server processes, each running an outbox worker, competing for them.
import { createDb } from '../../server/db/knex';
import { startLocalSmtp, type LocalSmtp } from '../../server/mail/fake-smtp';
import {
  drillDatabase,
  freePort,
  HttpSession,
  insertUser,
  sleep,
  sqlClient,
  startServer,
  stockFixture,
  type DrillDatabase,
  type ServerProcess,
} from './support';

jest.setTimeout(180_000);

const JOBS = 10;

let database: DrillDatabase;
let servers: ServerProcess[] = [];
let smtp: LocalSmtp | null = null;
const mailboxDb = { current: null as ReturnType<typeof createDb> | null };

beforeAll(async () => {
  database = await drillDatabase('smtp');
});

afterAll(async () => {
  await Promise.all(servers.map((s) => s.stop()));
  await smtp?.stop();
  await mailboxDb.current?.destroy();
  await database?.drop();
});

async function waitFor<T>(what: string, probe: () => Promise<T | null>, ms = 30_000): Promise<T> {
  const deadline = Date.now() + ms;
  for (;;) {
    const value = await probe();
    if (value !== null) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await sleep(200);
  }
}

describe('SMTP outage', () => {
  it('when the mail server is down as jobs become ready, then the notices wait in the outbox and each arrives exactly once after it returns', async () => {
    const client = await sqlClient(database.url);
    const outbox = async () =>
      (
        await client.query(
          `select id, status, attempts, last_error, message_id, to_address from outbox
           where template = 'job-ready' order by to_address`,
        )
      ).rows;
    try {
      const owner = await insertUser(client, 'owner');
      const { familyId } = await stockFixture(client, 0);

      // The mail server's address is known but nothing listens there yet: it is "down".
      const port = await freePort();
      const env = { SMTP_URL: `smtp://127.0.0.1:${port}` };
      servers = await Promise.all([startServer(database.url, env), startServer(database.url, env)]);

      // Jobs come in and are finished, through both servers.
      const sessions = await Promise.all(
        servers.map(async (s) => {
          const session = new HttpSession(s.url);
          await session.signIn(owner);
          return session;
        }),
      );
      for (let i = 0; i < JOBS; i++) {
        const session = sessions[i % 2];
        const created = await session.post('/api/jobs', {
          customerName: `Drill customer ${i}`,
          customerEmail: `customer-${String(i).padStart(2, '0')}@drill.test`,
          familyId,
          cylinders: 1,
        });
        expect(created.status).toBe(201);
        const id = (created.body as { id: string }).id;
        const ready = await session.patch(`/api/jobs/${id}`, { state: 'ready_to_go' });
        expect({ status: ready.status, body: ready.body }).toMatchObject({ status: 200 });
      }

      // Every notice was written with its job, and every worker's first try failed and was kept.
      const waiting = await waitFor('a failed first attempt on every notice', async () => {
        const rows = await outbox();
        return rows.length === JOBS && rows.every((r) => r.attempts >= 1) ? rows : null;
      });
      for (const row of waiting) {
        expect(row).toMatchObject({ status: 'pending', attempts: 1, message_id: null });
        expect(row.last_error).toMatch(/ECONNREFUSED|connect/i);
      }

      // The mail server comes back. The notices are still there, waiting for their retry time.
      mailboxDb.current = createDb(database.url);
      smtp = await startLocalSmtp({ db: mailboxDb.current, port });
      await sleep(2500);
      expect((await outbox()).every((r) => r.status === 'pending')).toBe(true);
      expect(smtp.received).toHaveLength(0);

      // Move the clock past the backoff (the retry schedule itself is the mail tests' business)
      // and let the two workers compete for the notices.
      await client.query(
        `update outbox set next_attempt_at = now() where template = 'job-ready' and status = 'pending'`,
      );
      await waitFor('every notice sent', async () => {
        const rows = await outbox();
        return rows.every((r) => r.status === 'sent') ? rows : null;
      });
      // Several more polls of both workers: nothing is sent a second time.
      await sleep(5000);
      const sent = await outbox();
      expect(sent.every((r) => r.status === 'sent' && r.attempts === 2)).toBe(true);
      const live = smtp;
      expect(live.received).toHaveLength(JOBS);
      const ids = live.received.map((m) => m.messageId);
      expect(new Set(ids).size).toBe(JOBS);
      expect(new Set(ids)).toEqual(new Set(sent.map((r) => r.message_id)));
      expect(live.received.map((m) => m.to[0]).sort()).toEqual(sent.map((r) => r.to_address));
      const stored = await client.query(`select count(*)::int as n from mailbox_messages`);
      expect(stored.rows[0].n).toBe(JOBS);

      process.stdout.write(
        `${JSON.stringify({ drill: 'smtp-outage', notices: JOBS, delivered: live.received.length, attemptsEach: 2 })}\n`,
      );
    } finally {
      await client.end();
    }
  });
});
