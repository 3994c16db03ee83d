// npm run bench: speed and memory figures as JSON lines, each beside its physical limit measured in
// the same run. Everything happens on 127.0.0.1 in a throwaway PostgreSQL cluster with generated
// data; the run stops by itself (a watchdog ends it after 45 minutes) and removes what it made.
//   node --import tsx test/bench/run.ts [group…] [--scale N] [--keep DIR]
//   groups: lists holds import client start (default all; with --scale above 1, default lists: the
//   figures that depend on how much the shop holds)
//   --keep DIR: the cluster and its generated shop stay in DIR after the run, and a later run with
//   the same DIR and scale starts them again (new migrations applied) instead of generating anew,
//   which at ×10 takes minutes of both cores.
import { spawnSync } from 'node:child_process';
import os from 'node:os';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import {
  ensureDatabase,
  ensurePostgresInstalled,
  freePort,
  initCluster,
  runAsUser,
  startCluster,
  stopCluster,
  type Cluster,
} from '../../server/db/cluster';
import { createDb } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import { startServer, type ServerProcess } from '../drills/support';
import { clientBench } from './client-bench';
import { coldStart } from './cold-start';
import { figure, figuresOnlyOnStdout, say, skipped } from './emit';
import { generateShop, type BenchShop } from './generate';
import { holdsBench } from './holds-bench';
import { importBench } from './import-bench';
import { latencyBench } from './latency-bench';

const GROUPS = ['lists', 'holds', 'import', 'client', 'start'] as const;
type Group = (typeof GROUPS)[number];
const WATCHDOG_MS = 45 * 60_000;

async function main() {
  figuresOnlyOnStdout();
  const args = process.argv.slice(2);
  const scale = scaleFrom(args);
  const keep = keepFrom(args);
  const asked = args.filter((a): a is Group => (GROUPS as readonly string[]).includes(a));
  const groups = new Set<Group>(asked.length ? asked : scale > 1 ? ['lists'] : GROUPS);
  const started = Date.now();

  let cluster: Cluster | null = null;
  let tmp = '';
  let server: ServerProcess | null = null;
  const cleanup = async () => {
    await server?.kill().catch(() => undefined);
    if (cluster) stopCluster(cluster, 'fast');
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  };
  const kept = keep ? keptShop(keep, scale) : null;
  // A deeper shop takes longer to generate: five more minutes for each step of scale.
  const watchdogMs = WATCHDOG_MS + (scale - 1) * 5 * 60_000;
  const watchdog = setTimeout(() => {
    say(`still running after ${watchdogMs / 60_000} minutes: stopping`);
    void cleanup().finally(() => process.exit(2));
  }, watchdogMs);
  process.once('SIGINT', () => void cleanup().finally(() => process.exit(130)));

  try {
    const runAs = runAsUser();
    tmp = mkdtempSync('/tmp/stepstock-bench-');
    if (runAs) spawnSync('chown', [runAs, tmp]);
    if (keep) mkdirSync(keep, { recursive: true });
    // A durable cluster (fsync on), like a shop's: commit latency is part of what a hold costs.
    cluster = {
      binDir: ensurePostgresInstalled(),
      runAs,
      dataDir: path.join(keep ?? tmp, 'pg'),
      port: await freePort(),
    };
    say(
      `${keep ? `kept PostgreSQL in ${keep}` : 'throwaway PostgreSQL'} on 127.0.0.1:${cluster.port}`,
    );
    initCluster(cluster);
    await startCluster(cluster);
    const url = ensureDatabase(cluster, 'stepstock_bench');
    const migrator = createDb(url);
    await migrateLatest(migrator);
    await migrator.destroy();

    // Other work on the machine skews every time below: the load is printed with the figures.
    figure({
      name: 'machine.load1.start',
      value: os.loadavg()[0],
      unit: 'load',
      cpus: os.cpus().length,
    });
    figure({ name: 'bench.scale', value: scale, unit: '×' });
    const shop = kept ?? (await generate(url, scale));
    if (keep && !kept) writeFileSync(path.join(keep, SHOP_FILE), JSON.stringify({ scale, shop }));

    if (groups.has('lists') || groups.has('holds')) {
      server = await startServer(url, { LOG_LEVEL: 'warn' });
      if (groups.has('lists')) await latencyBench({ server, shop });
      if (groups.has('holds')) await holdsBench({ server, databaseUrl: url, shop });
      await server.stop();
      server = null;
    }
    if (groups.has('import')) {
      await importBench({
        databaseUrl: url,
        tmpDir: tmp,
        supplierId: shop.supplierId,
        userId: shop.users.buyer.id,
      });
    }
    if (groups.has('client')) clientBench();
    if (groups.has('start')) await coldStart(url);
    for (const g of GROUPS)
      if (!groups.has(g)) skipped(`group:${g}`, 'not asked for on the command line');
    say(`done in ${((Date.now() - started) / 1000).toFixed(0)} s`);
  } finally {
    clearTimeout(watchdog);
    await cleanup();
  }
}

async function generate(url: string, scale: number): Promise<BenchShop> {
  say(
    `generating the bench shop: ${(100_000 * scale).toLocaleString('en')} piston units, ` +
      `${(1_000_000 * scale).toLocaleString('en')} ledger rows…`,
  );
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  const genStart = Date.now();
  const shop = await generateShop(client, scale);
  await client.end();
  say(
    `generated ${shop.units} units and ${shop.ledgerRows} ledger rows in ${((Date.now() - genStart) / 1000).toFixed(1)} s`,
  );
  return shop;
}

/** Beside a kept cluster: the scale it was generated at and the ids the figures need. */
const SHOP_FILE = 'bench-shop.json';

/** `--keep DIR`: where the cluster stays between runs (an absolute or relative folder). */
function keepFrom(args: string[]): string | null {
  const at = args.indexOf('--keep');
  if (at === -1) return null;
  const dir = args[at + 1];
  if (!dir || dir.startsWith('--')) throw new Error('--keep wants a folder to keep the cluster in');
  return path.resolve(dir);
}

/** The shop generated earlier in `dir`, or null when there is none yet. */
function keptShop(dir: string, scale: number): BenchShop | null {
  const file = path.join(dir, SHOP_FILE);
  if (!existsSync(file)) {
    if (existsSync(path.join(dir, 'pg'))) {
      throw new Error(
        `${dir} holds a cluster but no ${SHOP_FILE}: its generation did not finish; remove the folder`,
      );
    }
    return null;
  }
  const saved = JSON.parse(readFileSync(file, 'utf8')) as { scale: number; shop: BenchShop };
  if (saved.scale !== scale) {
    throw new Error(`${dir} holds a shop generated at --scale ${saved.scale}, not ${scale}`);
  }
  say(`reusing the ×${scale} shop kept in ${dir} (not generated again)`);
  return saved.shop;
}

/** `--scale N`: N times the bench shop's units, ledger and jobs (a whole number from 1 to 20). */
function scaleFrom(args: string[]): number {
  const at = args.indexOf('--scale');
  if (at === -1) return 1;
  const n = Number(args[at + 1]);
  if (!Number.isInteger(n) || n < 1 || n > 20) {
    throw new Error(`--scale wants a whole number from 1 to 20, not "${args[at + 1] ?? ''}"`);
  }
  return n;
}

main().catch((e: Error) => {
  process.stderr.write(`[bench] failed: ${e.stack ?? e.message}\n`);
  process.exitCode = 1;
});
