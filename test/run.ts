// npm test: a throwaway PostgreSQL cluster (never the demo's data), then typecheck, unit, client,
// API, fault-drill and browser tests. Exits non-zero on any failure.
//   node --import tsx test/run.ts [stage] [jest args…]   stage: lint|typecheck|unit|client|api|drills|e2e
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import path from 'node:path';
import {
  adminUrl,
  ensureDatabase,
  ensurePostgresInstalled,
  freePort,
  initCluster,
  psql,
  runAsUser,
  startCluster,
  stopCluster,
  type Cluster,
} from '../server/db/cluster';
import { REPO_ROOT } from '../server/db/local-env';
import { buildClient } from '../server/build-client';

const STAGES = ['lint', 'typecheck', 'unit', 'client', 'api', 'drills', 'e2e'] as const;
type Stage = (typeof STAGES)[number];

function say(msg: string) {
  process.stdout.write(`\n[stepstock test] ${msg}\n`);
}

function ensureChromium(): void {
  if (existsSync('/usr/bin/chromium')) return;
  if (process.getuid?.() !== 0) throw new Error('Chromium is missing: apt-get install -y chromium');
  say('installing Chromium from Debian packages (apt-get)…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  execFileSync(
    'apt-get',
    ['install', '-y', '-qq', '--no-install-recommends', 'chromium', 'fonts-dejavu-core'],
    {
      stdio: 'inherit',
      env,
    },
  );
}

function jest(args: string[], env: NodeJS.ProcessEnv): boolean {
  const r = spawnSync(
    process.execPath,
    [
      path.join(REPO_ROOT, 'node_modules', 'jest', 'bin', 'jest.js'),
      '-c',
      'test/jest.config.js',
      ...args,
    ],
    { cwd: REPO_ROOT, stdio: 'inherit', env: { ...process.env, ...env } },
  );
  return r.status === 0;
}

function typecheck(): boolean {
  const tsc = path.join(REPO_ROOT, 'node_modules', 'typescript', 'bin', 'tsc');
  return ['tsconfig.server.json', 'tsconfig.spec.json', 'tsconfig.app.json'].every((p) => {
    say(`typecheck ${p}`);
    return (
      spawnSync(process.execPath, [tsc, '-p', p, '--noEmit'], { cwd: REPO_ROOT, stdio: 'inherit' })
        .status === 0
    );
  });
}

/** The seeded demo shop, once, as a template each browser test copies. */
async function seedE2eTemplate(c: Cluster): Promise<void> {
  const url = ensureDatabase(c, 'stepstock_e2e_template');
  // In its own process with DATABASE_URL set: seeds that go through the services use the process's
  // one Knex instance, which must point at the template too.
  const t = Date.now();
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'server/db/cli.ts', 'seed'], {
    cwd: REPO_ROOT,
    stdio: 'inherit',
    env: { ...process.env, NODE_ENV: 'test', TZ: 'UTC', DATABASE_URL: url, LOG_LEVEL: 'warn' },
  });
  if (r.status !== 0) throw new Error('seeding the demo template failed');
  say(`demo template seeded in ${((Date.now() - t) / 1000).toFixed(1)} s`);
}

function lint(): boolean {
  const eslint = path.join(REPO_ROOT, 'node_modules', 'eslint', 'bin', 'eslint.js');
  const globs = [
    'src/**/*.{ts,html}',
    'server/**/*.ts',
    'shared/**/*.ts',
    'test/**/*.ts',
    'migrations/**/*.ts',
    'seeds/**/*.ts',
  ];
  return (
    spawnSync(process.execPath, [eslint, '-c', '.eslint.config.mjs', ...globs], {
      cwd: REPO_ROOT,
      stdio: 'inherit',
    }).status === 0
  );
}

async function main() {
  const [first, ...rest] = process.argv.slice(2);
  const only = STAGES.includes(first as Stage) ? (first as Stage) : null;
  const jestArgs = only ? rest : process.argv.slice(2);
  const stages: Stage[] = only ? [only] : [...STAGES];
  const needsDb = stages.some((s) => s === 'api' || s === 'drills' || s === 'e2e');
  if (stages.includes('e2e')) ensureChromium();

  let cluster: Cluster | null = null;
  let tmp = '';
  const env: NodeJS.ProcessEnv = { NODE_ENV: 'test', TZ: 'UTC' };
  const cleanup = () => {
    if (cluster) stopCluster(cluster, 'immediate');
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  };
  process.on('SIGINT', () => {
    cleanup();
    process.exit(130);
  });

  try {
    if (needsDb) {
      const runAs = runAsUser();
      tmp = mkdtempSync('/tmp/stepstock-test-');
      if (runAs) spawnSync('chown', [runAs, tmp]);
      cluster = {
        binDir: ensurePostgresInstalled(),
        runAs,
        dataDir: path.join(tmp, 'pg'),
        port: await freePort(),
      };
      say(`throwaway PostgreSQL on 127.0.0.1:${cluster.port} in ${cluster.dataDir}`);
      initCluster(cluster, { fast: true });
      await startCluster(cluster);
      const url = ensureDatabase(cluster, 'stepstock_test');
      psql(cluster, 'alter role stepstock createdb');
      env.DATABASE_URL = url;
      env.STEPSTOCK_TEST_CLUSTER = JSON.stringify(cluster);
      env.STEPSTOCK_PG_ADMIN_URL = adminUrl(cluster);
      const { createDb } = await import('../server/db/knex');
      const { migrateLatest } = await import('../server/db/migrate');
      const db = createDb(url);
      await migrateLatest(db);
      await db.destroy();
    }

    const failed: Stage[] = [];
    for (const stage of stages) {
      say(`stage: ${stage}`);
      let ok = true;
      if (stage === 'lint') ok = lint();
      else if (stage === 'typecheck') ok = typecheck();
      else if (stage === 'unit' || stage === 'client')
        ok = jest(['--selectProjects', stage, ...jestArgs], env);
      else if (stage === 'api') ok = jest(['--selectProjects', stage, '-i', ...jestArgs], env);
      // Jest reads the test timeout only globally: drills and browser tests get theirs here.
      else if (stage === 'drills')
        ok = jest(['--selectProjects', stage, '-i', '--testTimeout', '240000', ...jestArgs], env);
      else if (stage === 'e2e') {
        buildClient();
        await seedE2eTemplate(cluster as Cluster);
        ok = jest(['--selectProjects', 'e2e', '-i', '--testTimeout', '180000', ...jestArgs], env);
      }
      if (!ok) failed.push(stage);
    }
    if (failed.length) {
      say(`FAILED stages: ${failed.join(', ')}`);
      process.exitCode = 1;
    } else {
      say('all stages passed');
    }
  } finally {
    cleanup();
  }
}

main().catch((e: Error) => {
  process.stderr.write(`[stepstock test] ${e.stack ?? e.message}\n`);
  process.exitCode = 1;
});
