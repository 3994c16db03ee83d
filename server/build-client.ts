// Builds the Angular app in production mode unless the build is newer than every source file.
import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { REPO_ROOT } from './db/local-env';

const INPUTS = [
  'src',
  'shared',
  'angular.json',
  'tsconfig.json',
  'tsconfig.app.json',
  'package-lock.json',
  'ngsw-config.json',
];

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0;
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, entry)));
  return newest;
}

export function buildIsFresh(): boolean {
  const index = path.join(REPO_ROOT, 'dist', 'stepstock', 'browser', 'index.html');
  if (!existsSync(index)) return false;
  const built = statSync(index).mtimeMs;
  return INPUTS.every((i) => newestMtime(path.join(REPO_ROOT, i)) <= built);
}

export function buildClient(force = false): void {
  if (!force && buildIsFresh()) {
    process.stdout.write('[stepstock] client build is up to date\n');
    return;
  }
  process.stdout.write('[stepstock] building the client (production)…\n');
  execFileSync(
    process.execPath,
    [
      path.join(REPO_ROOT, 'node_modules', '@angular', 'cli', 'bin', 'ng.js'),
      'build',
      '--configuration',
      'production',
    ],
    { cwd: REPO_ROOT, stdio: 'inherit', env: { ...process.env, NG_CLI_ANALYTICS: 'false' } },
  );
}
