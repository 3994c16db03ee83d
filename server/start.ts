// npm start: the demo shop on one command. Starts (creating if needed) the local PostgreSQL
// cluster, migrates, seeds an empty database, builds the client when stale, serves app and API.
// With DATABASE_URL set it uses that server and starts none.
import { demoCluster, localDatabaseUrl } from './db/local-env';
import { buildClient } from './build-client';
import { stopCluster } from './db/cluster';

function say(msg: string) {
  process.stdout.write(`[stepstock] ${msg}\n`);
}

async function main() {
  // The terminal shows the address and warnings; set LOG_LEVEL=info for every request as JSON lines.
  process.env.LOG_LEVEL ??= 'warn';
  const external = Boolean(process.env.DATABASE_URL);
  const startedAt = Date.now();
  if (!external) process.env.DATABASE_URL = await localDatabaseUrl();
  // Imported after DATABASE_URL is known: config is read once at import.
  const { createDb } = await import('./db/knex');
  const { migrateLatest, seedDemo } = await import('./db/migrate');
  const admin = createDb(process.env.DATABASE_URL);
  try {
    const done = await migrateLatest(admin);
    if (done.length) say(`migrations applied: ${done.length}`);
    if (await seedDemo(admin)) say('demo shop seeded');
  } finally {
    await admin.destroy();
  }
  buildClient();
  const { startMailForDemo } = await import('./mail/demo-mail');
  const mail = await startMailForDemo();
  const { startServer } = await import('./main');
  const running = await startServer();
  const { DEMO_USERS, DEMO_PASSWORD } = await import('../seeds/00_users');
  const { realPaymentsConfigured } = await import('./payments/payment-client');
  say(`ready in ${((Date.now() - startedAt) / 1000).toFixed(1)} s`);
  process.stdout.write(
    [
      '',
      `  Stepstock is running at ${running.url}`,
      '',
      `  Demo sign-ins (password "${DEMO_PASSWORD}" for all; change them before real use):`,
      ...DEMO_USERS.map((u) => `    ${u.role.padEnd(10)} ${u.email}`),
      '',
      mail ? `  E-mail goes to a local test mailbox (owner: Mailbox page).` : '',
      realPaymentsConfigured()
        ? ''
        : '  Online payments go to a local test payment service (nothing is charged).',
      '  Ctrl-C stops the server and the database.',
      '',
    ].join('\n') + '\n',
  );
  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    say('stopping…');
    await running.stop().catch(() => undefined);
    await mail?.stop().catch(() => undefined);
    if (!external) stopCluster(demoCluster());
    say('stopped');
    process.exit(0);
  };
  process.on('SIGINT', () => void stop());
  process.on('SIGTERM', () => void stop());
}

main().catch((e: Error) => {
  process.stderr.write(`[stepstock] ${e.message}\n`);
  process.exit(1);
});
