// Where the demo shop's own PostgreSQL cluster lives and how to reach it.
import path from 'node:path';
import {
  chooseDemoDataDir,
  ensureDatabase,
  ensurePostgresInstalled,
  initCluster,
  runAsUser,
  startCluster,
  type Cluster,
} from './cluster';

export const REPO_ROOT = path.resolve(__dirname, '..', '..');
// Not 5432, so a system PostgreSQL on the default port never clashes with the demo's.
export const DEFAULT_PGPORT = 5488;

export function demoCluster(): Cluster {
  const binDir = ensurePostgresInstalled();
  const runAs = runAsUser();
  return {
    binDir,
    runAs,
    dataDir: chooseDemoDataDir(REPO_ROOT, runAs),
    port: Number(process.env.PGPORT ?? DEFAULT_PGPORT),
  };
}

/** Starts (creating if needed) the demo cluster and returns the demo database's URL. */
export async function localDatabaseUrl(): Promise<string> {
  const c = demoCluster();
  initCluster(c);
  await startCluster(c);
  return ensureDatabase(c, 'stepstock');
}
