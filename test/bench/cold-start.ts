// start.cold: `npm start` as a shop runs it on its own PostgreSQL (dependencies installed, database
// present and migrated), from the command to the first 200 from /api/health.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { freePort, sleep } from '../drills/support';
import { figure, say } from './emit';

export async function coldStart(databaseUrl: string): Promise<void> {
  const port = await freePort();
  say('start.cold: npm start against the bench database');
  const started = performance.now();
  const child = spawn('bash', ['server/start.sh'], {
    cwd: path.resolve(__dirname, '..', '..'),
    env: {
      ...process.env,
      DATABASE_URL: databaseUrl,
      PORT: String(port),
      HOST: '127.0.0.1',
      LOG_LEVEL: 'warn',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  let output = '';
  child.stdout?.on('data', (d) => (output += d));
  child.stderr?.on('data', (d) => (output += d));
  let ms = 0;
  try {
    for (;;) {
      if (child.exitCode !== null) throw new Error(`npm start exited early:\n${output}`);
      try {
        const res = await fetch(`http://127.0.0.1:${port}/api/health`, {
          signal: AbortSignal.timeout(1000),
        });
        if (res.status === 200) {
          ms = performance.now() - started;
          break;
        }
      } catch {
        /* not listening yet */
      }
      if (performance.now() - started > 120_000)
        throw new Error(`npm start did not answer in 120 s:\n${output}`);
      await sleep(50);
    }
  } finally {
    // The whole process group: bash, node and anything it started.
    if (child.pid && child.exitCode === null) {
      const exited = new Promise((r) => child.once('exit', r));
      process.kill(-child.pid, 'SIGTERM');
      const timer = setTimeout(() => child.pid && process.kill(-child.pid, 'SIGKILL'), 10_000);
      await exited;
      clearTimeout(timer);
    }
  }
  figure({ name: 'start.cold', value: ms / 1000, unit: 's' });
}
