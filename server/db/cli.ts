// npm run db:migrate | db:seed | backup | restore -- FILE
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { DateTime } from 'luxon';
import { createDb } from './knex';
import { migrateLatest, seedDemo } from './migrate';
import { localDatabaseUrl } from './local-env';

function out(msg: string) {
  process.stdout.write(`${msg}\n`);
}

async function main() {
  const [cmd, arg] = process.argv.slice(2);
  const url = process.env.DATABASE_URL ?? (await localDatabaseUrl());
  if (cmd === 'migrate' || cmd === 'seed') {
    const db = createDb(url);
    try {
      const done = await migrateLatest(db);
      out(`migrations applied: ${done.length ? done.join(', ') : 'none (up to date)'}`);
      if (cmd === 'seed')
        out((await seedDemo(db)) ? 'demo shop seeded' : 'database not empty: not seeded');
    } finally {
      await db.destroy();
    }
    return;
  }
  if (cmd === 'backup') {
    const dir = path.resolve(arg ?? '.data/backups');
    mkdirSync(dir, { recursive: true });
    const file = path.join(
      dir,
      `stepstock-${DateTime.utc().toFormat("yyyyLLdd'T'HHmmss'Z'")}.dump`,
    );
    const r = spawnSync('pg_dump', ['--format=custom', '--no-owner', '--file', file, url], {
      stdio: 'inherit',
    });
    if (r.status !== 0) throw new Error('pg_dump failed');
    out(file);
    return;
  }
  if (cmd === 'restore') {
    if (!arg || !existsSync(arg))
      throw new Error('Usage: npm run restore -- FILE (a dump written by npm run backup)');
    const db = createDb(url);
    try {
      const tables = await db.raw(
        `select count(*)::int as n from pg_tables where schemaname='public'`,
      );
      if (tables.rows[0].n > 0)
        throw new Error('Restore only into an empty database: this one has tables.');
    } finally {
      await db.destroy();
    }
    const r = spawnSync('pg_restore', ['--no-owner', '--exit-on-error', '--dbname', url, arg], {
      stdio: 'inherit',
    });
    if (r.status !== 0) throw new Error('pg_restore failed');
    out(`restored ${arg}`);
    return;
  }
  throw new Error('Usage: tsx server/db/cli.ts migrate|seed|backup [DIR]|restore FILE');
}

main().catch((e: Error) => {
  process.stderr.write(`${e.message}\n`);
  process.exit(1);
});
