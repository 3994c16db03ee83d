// A separate worker process for the "two processes never send twice" test: connects to the test
// database, says "ready", waits for "go" on stdin so both processes start together, drains the
// outbox into the SMTP server named in argv and prints how many messages it sent.
import { createDb } from '../../server/db/knex';
import { createMailWorker } from '../../server/mail/mail-worker';

async function main() {
  const smtpUrl = process.argv[2];
  if (!smtpUrl) throw new Error('usage: mail-worker-process.ts smtp://127.0.0.1:PORT');
  const db = createDb(process.env.DATABASE_URL);
  await db.raw('select 1');
  const worker = createMailWorker({ db, smtpUrl: () => smtpUrl, baseRetryMs: 60_000 });
  process.stdout.write('ready\n');
  await new Promise<void>((resolve) => process.stdin.once('data', () => resolve()));
  process.stdin.pause();
  let sent = 0;
  for (;;) {
    const r = await worker.runOnce();
    sent += r.sent;
    if (r.sent + r.retried + r.failed === 0) break;
  }
  await worker.stop();
  await db.destroy();
  // Exit explicitly: stdin stays open while the test process holds its end of the pipe.
  process.stdout.write(`sent ${sent}\n`, () => process.exit(0));
}

main().catch((e: Error) => {
  process.stderr.write(`${e.stack ?? e.message}\n`);
  process.exit(1);
});
