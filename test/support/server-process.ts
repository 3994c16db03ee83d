// The real server (`server/main.ts`) in a process of its own, for the drills and the browser tests:
// one way to start it, ready once /api/health answers, and killed when it never gets ready.
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import https from 'node:https';
import net from 'node:net';
import path from 'node:path';

const REPO = path.resolve(__dirname, '..', '..');

function sleep(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/** Status of a GET over HTTPS, trusting only the given certificate (a test's own). */
export function httpsGet(
  url: string,
  ca: Buffer,
): Promise<{
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: string;
}> {
  return new Promise((resolve, reject) => {
    const req = https.get(url, { ca, timeout: 2000 }, (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (d: string) => (body += d));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
    });
    req.on('timeout', () => req.destroy(new Error('timed out')));
    req.on('error', reject);
  });
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const a = srv.address();
      srv.close(() => resolve(typeof a === 'object' && a ? a.port : 0));
    });
  });
}

export interface ServerProcess {
  url: string;
  process: ChildProcess;
  /** Everything the process wrote so far (pino JSON lines), for failure messages. */
  log(): string;
  stop(): Promise<void>;
  kill(): Promise<void>;
}

/**
 * The real server (`server/main.ts`) in its own process on a free loopback port, ready once
 * /api/health answers 200. Unlike a bare spawn, a process that never gets ready is killed, so a
 * failed start cannot keep the test run alive.
 */
export async function startServer(
  databaseUrl: string,
  extraEnv: NodeJS.ProcessEnv = {},
): Promise<ServerProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: REPO,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      LOG_LEVEL: 'warn',
      DATABASE_URL: databaseUrl,
      PORT: String(port),
      HOST: '127.0.0.1',
      ...extraEnv,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (d) => (output += d));
  child.stderr?.on('data', (d) => (output += d));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const kill = async (signal: NodeJS.Signals) => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    child.kill(signal);
    const timer = setTimeout(() => child.kill('SIGKILL'), 5000);
    await exited;
    clearTimeout(timer);
  };
  // With TLS_CERT and TLS_KEY the server speaks HTTPS; its own certificate is the one trusted.
  const ca = extraEnv.TLS_CERT ? readFileSync(extraEnv.TLS_CERT) : null;
  const url = `${ca ? 'https' : 'http'}://127.0.0.1:${port}`;
  const healthStatus = async () =>
    ca
      ? (await httpsGet(`${url}/api/health`, ca)).status
      : (await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) })).status;
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${output}`);
    try {
      if ((await healthStatus()) === 200) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) {
      await kill('SIGKILL');
      throw new Error(`server did not answer /api/health within 60 s:\n${output}`);
    }
    await sleep(150);
  }
  return {
    url,
    process: child,
    log: () => output,
    stop: () => kill('SIGTERM'),
    kill: () => kill('SIGKILL'),
  };
}
